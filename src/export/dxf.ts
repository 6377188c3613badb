import type { Part } from '../geometry/part.js';
import { partDocument, placedPartsDocument, type DxfBuildOptions, type PlacedPart } from './dxfDocument.js';
import { writeDxfR12 } from './dxfR12.js';
import { writeDxfR2000 } from './dxfR2000.js';

export type DxfOptions = DxfBuildOptions & Readonly<{ version?: 'R12' | 'R2000'; comment?: string }>;

function write(doc: ReturnType<typeof partDocument>, options: DxfOptions): string {
  return (options.version ?? 'R12') === 'R12' ? writeDxfR12(doc) : writeDxfR2000(doc);
}

const withComment = (o: DxfOptions): DxfOptions => (o.comment ? { ...o, comments: [...(o.comments ?? []), o.comment] } : o);

/** One part as a DXF file (mm, layer per operation, arcs as arcs). R12 unless version is 'R2000'. */
export function partToDxf(part: Part, options: DxfOptions = {}): string {
  const o = withComment(options);
  return write(partDocument(part, o), o);
}

/** Several parts at given places in one DXF (e.g. a nested sheet). */
export function placedPartsToDxf(items: readonly PlacedPart[], options: DxfOptions = {}): string {
  const o = withComment(options);
  return write(placedPartsDocument(items, o), o);
}
