import { assertNever, type Vec2 } from '../geometry/index.js';
import type { PlateMesh } from './mesh.js';
import type { RawMode } from './solve.js';

/** A motor on the plate: where it is, which way its arm runs, the nodes that carry it. */
export type MotorOnPlate = Readonly<{ id: string; front: boolean; left: boolean; motorMm: Vec2; armDirRad: number; nodes: readonly number[] }>;

/** What the plate is, for describing its mode shapes in words. */
export type ShapeContext =
  | Readonly<{ kind: 'plate' }>
  | Readonly<{ kind: 'arm'; rootMm: Vec2; tipMm: Vec2; tipNodes: readonly number[] }>
  | Readonly<{ kind: 'body'; motors: readonly MotorOnPlate[] }>;

/** Motion at a point of the mode shape (scaled to 1 mm largest translation). */
export type PointMotion = Readonly<{
  /** Translation at the point as a fraction of the mode's largest translation (0..1). */
  displacementRatio: number;
  /** Tilt of the plate at the point per mm of the mode's largest translation. deg/mm. */
  tiltDegPerMm: number;
}>;

/**
 * Translation and tilt of the mode at a point: linear interpolation over the triangle that
 * holds it, or inverse-distance weighting of the three nearest nodes when the point is in a hole.
 */
export function motionAt(mesh: PlateMesh, shape: Float64Array, p: Vec2): PointMotion {
  const w = weightsAt(mesh, p);
  const v = [0, 0, 0, 0, 0];
  for (const [node, wt] of w) for (let d = 0; d < 5; d++) v[d] += wt * shape[6 * node + d];
  return { displacementRatio: Math.hypot(v[0], v[1], v[2]), tiltDegPerMm: (Math.hypot(v[3], v[4]) * 180) / Math.PI };
}

function weightsAt(mesh: PlateMesh, p: Vec2): Array<[number, number]> {
  const { xy, triangles } = mesh;
  for (let t = 0; t < triangles.length; t += 3) {
    const [a, b, c] = [triangles[t], triangles[t + 1], triangles[t + 2]];
    const d = (xy[2 * b] - xy[2 * a]) * (xy[2 * c + 1] - xy[2 * a + 1]) - (xy[2 * c] - xy[2 * a]) * (xy[2 * b + 1] - xy[2 * a + 1]);
    const l1 = ((xy[2 * b] - p[0]) * (xy[2 * c + 1] - p[1]) - (xy[2 * c] - p[0]) * (xy[2 * b + 1] - p[1])) / d;
    const l2 = ((xy[2 * c] - p[0]) * (xy[2 * a + 1] - p[1]) - (xy[2 * a] - p[0]) * (xy[2 * c + 1] - p[1])) / d;
    const l3 = 1 - l1 - l2;
    if (l1 >= -1e-9 && l2 >= -1e-9 && l3 >= -1e-9) return [[a, l1], [b, l2], [c, l3]];
  }
  const near = Array.from({ length: xy.length / 2 }, (_, i) => [i, Math.hypot(xy[2 * i] - p[0], xy[2 * i + 1] - p[1])] as [number, number])
    .sort((x, y) => x[1] - y[1] || x[0] - y[0])
    .slice(0, 3);
  const inv = near.map(([i, d]) => [i, 1 / Math.max(d, 1e-9)] as [number, number]);
  const sum = inv.reduce((s, [, x]) => s + x, 0);
  return inv.map(([i, x]) => [i, x / sum]);
}

/** Mean w of the nodes and the twist of the arm there: the across-arm slope times the half-width spanned, mm. */
function bounceAndTwist(mesh: PlateMesh, shape: Float64Array, nodes: readonly number[], dirRad: number): { bounce: number; twist: number } {
  const nx = -Math.sin(dirRad);
  const ny = Math.cos(dirRad);
  let sw = 0;
  let ss = 0;
  let sws = 0;
  let sss = 0;
  for (const n of nodes) {
    const s = mesh.xy[2 * n] * nx + mesh.xy[2 * n + 1] * ny;
    const w = shape[6 * n + 2];
    sw += w;
    ss += s;
  }
  const k = nodes.length;
  const ms = ss / k;
  let span = 0;
  for (const n of nodes) {
    const s = mesh.xy[2 * n] * nx + mesh.xy[2 * n + 1] * ny - ms;
    sws += shape[6 * n + 2] * s;
    sss += s * s;
    span = Math.max(span, Math.abs(s));
  }
  return { bounce: sw / k, twist: sss > 0 ? (sws / sss) * span : 0 };
}

