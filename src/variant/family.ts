import type { CheckReport } from '../checks/types.js';
import type { Frame } from '../geometry/frame.js';
import { wheelbaseOf } from '../geometry/layout.js';
import { MM_PER_INCH } from '../params/units.js';
import type { Design } from '../params/design.js';
import { armWidthParams, softestArm } from './stiffness.js';
import { armPlateThicknessMm } from './armModel.js';
import { frameMassG, type VariantResult } from './variant.js';

/** One line of the family comparison (also the `--json` shape). Lengths mm, mass g, frequency Hz. */
export type FamilyRow = Readonly<{
  label: string;
  propsIn: number;
  wheelbaseMm: number;
  /** Arm width parameters by design path, e.g. { "arms.truss.mainWidthMm": 10.5 }. */
  armWidthsMm: Readonly<Record<string, number>>;
  armThicknessMm: number;
  massG: number;
  /** First bending frequency of the softest arm with its motor (cantilever estimate). */
  armFrequencyHz: number;
  /** Whether the stiffness rule was met ('source' for the source design itself). */
  stiffnessRule: 'source' | 'kept' | 'not met';
  errors: number | null;
  warnings: number | null;
  status: 'ok' | 'warnings' | 'errors' | 'not checked';
}>;

const r = (x: number, d: number) => Math.round(x * 10 ** d) / 10 ** d;

/** A comparison row for a design and its frame; `tipMassG` is its motor's mass (motor table). */
export function familyRow(label: string, d: Design, frame: Frame, tipMassG: number, report: CheckReport | null, stiffnessRule: FamilyRow['stiffnessRule']): FamilyRow {
  const widths: Record<string, number> = {};
  for (const p of armWidthParams(d)) widths[p.path.join('.')] = p.value;
  const s = report?.summary;
  return {
    label,
    propsIn: r(d.props.diameterMm / MM_PER_INCH, 3),
    wheelbaseMm: r(wheelbaseOf(frame.sites), 2),
    armWidthsMm: widths,
    armThicknessMm: armPlateThicknessMm(d),
    massG: r(frameMassG(frame), 1),
    armFrequencyHz: r(softestArm(d, tipMassG).frequencyHz, 1),
    stiffnessRule,
    errors: s ? s.errors : null,
    warnings: s ? s.warnings : null,
    status: !s ? 'not checked' : s.errors > 0 ? 'errors' : s.warnings > 0 ? 'warnings' : 'ok',
  };
}

/** Rows for a variant's source and the variant itself. */
export const variantRow = (v: VariantResult, report: CheckReport | null): FamilyRow =>
  familyRow(v.design.name, v.design, v.frame, v.design.motorMassG, report, v.arms.met ? 'kept' : 'not met');
/** The source design's row, measured the same way as its variants. */
export const sourceRow = (v: VariantResult, report: CheckReport | null): FamilyRow =>
  familyRow(`${v.sourceDesign.name} (source)`, v.sourceDesign, v.sourceFrame, v.sourceDesign.motorMassG, report, 'source');

/** Arm size as one short text: widths joined by "/", then thickness, e.g. "10.5/8/36 × 6". */
export const armSizeText = (row: FamilyRow): string => `${Object.values(row.armWidthsMm).join('/')} × ${row.armThicknessMm}`;
