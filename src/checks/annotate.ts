import type { Frame } from '../geometry/frame.js';
import type { Vec2 } from '../geometry/types.js';
import { viewRegion } from './camera.js';
import type { CheckOptions } from './options.js';
import { optionsForDesign } from './options.js';
import { cameraPose, FRAME_PART, propDiscs, tipGaps } from './props.js';
import { discViewMargin } from './camera.js';
import type { CheckReport, Severity } from './types.js';
import { CHECK_CAUTIONS } from './text.js';

/** A finding's marker: where, how bad, and its number in the report (1-based, per drawing). */
export type Marker = Readonly<{ atMm: Vec2; severity: Severity; label: string; title: string }>;

/** Markers for the findings about one part (part coordinates), numbered in report order. */
export function partMarkers(report: CheckReport, partName: string): Marker[] {
  return report.findings
    .filter((f) => f.part === partName && f.atMm !== null)
    .map((f, i) => ({ atMm: f.atMm as Vec2, severity: f.severity, label: String(i + 1), title: `${f.rule}: ${f.message}` }));
}

/** What the plan-view overview shows besides the plates: computed here so the exporter only draws. */
export type FrameAnnotation = Readonly<{
  markers: readonly Marker[];
  discs: ReadonlyArray<Readonly<{ id: string; centerMm: Vec2; radiusMm: number; visible: boolean }>>;
  /** The camera's view cut by the prop plane (convex polygon, frame coordinates), or null without a camera. */
  viewRegion: readonly Vec2[] | null;
  eyeMm: Vec2 | null;
  tipGaps: ReadonlyArray<Readonly<{ a: Vec2; b: Vec2; gapMm: number }>>;
  /** Safety lines printed with the picture. */
  cautions: Readonly<{ lines: readonly string[] }>;
}>;

/** Markers for frame findings, prop discs (visible or not), the view region and the tip-gap lines. */
export function frameAnnotation(frame: Frame, report: CheckReport, options: Partial<CheckOptions> = {}): FrameAnnotation {
  const o = optionsForDesign(frame.design, options);
  const discs = propDiscs(frame);
  const R = frame.propDiameterMm / 2;
  let bb: [number, number, number, number] = [Infinity, Infinity, -Infinity, -Infinity];
  for (const d of discs) bb = [Math.min(bb[0], d.centerMm[0] - R), Math.min(bb[1], d.centerMm[1] - R), Math.max(bb[2], d.centerMm[0] + R), Math.max(bb[3], d.centerMm[1] + R)];
  const pose = cameraPose(frame, o);
  const region = pose && o.limits['camera-view'].enabled ? viewRegion(pose, discs[0].zMm, [bb[0] - 10, bb[1] - 10, bb[2] + 10, bb[3] + 10]) : null;
  const gaps = tipGaps(discs).map((g) => {
    const A = discs.find((d) => d.id === g.a)!;
    const B = discs.find((d) => d.id === g.b)!;
    const dir: Vec2 = [B.centerMm[0] - A.centerMm[0], B.centerMm[1] - A.centerMm[1]];
    const L = Math.hypot(dir[0], dir[1]);
    const a: Vec2 = [A.centerMm[0] + (dir[0] * A.radiusMm) / L, A.centerMm[1] + (dir[1] * A.radiusMm) / L];
    const b: Vec2 = [B.centerMm[0] - (dir[0] * B.radiusMm) / L, B.centerMm[1] - (dir[1] * B.radiusMm) / L];
    return { a, b, gapMm: g.gapMm };
  });
  return {
    markers: partMarkers(report, FRAME_PART),
    discs: discs.map((d) => ({ id: d.id, centerMm: d.centerMm, radiusMm: d.radiusMm, visible: pose !== null && o.limits['camera-view'].enabled && discViewMargin(pose, d) <= 0 })),
    viewRegion: region,
    eyeMm: pose ? [pose.eyeMm[0], pose.eyeMm[1]] : null,
    // Adjacent pairs: as many of the smallest gaps as there are props (the ring round the frame).
    tipGaps: gaps.slice(0, discs.length),
    cautions: { lines: CHECK_CAUTIONS },
  };
}
