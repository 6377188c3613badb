import { asCircle, transformLoop, type Transform } from '../geometry/loop.js';
import type { Part } from '../geometry/part.js';
import { partBBox } from '../geometry/metrics.js';
import { startOf } from '../geometry/segment.js';
import { assertNever, type BBox, type Loop } from '../geometry/types.js';
import { loopBBox, unionBBox } from '../geometry/loop.js';

/** Layer per operation, as shops ask: the cutter's program picks operations by layer. */
export const DXF_LAYERS = {
  outside: { name: 'CUT_OUTSIDE', color: 7, description: 'outside profile: tool runs outside the line' },
  inside: { name: 'CUT_INSIDE', color: 1, description: 'inside profiles (slots, cut-outs): tool runs inside' },
  holes: { name: 'HOLES', color: 5, description: 'round holes: drill or profile inside' },
  label: { name: 'LABEL_NOCUT', color: 3, description: 'part names and notes; never cut' },
} as const;

export type DxfLayer = (typeof DXF_LAYERS)[keyof typeof DXF_LAYERS]['name'];

/** A vertex of a closed polyline: the bulge describes the segment that starts here (tan(sweep/4)). */
export type DxfVertex = Readonly<{ x: number; y: number; bulge: number }>;

export type DxfEntity =
  | Readonly<{ kind: 'circle'; layer: DxfLayer; cx: number; cy: number; r: number }>
  | Readonly<{ kind: 'line'; layer: DxfLayer; x1: number; y1: number; x2: number; y2: number }>
  | Readonly<{ kind: 'arc'; layer: DxfLayer; cx: number; cy: number; r: number; startDeg: number; endDeg: number }>
  | Readonly<{ kind: 'polyline'; layer: DxfLayer; vertices: readonly DxfVertex[] }>
  | Readonly<{ kind: 'text'; layer: DxfLayer; x: number; y: number; height: number; text: string }>;

/** The intermediate document every DXF writer serialises. */
export type DxfDocument = Readonly<{ entities: readonly DxfEntity[]; extents: BBox; comments: readonly string[] }>;

export type ContourStyle = 'polyline' | 'entities';

export type DxfBuildOptions = Readonly<{
  /** Closed polylines with bulges (one entity per contour, default) or loose LINE and ARC entities. */
  contours?: ContourStyle;
  /** Lines written as DXF comments (999) at the top of the file. */
  comments?: readonly string[];
  /** Write each part's name on the label layer (default true). */
  labels?: boolean;
}>;

export type PlacedPart = Readonly<{ part: Part; transform: Transform; label?: string }>;

const RAD = 180 / Math.PI;

function loopEntities(loop: Loop, layer: DxfLayer, style: ContourStyle): DxfEntity[] {
  const c = asCircle(loop);
  if (c) return [{ kind: 'circle', layer, cx: c.center[0], cy: c.center[1], r: c.radius }];
  if (style === 'polyline') {
    return [{
      kind: 'polyline',
      layer,
      vertices: loop.map((s) => {
        const p = startOf(s);
        return { x: p[0], y: p[1], bulge: s.kind === 'arc' ? Math.tan(s.sweepRad / 4) : 0 };
      }),
    }];
  }
  return loop.map((s): DxfEntity => {
    switch (s.kind) {
      case 'line':
        return { kind: 'line', layer, x1: s.start[0], y1: s.start[1], x2: s.end[0], y2: s.end[1] };
      case 'arc': {
        // DXF arcs always run counter-clockwise from start to end angle.
        const a0 = s.sweepRad >= 0 ? s.startRad : s.startRad + s.sweepRad;
        const a1 = a0 + Math.abs(s.sweepRad);
        return { kind: 'arc', layer, cx: s.center[0], cy: s.center[1], r: s.radius, startDeg: normDeg(a0 * RAD), endDeg: normDeg(a1 * RAD) };
      }
      default:
        return assertNever(s);
    }
  });
}

const normDeg = (d: number): number => {
  const t = d % 360;
  return t < 0 ? t + 360 : t;
};

/** Entities of placed parts: outline on the outside layer, round holes on the holes layer, the rest inside. */
export function placedPartsDocument(items: readonly PlacedPart[], options: DxfBuildOptions = {}): DxfDocument {
  const style = options.contours ?? 'polyline';
  const entities: DxfEntity[] = [];
  let extents: BBox = [Infinity, Infinity, -Infinity, -Infinity];
  for (const it of items) {
    const outline = transformLoop(it.part.outline, it.transform);
    extents = unionBBox(extents, loopBBox(outline));
    entities.push(...loopEntities(outline, DXF_LAYERS.outside.name, style));
    for (const f of it.part.features) {
      const loop = transformLoop(f.loop, it.transform);
      entities.push(...loopEntities(loop, asCircle(loop) ? DXF_LAYERS.holes.name : DXF_LAYERS.inside.name, style));
    }
    if (options.labels ?? true) {
      const b = loopBBox(outline);
      const h = Math.max(1.5, Math.min(4, (b[3] - b[1]) / 12));
      entities.push({ kind: 'text', layer: DXF_LAYERS.label.name, x: b[0], y: b[3] + h * 0.6, height: h, text: it.label ?? it.part.name });
    }
  }
  return { entities, extents, comments: options.comments ?? [] };
}

/** One part in its own coordinates. */
export function partDocument(part: Part, options: DxfBuildOptions = {}): DxfDocument {
  const doc = placedPartsDocument([{ part, transform: { rotateRad: 0, translate: [0, 0] } }], options);
  return { ...doc, extents: partBBox(part) };
}
