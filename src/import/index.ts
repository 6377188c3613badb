export { importDxf, ASSUMED_THICKNESS_MM, type ImportOptions, type ImportResult, type UnitsUsed } from './importDxf.js';
export { DxfReadError } from './errors.js';
export { DEFAULT_LIMITS, type ImportLimits } from './limits.js';
export { DRAWING_UNITS, MM_PER_UNIT, parseDrawingUnit, unitFromInsunits, type DrawingUnit } from './units.js';
export {
  DEFAULT_IMPORT_MATERIAL,
  SidecarSchema,
  parseSidecarText,
  resolveImportSettings,
  type ImportFlags,
  type ImportSettings,
  type Sidecar,
} from './settings.js';
export { bulgeSegment, polylineSegments } from './explode.js';
export { biarc, fitArcs, nurbsCurve, ellipseCurve, type ParamCurve } from './curves.js';
