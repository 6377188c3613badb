import type { Vec3 } from '../assembly/index.js';
import type { FrameModalResult, FrameMode } from './frameModes.js';

/** A line in 3D drawn twice: at rest and moved by the mode (exaggerated). Frame coordinates, mm. */
export type RestAndMoved = Readonly<{ rest: readonly Vec3[]; moved: readonly Vec3[] }>;

/** What a picture of a frame mode needs: every plate's outline and holes, the standoffs and the motors, at rest and moved. */
export type FrameModeShape = Readonly<{
  /** One closed polyline per plate outline and hole (their boundary mesh nodes), with the plate copy it belongs to. */
  outlines: readonly (RestAndMoved & { plate: string; hole: boolean })[];
  /** Standoffs and camera spacers, end to end. */
  connectors: readonly RestAndMoved[];
  /** Each motor's base centre and centre of mass (its axis), with its site. */
  motors: readonly (RestAndMoved & { site: string })[];
  /** How much the picture exaggerates: drawn mm per mm of motion, which is also the drawn size of the mode's largest translation (shapes are normalised to 1 mm). */
  exaggeration: number;
}>;

/** The largest motion is drawn as this fraction of the frame's plan size. */
const DRAWN_FRACTION = 0.08;

/**
 * The outlines of the assembled frame at rest and moved by one of its modes, the motion scaled so
 * that the largest translation is drawn as 8 % of the frame's plan size (mode shapes have no
 * amplitude of their own). Pure data for `frameModeSvg`.
 */
export function frameModeShape(result: FrameModalResult, mode: FrameMode): FrameModeShape {
  const { model } = result.frame;
  const xyz = model.xyz;
  const s = mode.shape;
  let [x0, y0, x1, y1] = [Infinity, Infinity, -Infinity, -Infinity];
  for (let i = 0; i < xyz.length; i += 3) {
    x0 = Math.min(x0, xyz[i]);
    x1 = Math.max(x1, xyz[i]);
    y0 = Math.min(y0, xyz[i + 1]);
    y1 = Math.max(y1, xyz[i + 1]);
  }
  // Shapes are normalised to a largest translation of 1 mm.
  const exaggeration = DRAWN_FRACTION * Math.max(x1 - x0, y1 - y0);
  const at = (n: number): Vec3 => [xyz[3 * n], xyz[3 * n + 1], xyz[3 * n + 2]];
  const moved = (n: number): Vec3 => [xyz[3 * n] + exaggeration * s[6 * n], xyz[3 * n + 1] + exaggeration * s[6 * n + 1], xyz[3 * n + 2] + exaggeration * s[6 * n + 2]];
  const line = (nodes: readonly number[]): RestAndMoved => ({ rest: nodes.map(at), moved: nodes.map(moved) });
  const outlines = result.frame.plates.flatMap((p) => p.mesh.loops.map((loop, k) => ({ plate: p.plate.id, hole: k > 0, ...line(loop.map((i) => p.firstNode + i)) })));
  const connectors = result.frame.connectors.map((c) => line(c.nodes));
  const motors = result.frame.motors.map((m) => {
    // The base follows the motor's rigid body: u + θ × (base − centre of mass).
    const c = at(m.node);
    const r = [m.baseMm[0] - c[0], m.baseMm[1] - c[1], m.baseMm[2] - c[2]];
    const [u, v, w, ax, ay, az] = s.subarray(6 * m.node, 6 * m.node + 6);
    const base: Vec3 = [m.baseMm[0] + exaggeration * (u + ay * r[2] - az * r[1]), m.baseMm[1] + exaggeration * (v + az * r[0] - ax * r[2]), m.baseMm[2] + exaggeration * (w + ax * r[1] - ay * r[0])];
    return { site: m.site, rest: [m.baseMm, c], moved: [base, moved(m.node)] };
  });
  return { outlines, connectors, motors, exaggeration };
}
