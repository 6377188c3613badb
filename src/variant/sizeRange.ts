import { rotationBandFromTipSpeed } from '../analysis/rotation.js';
import type { CheckReport } from '../checks/types.js';
import type { Frame } from '../geometry/frame.js';
import { wheelbaseOf } from '../geometry/layout.js';
import { MM_PER_INCH } from '../params/units.js';
import type { Design } from '../params/design.js';
import { armPlateThicknessMm } from './armModel.js';
import { armWidthParams, softestArm } from './sizeRule.js';
import { frameMassG, type VariantResult } from './variant.js';

/**
 * A size range: one design made for several prop sizes, compared row by row. One row per frame
 * (also the `--json` shape). Lengths mm, mass g, frequencies Hz.
 */
export type RangeRow = Readonly<{
  label: string;
  propsIn: number;
  wheelbaseMm: number;
  /** Arm width parameters by design path, e.g. { "arms.truss.mainWidthMm": 10.5 }. */
  armWidthsMm: Readonly<Record<string, number>>;
  armThicknessMm: number;
  /** Mass of one motor (the arm's tip mass). g. */
  motorMassG: number;
  /** Plates only. g. */
  massG: number;
  /** First bending frequency of the softest arm with its motor (cantilever estimate). */
  armFrequencyHz: number;
  /** What the size rule asks of this size (the source's own f1 for the source row). */
  requiredHz: number;
  /** The motors' top rotation band for the prop. */
  bandLowHz: number;
  bandHighHz: number;
  errors: number | null;
  warnings: number | null;
  status: 'ok' | 'warnings' | 'errors' | 'not checked';
}>;

const r = (x: number, d: number) => Math.round(x * 10 ** d) / 10 ** d;

/** A comparison row for a design and its frame. */
export function rangeRow(label: string, d: Design, frame: Frame, report: CheckReport | null, requiredHz: number): RangeRow {
  const widths: Record<string, number> = {};
  for (const p of armWidthParams(d)) widths[p.path.join('.')] = p.value;
  const s = report?.summary;
  const band = rotationBandFromTipSpeed(d.props.diameterMm);
  return {
    label,
    propsIn: r(d.props.diameterMm / MM_PER_INCH, 3),
    wheelbaseMm: r(wheelbaseOf(frame.sites), 2),
    armWidthsMm: widths,
    armThicknessMm: armPlateThicknessMm(d),
    motorMassG: d.motorMassG,
    massG: r(frameMassG(frame), 1),
    armFrequencyHz: r(softestArm(d, d.motorMassG).frequencyHz, 1),
    requiredHz: r(requiredHz, 1),
    bandLowHz: r(band.lowHz, 1),
    bandHighHz: r(band.highHz, 1),
    errors: s ? s.errors : null,
    warnings: s ? s.warnings : null,
    status: !s ? 'not checked' : s.errors > 0 ? 'errors' : s.warnings > 0 ? 'warnings' : 'ok',
  };
}

/** The variant's row. */
export const variantRow = (v: VariantResult): RangeRow => rangeRow(v.design.name, v.design, v.frame, v.report, v.arms.rule.requiredHz);
/** The source design's row, measured the same way as its variants. */
export const sourceRow = (v: VariantResult, report: CheckReport | null): RangeRow =>
  rangeRow(`${v.sourceDesign.name} (source)`, v.sourceDesign, v.sourceFrame, report, v.arms.rule.sourceHz);

/** Arm size as one short text: widths joined by "/", then thickness, e.g. "10.5/8/36 × 6". */
export const armSizeText = (row: RangeRow): string => `${Object.values(row.armWidthsMm).join('/')} × ${row.armThicknessMm}`;

/**
 * The motors' rotation band (its low and top ends) sampled at `n` prop sizes from `fromIn` to `toIn` (inches), for
 * the range chart.
 */
export function bandSamples(fromIn: number, toIn: number, n = 41): Array<{ propsIn: number; lowHz: number; highHz: number }> {
  return Array.from({ length: n }, (_, i) => {
    const propsIn = fromIn + ((toIn - fromIn) * i) / (n - 1);
    const b = rotationBandFromTipSpeed(propsIn * MM_PER_INCH);
    return { propsIn, lowHz: b.lowHz, highHz: b.highHz };
  });
}
