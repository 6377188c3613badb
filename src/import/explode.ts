import type { Finding } from '../checks/types.js';
import { arc, line } from '../geometry/segment.js';
import type { Segment, Vec2 } from '../geometry/types.js';
import { normAngle } from '../geometry/vec.js';
import { applyAffine, applyLinear, compose, determinant, insertTransform, MIRROR_X, similarityScale, type Affine } from './affine.js';
import { ellipseCurve, fitArcs, fitPointCurve, nurbsCurve, type ParamCurve } from './curves.js';
import type { Block, DxfDocument, RawEntity } from './document.js';
import { DxfReadError } from './errors.js';
import { num, type Pair } from './groupCodes.js';
import { limitWords, type ImportLimits } from './limits.js';

/** Where a segment came from, for findings: entity type, effective layer and the file line. */
export type SourceRef = Readonly<{ entity: string; layer: string; line: number }>;

/** One exploded cut segment in millimetres, with its source. */
export type DrawnSegment = Readonly<{ seg: Segment; source: SourceRef; approximated: boolean }>;

/** Whether a layer carries cut geometry, and if not, why. */
export type LayerDecision = Readonly<{ cut: true } | { cut: false; reason: string }>;

export type ExplodeOptions = Readonly<{
  /** Drawing units → mm (and nothing else). */
  toMm: Affine;
  layerDecision: (layer: string) => LayerDecision;
  /** Largest distance between a SPLINE, ELLIPSE or non-uniformly scaled arc and the arcs replacing it. mm. */
  curveTolMm: number;
  limits: ImportLimits;
}>;

export type ExplodeResult = Readonly<{ segments: DrawnSegment[]; findings: Finding[]; layersUsed: ReadonlySet<string> }>;

/** Entities that annotate a drawing and are never cut. */
const ANNOTATION = new Set(['TEXT', 'MTEXT', 'DIMENSION', 'ARC_DIMENSION', 'LEADER', 'MULTILEADER', 'MLEADER', 'TOLERANCE', 'ATTDEF', 'ATTRIB', 'HATCH']);
/** Entities with no bearing on cut geometry, ignored without comment. POINT is not among them: a shop may read it as a drill mark. */
const SILENT = new Set(['VIEWPORT']);

type Ctx = {
  opts: ExplodeOptions;
  doc: DxfDocument;
  segments: DrawnSegment[];
  findings: Finding[];
  skippedLayers: Map<string, { reason: string; count: number }>;
  annotations: Map<string, { count: number; at: Vec2 | null; types: Set<string> }>;
  unsupported: Map<string, { count: number; line: number }>;
  approximated: Map<string, { count: number; line: number }>;
  layersUsed: Set<string>;
  entityCount: number;
};

/**
 * Turn the model-space entities into segments in mm: blocks exploded with their transforms
 * (nested, scaled, rotated, mirrored, arrays), OCS flips applied, ellipses and splines fitted by
 * arcs. Entities on layers that are not cut layers are counted and skipped; annotation, unsupported
 * and unusable entities become findings. Throws DxfReadError past the size limits.
 */
export function explode(doc: DxfDocument, opts: ExplodeOptions): ExplodeResult {
  const ctx: Ctx = {
    opts,
    doc,
    segments: [],
    findings: [],
    skippedLayers: new Map(),
    annotations: new Map(),
    unsupported: new Map(),
    approximated: new Map(),
    layersUsed: new Set(),
    entityCount: 0,
  };
  for (const e of doc.entities) visit(ctx, e, opts.toMm, null, 0, []);
  summarise(ctx);
  return { segments: ctx.segments, findings: ctx.findings, layersUsed: ctx.layersUsed };
}

const first = (e: RawEntity, code: number): Pair | undefined => e.pairs.find((p) => p.code === code);
const numOr = (e: RawEntity, code: number, fallback: number): number => {
  const p = first(e, code);
  return p ? num(p) : fallback;
};
const str = (e: RawEntity, code: number): string | undefined => first(e, code)?.value.trim();

function finding(rule: string, severity: Finding['severity'], message: string, atMm: Vec2 | null = null, measured: number | null = null, unit = ''): Finding {
  return { rule, severity, part: '', measured, limit: null, unit, atMm: atMm ? [atMm[0], atMm[1]] : null, message };
}

