import type { Finding } from '../checks/types.js';
import { distanceToLoop, isInside } from '../geometry/inside.js';
import { partBBox } from '../geometry/metrics.js';
import { unionBBox } from '../geometry/loop.js';
import { segmentBBox } from '../geometry/segment.js';
import type { BBox } from '../geometry/types.js';
import type { Material, Part } from '../geometry/part.js';
import { scaling } from './affine.js';
import { chainLoops } from './chain.js';
import { cleanSegments } from './clean.js';
import { headerValue, parseDocument, type DxfDocument, type RawEntity } from './document.js';
import { DxfReadError } from './errors.js';
import { explode, type LayerDecision } from './explode.js';
import { DEFAULT_LIMITS, limitWords, type ImportLimits } from './limits.js';
import { findMeetings } from './loops.js';
import { nestLoops } from './nest.js';
import { DEFAULT_IMPORT_MATERIAL } from './settings.js';
import { MM_PER_UNIT, unitFromInsunits, type DrawingUnit } from './units.js';

export type ImportOptions = Readonly<{
  /** Base for part names: one part takes it as is, several get "-1", "-2"... (left to right). */
  name: string;
  /** Plate thickness; when missing 2 mm is assumed and a warning says so. mm. */
  thicknessMm?: number;
  material?: Material;
  /** Weave direction in part coordinates. rad. */
  weaveRad?: number;
  /** Overrides $INSUNITS. */
  units?: DrawingUnit;
  /** Only these layers are cut geometry (names as in the file, case-insensitive). */
  layers?: readonly string[];
  /** Entity ends closer than this are joined (default 0.01 mm, well under a router's precision). mm. */
  gapTolMm?: number;
  /** Largest distance between a fitted spline or ellipse and its arcs (default 0.002 mm). mm. */
  curveTolMm?: number;
  /** Segments shorter than this are reported as tiny (default 0.05 mm). mm. */
  tinySegmentMm?: number;
  /** A drawing whose nearest part is further from the origin than this is reported (default 1000 mm). mm. */
  farFromOriginMm?: number;
  limits?: ImportLimits;
}>;

export type UnitsUsed = Readonly<{ unit: DrawingUnit; from: 'option' | 'header' | 'assumed' }>;

export type ImportResult = Readonly<{
  parts: Part[];
  /** File hygiene findings (rule names start with "dxf-"); `part` is empty for file-level ones. */
  findings: Finding[];
  units: UnitsUsed;
  /** Layers whose geometry was read as cut contours. */
  cutLayers: string[];
}>;

/** Assumed when neither flag nor sidecar gives a thickness: the commonest body-plate stock. mm. */
export const ASSUMED_THICKNESS_MM = 2;

/** Findings of one rule beyond this many are summarised in one more finding. */
const MAX_PER_RULE = 50;

/**
 * Read a DXF drawing made by any CAD program into framewright parts plus file-hygiene findings.
 * Pure: the text comes in, parts and findings go out. Throws DxfReadError (exit 2 in the CLI) for
 * files that are not ASCII DXF, truncated, beyond the size limits, or for --layers naming a layer
 * the file does not have; everything else wrong with the drawing is a finding.
 *
 * @example importDxf(readFileSync('arm.dxf', 'utf8'), { name: 'arm', thicknessMm: 5 })
 */
