/**
 * framewright as a library: typed, pure functions over plain data, in the order of the pipeline
 * (design text → design → parts → checks → analysis → variants, quotes → file bytes). Nothing here
 * reads or writes files, reads the clock or touches the process; the caller does the I/O.
 *
 * @example
 * import { readFileSync } from 'node:fs';
 * import { parseDesignText, buildFrame, checkFrame, partToDxf } from 'framewright';
 * const frame = buildFrame(parseDesignText(readFileSync('my-frame.yaml', 'utf8')));
 * const report = checkFrame(frame);
 * const dxf = partToDxf(frame.parts[0]);
 *
 * Bad input throws `DesignError` (each issue names the parameter path, the value and the allowed
 * range); an impossible variant request throws `VariantRequestError`, a variant that cannot pass every
 * check throws `VariantRefusal` (the unmet constraint and the nearest valid alternative); an
 * unreadable DXF throws `DxfReadError`. Everything else thrown is a defect.
 */

// ── Design: parse, validate, schema, edit ─────────────────────────────────────────────────────
export { parseDesignText, validateDesign, type Design } from './params/design.js';
export { DesignError, formatIssue, type DesignIssue } from './params/errors.js';
export { designJsonSchema } from './params/jsonSchema.js';
export { parseLengthMm, degToRad, radToDeg, MM_PER_INCH } from './params/units.js';
export { editDesignText, setDesignValues, type Change } from './variant/changes.js';

// ── Parts: exact plate geometry ───────────────────────────────────────────────────────────────
export { buildFrame, type Frame } from './geometry/frame.js';
export type { Part, Feature, FeaturePurpose, Member, Placement, PartRole, Material, ScrewSize } from './geometry/part.js';
export type { Vec2, BBox, Line, Arc, Segment, Loop } from './geometry/types.js';
export type { MotorSite, SiteId } from './geometry/layout.js';
export { partArea, partBBox, partCutLength, partMassG, holeTable } from './geometry/metrics.js';
export { frameMassG } from './variant/variant.js';

// ── The assembled frame: placed plates, hardware, motors, props, components ──────────────────────
export { buildAssembly } from './assembly/build.js';
export { massBalance } from './assembly/balance.js';
export { hardwareList } from './assembly/hardware.js';
export { assemblyView, projectPoint, type AssemblyView, type ViewName } from './assembly/views.js';
export type { Assembly, PlacedPlate, Standoff, BoltedJoint, Motor, Prop, Component, MassBalance, HardwareList, HardwareItem, StackUp } from './assembly/types.js';

// ── Checks: design rules before cutting ───────────────────────────────────────────────────────
export { checkFrame, checkParts, type PartCheckCache } from './checks/report.js';
export { checkOptions, optionsForDesign, type CheckOptions } from './checks/options.js';
export { formatCheckReport, summaryLine } from './checks/text.js';
export type { CheckReport, Finding, PartMetrics, Severity } from './checks/types.js';

// ── DXF drawn elsewhere ───────────────────────────────────────────────────────────────────────
export { importDxf, DxfReadError, type ImportOptions, type ImportResult } from './import/index.js';

// ── Stiffness and resonance ───────────────────────────────────────────────────────────────────
export { frameModes, partModes, armModes, bodyModes, type FrameModes, type ModalResult, type ModeOptions, type ModeResult } from './analysis/modes.js';
export { assembledFrameModes, type FrameModalResult, type FrameMode, type FrameModeKind, type FrameModesOptions } from './analysis/frameModes.js';

// ── Size variants ─────────────────────────────────────────────────────────────────────────────
export { makeVariant, planVariant, type VariantRequest, type VariantResult, type VariantPlan } from './variant/variant.js';
export { VariantRefusal, VariantRequestError } from './variant/errors.js';
export { rangeRow, variantRow, sourceRow, bandSamples, type RangeRow } from './variant/sizeRange.js';
export { rotationBandFromTipSpeed, rotationBandOf, fullThrustN, type RotationBand } from './analysis/rotation.js';
export { frameModeShape, type FrameModeShape } from './analysis/frameShape.js';

// ── Quotes: cut data, nesting, time and price ─────────────────────────────────────────────────
export { quoteParts, type Quote, type QuoteOptions } from './quote/quote.js';
export { quoteReport } from './quote/report.js';
export { parseShopText, validateShop, type ShopProfile } from './params/shop.js';

// ── File bytes: DXF, SVG, PDF ─────────────────────────────────────────────────────────────────
export { partToDxf, placedPartsToDxf, type DxfOptions } from './export/dxf.js';
export { partToSvg, type SvgPartOptions } from './export/svgPart.js';
export { frameOverviewSvg, type OverviewOptions } from './export/svgOverview.js';
export { assemblyViewSvg, type AssemblyViewSvgOptions } from './export/svgAssemblyView.js';
export { frameModeSvg, type FrameModePlot } from './export/svgFrameModes.js';
export { hardwareCsv } from './export/hardwareCsv.js';
export { quotePackage, type PackageFile, type QuotePackageMeta } from './export/quotePackage.js';
export { woffToSfnt } from './export/woff.js';
export { zipStore, type ZipEntry } from './export/zip.js';