function visit(ctx: Ctx, e: RawEntity, m: Affine, parentLayer: string | null, depth: number, chain: string[]): void {
  if (++ctx.entityCount > ctx.opts.limits.maxEntities) {
    throw new DxfReadError(`the drawing has more than ${ctx.opts.limits.maxEntities} entities once blocks are exploded, the reader's limit`);
  }
  if (str(e, 67) === '1') return; // paper space: layouts, title blocks; never cut geometry
  const own = str(e, 8) ?? '0';
  // DXF rule: entities of a block drawn on layer 0 take the layer of the INSERT.
  const layer = own === '0' && parentLayer !== null ? parentLayer : own;
  if (SILENT.has(e.type)) return;
  const decision = ctx.opts.layerDecision(layer);
  if (!decision.cut) {
    const s = ctx.skippedLayers.get(layer) ?? { reason: decision.reason, count: 0 };
    s.count++;
    ctx.skippedLayers.set(layer, s);
    return;
  }
  if (ANNOTATION.has(e.type)) {
    const a = ctx.annotations.get(layer) ?? { count: 0, at: null, types: new Set<string>() };
    a.count++;
    a.types.add(e.type);
    const p = first(e, 10);
    if (!a.at && p) a.at = applyAffine(m, [num(p), numOr(e, 20, 0)]);
    ctx.annotations.set(layer, a);
    return;
  }
  const extrusionZ = numOr(e, 230, 1);
  const ex = numOr(e, 210, 0);
  const ey = numOr(e, 220, 0);
  // A LINE's points are world coordinates whatever its extrusion (which only orients its thickness).
  if (e.type !== 'LINE' && (Math.abs(ex) > 1e-6 || Math.abs(ey) > 1e-6 || extrusionZ === 0)) {
    ctx.findings.push(finding('dxf-not-planar', 'warning', `${e.type} on layer ${layer} (line ${e.line}) is drawn in a tilted plane (extrusion ${ex}, ${ey}, ${extrusionZ}) and was skipped; flatten it to the XY plane`));
    return;
  }
  // Arbitrary axis algorithm: a (0, 0, −1) extrusion mirrors the object coordinate system's x.
  const ocs = extrusionZ < 0 ? compose(m, MIRROR_X) : m;
  const src: SourceRef = { entity: e.type, layer, line: e.line };
  try {
    switch (e.type) {
      case 'LINE':
        emit(ctx, [line([numOr(e, 10, 0), numOr(e, 20, 0)], [numOr(e, 11, 0), numOr(e, 21, 0)])], m, src);
        return;
      case 'CIRCLE': {
        const r = numOr(e, 40, 0);
        if (!(r > 0)) return bad(ctx, e, layer, `radius ${r}`);
        emit(ctx, [arc([numOr(e, 10, 0), numOr(e, 20, 0)], r, 0, 2 * Math.PI)], ocs, src);
        return;
      }
      case 'ARC': {
        const r = numOr(e, 40, 0);
        if (!(r > 0)) return bad(ctx, e, layer, `radius ${r}`);
        const a0 = (numOr(e, 50, 0) * Math.PI) / 180;
        const a1 = (numOr(e, 51, 360) * Math.PI) / 180;
        let sweep = normAngle(a1 - a0);
        if (sweep <= 1e-12) sweep = 2 * Math.PI;
        emit(ctx, [arc([numOr(e, 10, 0), numOr(e, 20, 0)], r, a0, sweep)], ocs, src);
        return;
      }
      case 'LWPOLYLINE':
        emit(ctx, polylineSegments(lwVertices(e), (numOr(e, 70, 0) & 1) !== 0), ocs, src);
        return;
      case 'POLYLINE': {
        const flags = numOr(e, 70, 0);
        if (flags & (16 | 64)) return unsupported(ctx, `${e.type} (mesh)`, e.line);
        const threeD = (flags & 8) !== 0;
        emit(ctx, polylineSegments(oldVertices(e), (flags & 1) !== 0), threeD ? m : ocs, src);
        return;
      }
      case 'ELLIPSE': {
        const ratio = numOr(e, 40, 1);
        const major: Vec2 = [numOr(e, 11, 0), numOr(e, 21, 0)];
        if (!(ratio > 0) || (major[0] === 0 && major[1] === 0)) return bad(ctx, e, layer, `axis ratio ${ratio}, major axis (${major[0]}, ${major[1]})`);
        const sgn = extrusionZ < 0 ? -1 : 1;
        const minor: Vec2 = [-major[1] * ratio * sgn, major[0] * ratio * sgn];
        const t0 = numOr(e, 41, 0);
        let t1 = numOr(e, 42, 2 * Math.PI);
        while (t1 <= t0 + 1e-12) t1 += 2 * Math.PI;
        ellipse(ctx, [numOr(e, 10, 0), numOr(e, 20, 0)], major, minor, t0, Math.min(t1, t0 + 2 * Math.PI), m, src);
        return;
      }
      case 'SPLINE':
        spline(ctx, e, m, src);
        return;
      case 'INSERT':
        insert(ctx, e, ocs, layer, depth, chain);
        return;
      default:
        unsupported(ctx, e.type, e.line);
        return;
    }
  } catch (err) {
    if (err instanceof DxfReadError) throw err;
    bad(ctx, e, layer, (err as Error).message);
  }
}