export function importDxf(text: string, options: ImportOptions): ImportResult {
  const limits = options.limits ?? DEFAULT_LIMITS;
  const gapTolMm = options.gapTolMm ?? 0.01;
  refuseByCount(text, limits);
  const doc = parseDocument(text, limits.maxPairs);
  const findings: Finding[] = [];
  const units = resolveUnits(doc, options.units, findings);
  const layerDecision = decideLayers(doc, options.layers);
  const k = MM_PER_UNIT[units.unit];
  const exploded = explode(doc, { toMm: scaling(k, k), layerDecision, curveTolMm: options.curveTolMm ?? 0.002, limits });
  findings.push(...exploded.findings);
  // Every full circle is a contour of its own: a drawing beyond the contour limit is refused before
  // the slower chaining and containment steps.
  refuseContours(exploded.segments.reduce((n, d) => n + (d.seg.kind === 'arc' && Math.abs(d.seg.sweepRad) >= 2 * Math.PI - 1e-9 ? 1 : 0), 0), limits, true);
  const cleaned = cleanSegments(exploded.segments, { gapTolMm, tinySegmentMm: options.tinySegmentMm ?? 0.05 });
  findings.push(...cleaned.findings);
  const chained = chainLoops(cleaned.segments, gapTolMm);
  findings.push(...chained.findings);
  refuseContours(chained.loops.length, limits);
  const meetings = findMeetings(chained.loops);
  findings.push(...meetings.findings);
  const nested = nestLoops(chained.loops.filter((_, i) => !meetings.selfIntersecting.has(i)));
  if (options.thicknessMm === undefined && nested.length) {
    findings.push(fileFinding('dxf-thickness-assumed', 'warning', `no thickness given: ${ASSUMED_THICKNESS_MM} mm assumed; pass --thickness or set thicknessMm in the sidecar file`, ASSUMED_THICKNESS_MM, 'mm'));
  }
  if (!nested.length && !findings.some((f) => f.severity === 'error')) {
    findings.push(fileFinding('dxf-no-parts', 'error', `no closed contour found on the cut layers (${[...exploded.layersUsed].sort().join(', ') || 'none'}); nothing to cut`, null, ''));
  }
  const parts: Part[] = nested.map((p, i) => ({
    name: nested.length === 1 ? options.name : `${options.name}-${i + 1}`,
    role: 'imported',
    quantity: 1,
    thicknessMm: options.thicknessMm ?? ASSUMED_THICKNESS_MM,
    material: options.material ?? DEFAULT_IMPORT_MATERIAL,
    weaveRad: options.weaveRad ?? 0,
    outline: p.outline,
    features: p.features,
    members: [],
    placements: [],
    sourcePath: `${options.name} (layer ${p.source.layer}, ${p.source.entity} line ${p.source.line})`,
  }));
  findings.push(...farFromOrigin(parts, options.farFromOriginMm ?? 1000));
  findings.push(...unitDoubt(cleaned.segments.map((d) => segmentBBox(d.seg)), units));
  return { parts, findings: cap(attachParts(findings, parts)), units, cutLayers: [...exploded.layersUsed].sort() };
}

/** Entity types that each give at least one line or arc of cut geometry. */
const DRAWN = /\n[ \t]*0\r?\n(LINE|ARC|CIRCLE|LWPOLYLINE|POLYLINE|SPLINE|ELLIPSE)\r?\n/g;

/**
 * Before parsing anything, count the drawn entities of the ENTITIES section in the text (a scan far
 * cheaper than reading the file's group codes): more CIRCLEs than the contour limit, or more drawn
 * entities than the line-and-arc limit, is refused at once. Blocks are not expanded here; entities on
 * layers that are not cut (frozen, annotation) are counted too, which only matters for a drawing with
 * tens of thousands of them.
 */
function refuseByCount(text: string, limits: ImportLimits): void {
  const start = text.search(/\n[ \t]*2\r?\nENTITIES\r?\n/);
  if (start < 0) return;
  const end = text.indexOf('ENDSEC', start);
  const section = text.slice(start, end < 0 ? text.length : end);
  let drawn = 0;
  let circles = 0;
  for (const m of section.matchAll(DRAWN)) {
    drawn++;
    if (m[1] === 'CIRCLE') circles++;
  }
  refuseContours(circles, limits, true);
  if (drawn > limits.maxSegments) throw new DxfReadError(`the drawing has ${drawn} drawn entities: more than ${limits.maxSegments} lines and arcs${limitWords(limits)}`);
}

function refuseContours(n: number, limits: ImportLimits, atLeast = false): void {
  if (n > limits.maxContours) throw new DxfReadError(`the drawing has ${atLeast ? 'at least ' : ''}${n} closed contours (outlines and holes), more than ${limits.maxContours}${limitWords(limits)}`);
}

