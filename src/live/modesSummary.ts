import { assembledFrameModes } from '../analysis/frameModes.js';
import { buildAssembly } from '../assembly/build.js';
import { buildFrame } from '../geometry/frame.js';
import { parseDesignText } from '../params/design.js';

/** One mode of the assembled frame as the page lists it. */
export type ModeRow = Readonly<{
  frequencyHz: number;
  /** Kind with its plain words, e.g. "body twist (diagonal motor pairs in opposition)". */
  name: string;
  /** What the flight controller feels: translation share and tilt per mm of the mode's largest motion. */
  flightController: Readonly<{ displacementRatio: number; rotationDegPerMm: number }> | null;
  camera: Readonly<{ displacementRatio: number; rotationDegPerMm: number }> | null;
  inRotationBand: boolean;
}>;

export type ModesSummary = Readonly<{
  version: number;
  /** Elastic modes of the assembled frame, free in space, lowest first. */
  modes: readonly ModeRow[];
  rotationBand: Readonly<{ lowHz: number; highHz: number; source: string }> | null;
  massG: number;
  dof: number;
  cautions: string;
}>;

const r = (x: number, d: number): number => Math.round(x * 10 ** d) / 10 ** d;

/** How many modes the page asks for: enough to see past the twist and bounce pair. */
export const PAGE_MODES = 6;

/**
 * The assembled frame's lowest modes for the page (the `src/analysis` frame model: plates as shells,
 * joints, standoffs, motors and components). Seconds of work: the server runs it in a worker thread.
 * Throws DesignError for a design that does not build.
 */
export function modesSummary(text: string, version: number): ModesSummary {
  const design = parseDesignText(text, 'live design');
  const result = assembledFrameModes(buildAssembly(design, buildFrame(design)), { modes: PAGE_MODES });
  const motion = (m: { displacementRatio: number; rotationDegPerMm: number } | null) => (m ? { displacementRatio: r(m.displacementRatio, 3), rotationDegPerMm: r(m.rotationDegPerMm, 4) } : null);
  return {
    version,
    modes: result.modes.map((m) => ({ frequencyHz: r(m.frequencyHz, 1), name: m.name, flightController: motion(m.flightController), camera: motion(m.camera), inRotationBand: m.inRotationBand })),
    rotationBand: result.rotationBand,
    massG: r(result.massG, 1),
    dof: result.dof,
    cautions: 'Estimates from a finite-element model of the assembled frame, free in space; not a certification. Test a new frame with the props off first.',
  };
}
