import { assertNever, type Loop, type Segment, type Vec2 } from '../geometry/types.js';
import { endOf, pointAt, startOf } from '../geometry/segment.js';
import { fmt } from './format.js';

/** Maps a y-up point to SVG's y-down user space. */
export type PointMap = (p: Vec2) => Vec2;

/**
 * SVG path data for a loop, arcs as true elliptical-arc commands. A full circle is written as two
 * half arcs because a single SVG arc cannot start and end at the same point.
 */
export function loopPathData(loop: Loop, map: PointMap): string {
  const parts: string[] = [];
  const p0 = map(startOf(loop[0]));
  parts.push(`M${fmt(p0[0], 4)} ${fmt(p0[1], 4)}`);
  for (const s of loop) parts.push(...segmentCommands(s, map));
  parts.push('Z');
  return parts.join(' ');
}

function segmentCommands(s: Segment, map: PointMap): string[] {
  switch (s.kind) {
    case 'line': {
      const p = map(s.end);
      return [`L${fmt(p[0], 4)} ${fmt(p[1], 4)}`];
    }
    case 'arc': {
      // y flips, so a counter-clockwise arc (y up) is clockwise on screen: sweep-flag 0.
      const sweepFlag = s.sweepRad > 0 ? 0 : 1;
      const r = fmt(s.radius, 4);
      if (Math.abs(s.sweepRad) > Math.PI) {
        const mid = map(pointAt(s, 0.5));
        const end = map(endOf(s));
        return [
          `A${r} ${r} 0 0 ${sweepFlag} ${fmt(mid[0], 4)} ${fmt(mid[1], 4)}`,
          `A${r} ${r} 0 0 ${sweepFlag} ${fmt(end[0], 4)} ${fmt(end[1], 4)}`,
        ];
      }
      const end = map(endOf(s));
      return [`A${r} ${r} 0 0 ${sweepFlag} ${fmt(end[0], 4)} ${fmt(end[1], 4)}`];
    }
    default:
      return assertNever(s);
  }
}
