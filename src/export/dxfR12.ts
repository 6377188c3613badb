import { dxfCommentLines, fmt, plainLine } from './format.js';
import { DXF_LAYERS, type DxfDocument, type DxfEntity } from './dxfDocument.js';
import { assertNever } from '../geometry/types.js';

/**
 * DXF R12 (AC1009) writer of our own: the npm writers we tried emit only R2000+ LWPOLYLINEs, and most
 * CAM importers take R12 POLYLINE/VERTEX/SEQEND with bulges, ARC and CIRCLE best. Millimetres,
 * $INSUNITS = 4, a real layer table, no handles, no timestamps.
 */
export function writeDxfR12(doc: DxfDocument): string {
  const out: string[] = [];
  const tag = (code: number, value: string | number) => {
    out.push(String(code).padStart(3, ' '), typeof value === 'number' ? fmt(value, 6) : value);
  };
  for (const line of dxfCommentLines(doc.comments)) tag(999, line);
  const [x0, y0, x1, y1] = Number.isFinite(doc.extents[0]) ? doc.extents : [0, 0, 0, 0];
  tag(0, 'SECTION'); tag(2, 'HEADER');
  tag(9, '$ACADVER'); tag(1, 'AC1009');
  tag(9, '$INSUNITS'); tag(70, 4);
  tag(9, '$MEASUREMENT'); tag(70, 1);
  tag(9, '$EXTMIN'); tag(10, x0); tag(20, y0); tag(30, 0);
  tag(9, '$EXTMAX'); tag(10, x1); tag(20, y1); tag(30, 0);
  tag(0, 'ENDSEC');

  tag(0, 'SECTION'); tag(2, 'TABLES');
  tag(0, 'TABLE'); tag(2, 'LTYPE'); tag(70, 1);
  tag(0, 'LTYPE'); tag(2, 'CONTINUOUS'); tag(70, 0); tag(3, 'Solid line'); tag(72, 65); tag(73, 0); tag(40, 0);
  tag(0, 'ENDTAB');
  const layers = Object.values(DXF_LAYERS);
  tag(0, 'TABLE'); tag(2, 'LAYER'); tag(70, layers.length + 1);
  tag(0, 'LAYER'); tag(2, '0'); tag(70, 0); tag(62, 7); tag(6, 'CONTINUOUS');
  for (const l of layers) {
    tag(0, 'LAYER'); tag(2, l.name); tag(70, 0); tag(62, l.color); tag(6, 'CONTINUOUS');
  }
  tag(0, 'ENDTAB');
  tag(0, 'TABLE'); tag(2, 'STYLE'); tag(70, 1);
  tag(0, 'STYLE'); tag(2, 'STANDARD'); tag(70, 0); tag(40, 0); tag(41, 1); tag(50, 0); tag(71, 0); tag(42, 2.5); tag(3, 'txt'); tag(4, '');
  tag(0, 'ENDTAB');
  tag(0, 'ENDSEC');

  tag(0, 'SECTION'); tag(2, 'BLOCKS'); tag(0, 'ENDSEC');

  tag(0, 'SECTION'); tag(2, 'ENTITIES');
  for (const e of doc.entities) entity(e, tag);
  tag(0, 'ENDSEC');
  tag(0, 'EOF');
  return `${out.join('\n')}\n`;
}

function entity(e: DxfEntity, tag: (code: number, value: string | number) => void): void {
  switch (e.kind) {
    case 'circle':
      tag(0, 'CIRCLE'); tag(8, e.layer); tag(10, e.cx); tag(20, e.cy); tag(30, 0); tag(40, e.r);
      return;
    case 'line':
      tag(0, 'LINE'); tag(8, e.layer); tag(10, e.x1); tag(20, e.y1); tag(30, 0); tag(11, e.x2); tag(21, e.y2); tag(31, 0);
      return;
    case 'arc':
      tag(0, 'ARC'); tag(8, e.layer); tag(10, e.cx); tag(20, e.cy); tag(30, 0); tag(40, e.r); tag(50, e.startDeg); tag(51, e.endDeg);
      return;
    case 'polyline':
      tag(0, 'POLYLINE'); tag(8, e.layer); tag(66, 1); tag(10, 0); tag(20, 0); tag(30, 0); tag(70, 1);
      for (const v of e.vertices) {
        tag(0, 'VERTEX'); tag(8, e.layer); tag(10, v.x); tag(20, v.y); tag(30, 0);
        // Bulges keep 10 decimals: an error of 1e-6 in a bulge moves a small arc's radius by microns.
        if (v.bulge !== 0) tag(42, fmt(v.bulge, 10));
      }
      tag(0, 'SEQEND'); tag(8, e.layer);
      return;
    case 'text':
      tag(0, 'TEXT'); tag(8, e.layer); tag(10, e.x); tag(20, e.y); tag(30, 0); tag(40, e.height); tag(1, plainLine(e.text));
      return;
    default:
      assertNever(e);
  }
}