function bad(ctx: Ctx, e: RawEntity, layer: string, what: string): void {
  ctx.findings.push(finding('dxf-bad-entity', 'warning', `${e.type} on layer ${layer} (line ${e.line}) cannot be used (${what}) and was skipped`));
}

function unsupported(ctx: Ctx, type: string, lineNo: number): void {
  const u = ctx.unsupported.get(type) ?? { count: 0, line: lineNo };
  u.count++;
  ctx.unsupported.set(type, u);
}

type Vertex = { x: number; y: number; bulge: number };

function lwVertices(e: RawEntity): Vertex[] {
  const vs: Vertex[] = [];
  for (const p of e.pairs) {
    if (p.code === 10) vs.push({ x: num(p), y: 0, bulge: 0 });
    else if (p.code === 20 && vs.length) vs[vs.length - 1].y = num(p);
    else if (p.code === 42 && vs.length) vs[vs.length - 1].bulge = num(p);
  }
  return vs;
}

function oldVertices(e: RawEntity): Vertex[] {
  const vs: Vertex[] = [];
  for (const v of e.vertices) {
    const flags = numOr(v, 70, 0);
    if (flags & 16) continue; // spline frame control point: not on the curve
    vs.push({ x: numOr(v, 10, 0), y: numOr(v, 20, 0), bulge: numOr(v, 42, 0) });
  }
  return vs;
}

/** Lines and arcs of a polyline; bulge = tan(sweep / 4), negative for clockwise (DXF Reference). */
export function polylineSegments(vs: readonly Vertex[], closed: boolean): Segment[] {
  const out: Segment[] = [];
  const n = vs.length;
  const count = closed ? n : n - 1;
  for (let i = 0; i < count; i++) {
    const a = vs[i];
    const b = vs[(i + 1) % n];
    const p: Vec2 = [a.x, a.y];
    const q: Vec2 = [b.x, b.y];
    // A closed polyline often repeats its first vertex at the end: that closing piece is empty.
    if (closed && i === n - 1 && a.x === b.x && a.y === b.y) continue;
    out.push(bulgeSegment(p, q, a.bulge));
  }
  return out;
}

/** The line or arc from p to q with the given bulge. */
export function bulgeSegment(p: Vec2, q: Vec2, bulge: number): Segment {
  const dx = q[0] - p[0];
  const dy = q[1] - p[1];
  const c = Math.hypot(dx, dy);
  if (bulge === 0 || c === 0) return line(p, q);
  const sweep = 4 * Math.atan(bulge);
  const h = c / 2 / Math.tan(sweep / 2);
  const centre: Vec2 = [(p[0] + q[0]) / 2 - (dy / c) * h, (p[1] + q[1]) / 2 + (dx / c) * h];
  const r = c / (2 * Math.abs(Math.sin(sweep / 2)));
  return arc(centre, r, Math.atan2(p[1] - centre[1], p[0] - centre[0]), sweep);
}

/** Map segments through m and keep them; arcs under a non-uniform map become fitted ellipses. */
function emit(ctx: Ctx, segs: readonly Segment[], m: Affine, src: SourceRef): void {
  const k = similarityScale(m);
  for (const s of segs) {
    if (s.kind === 'line') {
      push(ctx, { kind: 'line', start: applyAffine(m, s.start), end: applyAffine(m, s.end) }, src, false);
    } else if (k !== null) {
      const c = applyAffine(m, s.center);
      const sp = applyAffine(m, [s.center[0] + s.radius * Math.cos(s.startRad), s.center[1] + s.radius * Math.sin(s.startRad)]);
      const sweep = determinant(m) < 0 ? -s.sweepRad : s.sweepRad;
      push(ctx, arc(c, s.radius * k, Math.atan2(sp[1] - c[1], sp[0] - c[0]), sweep), src, false);
    } else {
      const u: Vec2 = [s.radius, 0];
      const v: Vec2 = [0, s.radius];
      ellipse(ctx, s.center, u, v, s.startRad, s.startRad + s.sweepRad, m, src);
    }
  }
}