function fileFinding(rule: string, severity: Finding['severity'], message: string, measured: number | null, unit: string, limit: number | null = null): Finding {
  return { rule, severity, part: '', measured, limit, unit, atMm: null, message };
}

const INSUNITS_NAMES: Record<number, string> = { 3: 'miles', 7: 'kilometres', 8: 'microinches', 10: 'yards', 11: 'ångströms', 12: 'nanometres', 15: 'decametres', 16: 'hectometres', 17: 'gigametres', 18: 'astronomical units', 19: 'light years', 20: 'parsecs' };

function resolveUnits(doc: DxfDocument, override: DrawingUnit | undefined, findings: Finding[]): UnitsUsed {
  const raw = headerValue(doc, '$INSUNITS', 70);
  const code = raw === undefined ? undefined : Number(raw);
  if (override) return { unit: override, from: 'option' };
  if (code !== undefined && Number.isFinite(code)) {
    const u = unitFromInsunits(code);
    if (u) return { unit: u, from: 'header' };
    if (code !== 0) {
      findings.push(fileFinding('dxf-units-assumed', 'warning', `$INSUNITS is ${code} (${INSUNITS_NAMES[code] ?? 'not a known unit'}), not a plate unit: millimetres assumed; pass --units to say what the drawing is in`, code, ''));
      return { unit: 'mm', from: 'assumed' };
    }
  }
  const imperial = headerValue(doc, '$MEASUREMENT', 70) === '0';
  findings.push(
    fileFinding('dxf-units-assumed', 'warning', `the file does not say its units ($INSUNITS ${code === 0 ? 'is 0, unitless' : 'is missing'}): millimetres assumed${imperial ? ', although $MEASUREMENT says imperial; if it is in inches pass --units in' : '; pass --units if it is not'}`, null, ''),
  );
  return { unit: 'mm', from: 'assumed' };
}

/** Layers that are clearly not cut geometry by their name. */
const NON_CUT_NAME = /(^|[^a-z])(dim|dims|dimension|dimensions|text|txt|anno|annotation|annotations|note|notes|title|titleblock|border|defpoints|hidden|construction|constr|center|centre|centerline|centreline|nocut|label|labels)([^a-z]|$)/i;

function decideLayers(doc: DxfDocument, chosen: readonly string[] | undefined): (layer: string) => LayerDecision {
  if (chosen) {
    const present = new Map<string, string>();
    for (const name of allLayerNames(doc)) present.set(name.toLowerCase(), name);
    const missing = chosen.filter((c) => !present.has(c.toLowerCase()));
    if (missing.length) {
      throw new DxfReadError(`--layers: ${missing.map((m) => JSON.stringify(m)).join(', ')} not in the file; its layers are ${[...present.values()].sort().join(', ') || '(none)'}`);
    }
    const want = new Set(chosen.map((c) => c.toLowerCase()));
    return (layer) => (want.has(layer.toLowerCase()) ? { cut: true } : { cut: false, reason: 'not in --layers' });
  }
  return (layer) => {
    const info = doc.layers.get(layer);
    if (info?.frozen) return { cut: false, reason: 'layer is frozen' };
    if (info?.off) return { cut: false, reason: 'layer is off' };
    if (NON_CUT_NAME.test(layer)) return { cut: false, reason: 'its name marks it as annotation, not cut geometry' };
    return { cut: true };
  };
}

function allLayerNames(doc: DxfDocument): Set<string> {
  const names = new Set<string>(doc.layers.keys());
  const add = (es: readonly RawEntity[]) => {
    for (const e of es) names.add(e.pairs.find((p) => p.code === 8)?.value.trim() ?? '0');
  };
  add(doc.entities);
  for (const b of doc.blocks.values()) add(b.entities);
  return names;
}

/**
 * Parts far from the origin: shops expect a drawing at 0,0. Judged on the nearest part, so that a
 * sheet of many parts laid out from the origin is not reported part by part.
 */
