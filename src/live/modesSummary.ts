import { frameModes } from '../analysis/modes.js';
import { buildFrame } from '../geometry/frame.js';
import { parseDesignText } from '../params/design.js';

/** One analysed model on the page: what it is, how it is held, and its lowest modes. */
export type ModesRow = Readonly<{
  model: string;
  boundary: string;
  modes: ReadonlyArray<Readonly<{ frequencyHz: number; description: string }>>;
}>;

export type ModesSummary = Readonly<{
  version: number;
  motorMassG: number;
  rows: readonly ModesRow[];
  /** Static figures under motor thrust: arm-tip deflection, body twist. */
  statics: ReadonlyArray<Readonly<{ what: string; value: string }>>;
  cautions: string;
}>;

const BOUNDARY_TEXT: Record<string, string> = {
  free: 'free (as cut)',
  'arm-root-clamped': 'held at its root bolts, with its motor',
  'body-with-motors': 'carrying its four motors',
};

const r1 = (x: number): number => Math.round(x * 10) / 10;

/**
 * The modes the page shows on request: the lowest three of every model `frameModes` analyses, and
 * its static figures. Seconds of work: the server runs it in a worker thread.
 */
export function modesSummary(text: string, version: number): ModesSummary {
  const frame = buildFrame(parseDesignText(text, 'live design'));
  const m = frameModes(frame, { modes: 3 });
  const rows: ModesRow[] = [];
  const row = (model: string, r: (typeof m.parts)[number]): ModesRow => ({
    model,
    boundary: BOUNDARY_TEXT[r.boundary] ?? r.boundary,
    modes: r.modes.map((x) => ({ frequencyHz: r1(x.frequencyHz), description: x.description })),
  });
  if (m.body) rows.push(row('bottom plate with motors', m.body.modal));
  for (const a of m.arms) rows.push(row(`${a.modal.part} with motor`, a.modal));
  for (const p of m.parts) rows.push(row(p.part, p));
  const statics: Array<{ what: string; value: string }> = [];
  for (const a of m.arms) statics.push({ what: `${a.modal.part} tip deflection at ${m.thrustN} N`, value: `${a.statics.tipDeflectionMm.toFixed(3)} mm` });
  if (m.body) statics.push({ what: `body twist (${m.body.twist.pattern})`, value: `${m.body.twist.twistDeg.toFixed(3)}°` });
  if (m.rootTwist) statics.push({ what: `bottom-plate twist (${m.rootTwist.pattern})`, value: `${m.rootTwist.twistDeg.toFixed(3)}°` });
  return {
    version,
    motorMassG: m.motorMassG,
    rows,
    statics,
    cautions: 'Estimates from plate models (each plate analysed on its own), not a certification; test with the props off first.',
  };
}
