import { bboxGap, segmentDistance } from '../geometry/distance.js';
import { loopBBox, segmentBBox, startOf, transformLoop, windingNumber, type BBox, type Loop, type Part, type Transform } from '../geometry/index.js';

/** Tolerance of the exact layout check: far below anything a router holds, far above float noise. mm. */
const LAYOUT_TOL_MM = 1e-6;

/** Pairs further apart than the spacing plus this are not measured for the smallest gap. mm. */
const NEIGHBOUR_MM = 1;

type Placed = Readonly<{ part: Part; transform: Transform }>;
type Sheet = Readonly<{ spacingMm: number; marginMm: number; widthMm: number; heightMm: number }>;

/** A placed copy's contours in sheet coordinates, with boxes. */
type Moved = Readonly<{ outline: Loop; box: BBox; segBoxes: readonly BBox[]; inner: readonly Loop[] }>;

/**
 * Check a sheet layout on the exact lines and arcs, independently of how it was made: every part
 * inside the margins, no two parts overlapping, and every two parts at least the spacing apart (a part
 * inside a window of another is measured to that window's contour). Returns the smallest gap between
 * neighbouring parts (mm; null when no two parts are within the spacing + 1 mm).
 * @throws Error when the layout breaks a rule (a defect of the nesting, not of the input).
 */
export function verifySheet(placed: readonly Placed[], sheet: Sheet): number | null {
  const { spacingMm: s, marginMm: m, widthMm: W, heightMm: H } = sheet;
  const moved: Moved[] = placed.map((p) => {
    const outline = transformLoop(p.part.outline, p.transform);
    return { outline, box: loopBBox(outline), segBoxes: outline.map(segmentBBox), inner: p.part.features.map((f) => transformLoop(f.loop, p.transform)) };
  });
  moved.forEach((q, i) => {
    const b = q.box;
    if (b[0] < m - LAYOUT_TOL_MM || b[1] < m - LAYOUT_TOL_MM || b[2] > W - m + LAYOUT_TOL_MM || b[3] > H - m + LAYOUT_TOL_MM) {
      throw new Error(`nesting: ${placed[i].part.name} leaves the ${m} mm margin of the ${W} x ${H} sheet (box ${b.map((x) => x.toFixed(4)).join(', ')})`);
    }
  });
  const order = moved.map((_, i) => i).sort((a, b) => moved[a].box[0] - moved[b].box[0]);
  let minGap: number | null = null;
  for (let ai = 0; ai < order.length; ai++) {
    const a = moved[order[ai]];
    for (let bi = ai + 1; bi < order.length; bi++) {
      const b = moved[order[bi]];
      if (b.box[0] > a.box[2] + s + NEIGHBOUR_MM) break;
      if (bboxGap(a.box, b.box) > s + NEIGHBOUR_MM) continue;
      const gap = pairGap(a, b, s + NEIGHBOUR_MM);
      if (gap === null) continue;
      if (gap < s - LAYOUT_TOL_MM) {
        throw new Error(`nesting: ${placed[order[ai]].part.name} and ${placed[order[bi]].part.name} are ${gap.toFixed(6)} mm apart, below the ${s} mm spacing`);
      }
      minGap = minGap === null ? gap : Math.min(minGap, gap);
    }
  }
  return minGap;
}

/** Distance between two placed parts' material, or null when it exceeds limitMm; −1 when they overlap. */
function pairGap(a: Moved, b: Moved, limitMm: number): number | null {
  // Parts nest only inside windows: a part whose point lies inside the other's outline must lie in one of its inner contours.
  const host = (x: Moved, y: Moved): Loop | null | 'overlap' => {
    const p = startOf(y.outline[0]);
    if (windingNumber(x.outline, p) === 0) return null;
    return x.inner.find((l) => windingNumber(l, p) !== 0) ?? 'overlap';
  };
  const hb = host(a, b);
  const ha = host(b, a);
  if (hb === 'overlap' || ha === 'overlap') return -1;
  let best = loopGap(a.outline, a.segBoxes, b.outline, b.segBoxes, limitMm);
  if (hb) best = Math.min(best, loopGap(hb, hb.map(segmentBBox), b.outline, b.segBoxes, limitMm));
  if (ha) best = Math.min(best, loopGap(ha, ha.map(segmentBBox), a.outline, a.segBoxes, limitMm));
  return best <= limitMm ? best : null;
}

function loopGap(x: Loop, xb: readonly BBox[], y: Loop, yb: readonly BBox[], limitMm: number): number {
  let best = Infinity;
  for (let i = 0; i < x.length; i++) {
    for (let j = 0; j < y.length; j++) {
      if (bboxGap(xb[i], yb[j]) > Math.min(best, limitMm)) continue;
      const d = segmentDistance(x[i], y[j]).distance;
      if (d < best) best = d;
    }
  }
  return best;
}