const ORDINALS = ['1st', '2nd', '3rd'];
const ordinal = (i: number) => ORDINALS[i - 1] ?? `${i}th`;

/**
 * A plain description of each mode: what moves and how. Counts repeat kinds ("arm bending out of
 * plane, 2nd"). Thresholds are judgement, not a standard: a motor moving less than a quarter of the
 * mode's largest motion counts as still.
 */
export function describeModes(mesh: PlateMesh, modes: readonly RawMode[], ctx: ShapeContext): string[] {
  const seen = new Map<string, number>();
  return modes.map((m) => {
    const base = describeOne(mesh, m, ctx);
    const n = (seen.get(base) ?? 0) + 1;
    seen.set(base, n);
    return ctx.kind === 'body' && base.startsWith('arms') ? base : `${base}, ${ordinal(n)}`;
  });
}

function describeOne(mesh: PlateMesh, m: RawMode, ctx: ShapeContext): string {
  switch (ctx.kind) {
    case 'plate':
      return m.plane === 'in-plane' ? 'in-plane' : plateShape(mesh, m.shape);
    case 'arm': {
      if (m.plane === 'in-plane') return 'arm bending in plane (sideways)';
      const dir = Math.atan2(ctx.tipMm[1] - ctx.rootMm[1], ctx.tipMm[0] - ctx.rootMm[0]);
      const { bounce, twist } = bounceAndTwist(mesh, m.shape, ctx.tipNodes, dir);
      return Math.abs(twist) > Math.abs(bounce) ? 'arm twist' : 'arm bending out of plane';
    }
    case 'body': {
      if (m.plane === 'in-plane') return 'in-plane';
      const per = ctx.motors.map((mo) => ({ mo, ...bounceAndTwist(mesh, m.shape, mo.nodes, mo.armDirRad) }));
      const bounceMax = Math.max(...per.map((p) => Math.abs(p.bounce)));
      const twistMax = Math.max(...per.map((p) => Math.abs(p.twist)));
      if (bounceMax < 0.25 && twistMax < 0.25) return 'body plate flexing (motors nearly still)';
      if (twistMax > bounceMax) return 'arm twist';
      if (per.length !== 4) return 'arms bouncing';
      const sgn = (f: (p: (typeof per)[number]) => boolean) => per.reduce((s, p) => s + (f(p) ? 1 : -1) * p.bounce, 0);
      const scores: Array<[string, number]> = [
        ['arms bouncing in phase', Math.abs(sgn(() => true))],
        ['front and rear arms bouncing alternately (body bends fore and aft)', Math.abs(sgn((p) => p.mo.front))],
        ['left and right arms bouncing alternately (body bends side to side)', Math.abs(sgn((p) => p.mo.left))],
        ['diagonal arm pairs bouncing alternately (body twist)', Math.abs(sgn((p) => p.mo.front === p.mo.left))],
      ];
      scores.sort((a, b) => b[1] - a[1]);
      return scores[0][0];
    }
    default:
      return assertNever(ctx);
  }
}

/** Out-of-plane shape of a free plate: correlate w with twist (xy) and bending (x², y²) about the centroid. */
function plateShape(mesh: PlateMesh, shape: Float64Array): string {
  const n = mesh.xy.length / 2;
  let cx = 0;
  let cy = 0;
  for (let i = 0; i < n; i++) {
    cx += mesh.xy[2 * i];
    cy += mesh.xy[2 * i + 1];
  }
  cx /= n;
  cy /= n;
  let mx2 = 0;
  let my2 = 0;
  for (let i = 0; i < n; i++) {
    mx2 += (mesh.xy[2 * i] - cx) ** 2;
    my2 += (mesh.xy[2 * i + 1] - cy) ** 2;
  }
  mx2 /= n;
  my2 /= n;
  const fields: Array<[string, (x: number, y: number) => number]> = [
    ['plate twist', (x, y) => x * y],
    ['plate bending along x', (x) => x * x - mx2],
    ['plate bending along y', (_x, y) => y * y - my2],
  ];
  let best = 'plate flexing (higher order)';
  let bestC = 0.5;
  for (const [name, f] of fields) {
    let sw = 0;
    let sf = 0;
    let swf = 0;
    for (let i = 0; i < n; i++) {
      const w = shape[6 * i + 2];
      const v = f(mesh.xy[2 * i] - cx, mesh.xy[2 * i + 1] - cy);
      sw += w * w;
      sf += v * v;
      swf += w * v;
    }
    const c = Math.abs(swf) / Math.sqrt(sw * sf || 1);
    if (c > bestC) {
      bestC = c;
      best = name;
    }
  }
  return best;
}