/** Ellipse centre + u cos t + v sin t, t from t0 to t1 (t1 may be below t0), in local coordinates. */
function ellipse(ctx: Ctx, centre: Vec2, u: Vec2, v: Vec2, t0: number, t1: number, m: Affine, src: SourceRef): void {
  const c = applyAffine(m, centre);
  const U = applyLinear(m, u);
  const V = applyLinear(m, v);
  const ru = Math.hypot(U[0], U[1]);
  const rv = Math.hypot(V[0], V[1]);
  const orth = U[0] * V[0] + U[1] * V[1];
  const turn = U[0] * V[1] - U[1] * V[0];
  if (Math.abs(ru - rv) <= 1e-9 * ru && Math.abs(orth) <= 1e-9 * ru * rv) {
    // A circle after all: keep it an exact arc. Angle at t is atan2(U) ± t.
    const s = Math.sign(turn);
    push(ctx, arc(c, ru, Math.atan2(U[1], U[0]) + s * t0, s * (t1 - t0)), src, false);
    return;
  }
  const lo = Math.min(t0, t1);
  const hi = Math.max(t0, t1);
  let segs = fitArcs(ellipseCurve(c, U, V, lo, hi), ctx.opts.curveTolMm);
  if (t1 < t0) segs = segs.map(reverse).reverse();
  noteApprox(ctx, src);
  for (const s of segs) push(ctx, s, src, true);
}

const reverse = (s: Segment): Segment =>
  s.kind === 'line' ? line(s.end, s.start) : arc(s.center, s.radius, s.startRad + s.sweepRad, -s.sweepRad);

function noteApprox(ctx: Ctx, src: SourceRef): void {
  const a = ctx.approximated.get(src.entity) ?? { count: 0, line: src.line };
  a.count++;
  ctx.approximated.set(src.entity, a);
}

function spline(ctx: Ctx, e: RawEntity, m: Affine, src: SourceRef): void {
  const degree = numOr(e, 71, 3);
  const knots: number[] = [];
  const weights: number[] = [];
  const ctrl: Vec2[] = [];
  const fit: Vec2[] = [];
  for (const p of e.pairs) {
    if (p.code === 40) knots.push(num(p));
    else if (p.code === 41) weights.push(num(p));
    else if (p.code === 10) ctrl.push([num(p), 0]);
    else if (p.code === 20 && ctrl.length) ctrl[ctrl.length - 1] = [ctrl[ctrl.length - 1][0], num(p)];
    else if (p.code === 11) fit.push([num(p), 0]);
    else if (p.code === 21 && fit.length) fit[fit.length - 1] = [fit[fit.length - 1][0], num(p)];
  }
  if (!Number.isInteger(degree) || degree < 1 || degree > 11) throw new Error(`degree ${degree}`);
  let curve: ParamCurve;
  if (ctrl.length >= 2) {
    // NURBS are affine invariant: mapping the control points maps the curve.
    curve = nurbsCurve(ctrl.map((p) => applyAffine(m, p)), weights, knots, degree);
  } else if (fit.length >= 2) {
    curve = fitPointCurve(fit.map((p) => applyAffine(m, p)));
  } else {
    throw new Error('no control or fit points');
  }
  noteApprox(ctx, src);
  for (const s of fitArcs(curve, ctx.opts.curveTolMm)) push(ctx, s, src, true);
}