function farFromOrigin(parts: readonly Part[], farMm: number): Finding[] {
  let nearest: { d: number; part: Part; at: [number, number] } | null = null;
  for (const p of parts) {
    const b = partBBox(p);
    const dx = Math.max(b[0], 0, -b[2]);
    const dy = Math.max(b[1], 0, -b[3]);
    const d = Math.hypot(dx, dy);
    if (!nearest || d < nearest.d) nearest = { d, part: p, at: [b[0], b[1]] };
  }
  if (!nearest || nearest.d <= farMm) return [];
  const who = parts.length === 1 ? nearest.part.name : `the nearest of the ${parts.length} parts (${nearest.part.name})`;
  return [
    {
      rule: 'dxf-far-from-origin',
      severity: 'warning',
      part: parts.length === 1 ? nearest.part.name : '',
      measured: nearest.d,
      limit: farMm,
      unit: 'mm',
      atMm: parts.length === 1 ? nearest.at : null,
      message: `${who} lies ${nearest.d.toFixed(1)} mm from the origin; shops expect parts near 0,0 and some machines' work areas end sooner`,
    },
  ];
}

/**
 * A drawing whose cut geometry spans less than 15 mm or more than 2500 mm (a full sheet) was
 * almost surely drawn in another unit than the one it claims: say which unit gives a frame-sized
 * drawing.
 */
function unitDoubt(boxes: readonly BBox[], units: UnitsUsed): Finding[] {
  const out: Finding[] = [];
  if (!boxes.length) return out;
  const b = boxes.reduce((acc, x) => unionBBox(acc, x));
  const largest = Math.max(b[2] - b[0], b[3] - b[1]);
  // Frame plates run from about 15 mm (a small brace) to about 600 mm (a large unibody) across (common practice, no source).
  const plausible = (mm: number) => mm >= 15 && mm <= 600;
  if (largest < 15 || largest > 2500) {
    const here = MM_PER_UNIT[units.unit];
    const guesses = (['in', 'cm', 'mm', 'm'] as const).filter((u) => u !== units.unit && plausible((largest / here) * MM_PER_UNIT[u]));
    const hint = guesses.length ? `; read as ${guesses[0]} it would be ${((largest / here) * MM_PER_UNIT[guesses[0]]).toFixed(1)} mm (pass --units ${guesses[0]})` : '';
    out.push({
      rule: 'dxf-unit-doubt',
      severity: 'warning',
      part: '',
      measured: largest,
      limit: largest < 15 ? 15 : 2500,
      unit: 'mm',
      atMm: null,
      message: `the drawing's cut geometry is ${largest.toFixed(3)} mm across in ${units.unit} (${units.from === 'header' ? 'as the file says' : units.from === 'option' ? 'as given' : 'assumed'}), ${largest < 15 ? 'smaller' : 'larger'} than any frame plate or sheet${hint}`,
    });
  }
  return out;
}

/** Name the part a located file finding falls on, so the report groups it with that part. */
function attachParts(findings: readonly Finding[], parts: readonly Part[]): Finding[] {
  if (!parts.length) return [...findings];
  const boxes = parts.map(partBBox);
  return findings.map((f) => {
    if (f.part || !f.atMm) return f;
    const p: [number, number] = [f.atMm[0], f.atMm[1]];
    const i = parts.findIndex((part, k) => {
      const b = boxes[k];
      if (p[0] < b[0] - 0.01 || p[0] > b[2] + 0.01 || p[1] < b[1] - 0.01 || p[1] > b[3] + 0.01) return false;
      return isInside(part.outline, p) || distanceToLoop(part.outline, p) <= 0.01;
    });
    return i < 0 ? f : { ...f, part: parts[i].name };
  });
}

function cap(findings: readonly Finding[]): Finding[] {
  const seen = new Map<string, number>();
  const out: Finding[] = [];
  for (const f of findings) {
    const n = (seen.get(f.rule) ?? 0) + 1;
    seen.set(f.rule, n);
    if (n <= MAX_PER_RULE) out.push(f);
  }
  for (const [rule, n] of seen) {
    if (n > MAX_PER_RULE) {
      const sev = findings.find((f) => f.rule === rule)!.severity;
      out.push(fileFinding(rule, sev, `${n - MAX_PER_RULE} more ${rule} findings not listed`, n - MAX_PER_RULE, 'findings'));
    }
  }
  return out;
}