function insert(ctx: Ctx, e: RawEntity, m: Affine, layer: string, depth: number, chain: string[]): void {
  const name = str(e, 2) ?? '';
  const block: Block | undefined = ctx.doc.blocks.get(name);
  if (!block) {
    ctx.findings.push(finding('dxf-missing-block', 'error', `INSERT on layer ${layer} (line ${e.line}) names block ${JSON.stringify(name)}, which the file does not define; its geometry is missing`));
    return;
  }
  if (depth + 1 > ctx.opts.limits.maxBlockDepth || chain.includes(name)) {
    throw new DxfReadError(`block ${JSON.stringify(name)} (line ${e.line}) is nested more than ${ctx.opts.limits.maxBlockDepth} deep or inserts itself`);
  }
  const sx = numOr(e, 41, 1);
  const sy = numOr(e, 42, 1);
  if (sx === 0 || sy === 0) return bad(ctx, e, layer, `scale ${sx} × ${sy}`);
  const rot = (numOr(e, 50, 0) * Math.PI) / 180;
  const cols = Math.max(1, Math.trunc(numOr(e, 70, 1)));
  const rows = Math.max(1, Math.trunc(numOr(e, 71, 1)));
  if (cols * rows * Math.max(1, block.entities.length) > ctx.opts.limits.maxEntities) {
    throw new DxfReadError(`INSERT (line ${e.line}) repeats block ${JSON.stringify(name)} ${cols} × ${rows} times, beyond the reader's limit of ${ctx.opts.limits.maxEntities} entities`);
  }
  const dc = numOr(e, 44, 0);
  const dr = numOr(e, 45, 0);
  for (let r = 0; r < rows; r++) {
    for (let c = 0; c < cols; c++) {
      const t = compose(m, insertTransform(block.base, [numOr(e, 10, 0), numOr(e, 20, 0)], sx, sy, rot, [c * dc, r * dr]));
      for (const child of block.entities) visit(ctx, child, t, layer, depth + 1, [...chain, name]);
    }
  }
}

function push(ctx: Ctx, seg: Segment, source: SourceRef, approximated: boolean): void {
  const lim = ctx.opts.limits.maxCoordinateMm;
  const pts: number[] = seg.kind === 'line' ? [...seg.start, ...seg.end] : [seg.center[0], seg.center[1], seg.radius, seg.startRad, seg.sweepRad];
  for (const x of pts) {
    if (!Number.isFinite(x) || Math.abs(x) > lim) {
      throw new DxfReadError(`${source.entity} on layer ${source.layer} (line ${source.line}) has a coordinate of ${x} mm, beyond the reader's limit of ±${lim} mm`);
    }
  }
  if (ctx.segments.length >= ctx.opts.limits.maxSegments) {
    throw new DxfReadError(`the drawing explodes into more than ${ctx.opts.limits.maxSegments} lines and arcs${limitWords(ctx.opts.limits)}`);
  }
  ctx.layersUsed.add(source.layer);
  ctx.segments.push({ seg, source, approximated });
}

function summarise(ctx: Ctx): void {
  const byName = <T>(m: Map<string, T>) => [...m.entries()].sort((a, b) => (a[0] < b[0] ? -1 : a[0] > b[0] ? 1 : 0));
  for (const [layer, s] of byName(ctx.skippedLayers)) {
    ctx.findings.push(finding('dxf-layer-skipped', 'info', `layer ${layer}: ${s.count} entit${s.count === 1 ? 'y' : 'ies'} skipped (${s.reason}); use --layers to choose the cut layers`, null, s.count, 'entities'));
  }
  for (const [layer, a] of byName(ctx.annotations)) {
    if (!ctx.layersUsed.has(layer)) {
      ctx.findings.push(finding('dxf-layer-skipped', 'info', `layer ${layer}: ${a.count} entit${a.count === 1 ? 'y' : 'ies'} skipped (only text or dimensions)`, null, a.count, 'entities'));
      continue;
    }
    ctx.findings.push(
      finding('dxf-annotation-on-cut-layer', 'warning', `layer ${layer} holds cut geometry and ${a.count} annotation entit${a.count === 1 ? 'y' : 'ies'} (${[...a.types].sort().join(', ')}); a cutter may engrave or reject them: move text and dimensions to their own layer, text that is to be cut as outlines`, a.at, a.count, 'entities'),
    );
  }
  for (const [type, u] of byName(ctx.unsupported)) {
    ctx.findings.push(finding('dxf-unsupported-entity', 'warning', `${u.count} ${type} entit${u.count === 1 ? 'y' : 'ies'} (first on line ${u.line}) cannot be read as cut geometry and were skipped`, null, u.count, 'entities'));
  }
  for (const [type, a] of byName(ctx.approximated)) {
    ctx.findings.push(
      finding('dxf-curve-approximated', 'info', `${a.count} ${type} entit${a.count === 1 ? 'y was' : 'ies were'} replaced by tangent arcs within ${ctx.opts.curveTolMm} mm (first on line ${a.line}); export true arcs or polylines where exact geometry matters`, null, ctx.opts.curveTolMm, 'mm'),
    );
  }
}
