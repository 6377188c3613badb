import DxfWriter from 'dxf-writer';
import Handle from 'dxf-writer/src/Handle.js';
import { assertNever } from '../geometry/types.js';
import { DXF_LAYERS, type DxfDocument } from './dxfDocument.js';
import { dxfCommentLines, plainLine } from './format.js';

/** Coordinates rounded the same way as the R12 writer, so both give stable bytes. */
const r6 = (x: number): number => {
  const v = Math.round(x * 1e6) / 1e6;
  return Object.is(v, -0) ? 0 : v;
};

/**
 * DXF R2000 (AC1015) with LWPOLYLINE contours, through the `dxf-writer` package (it writes the
 * handles, block records and objects that R2000 readers expect). Its typings omit the bulge
 * element of a polyline point although the code writes it, hence the local cast.
 */
export function writeDxfR2000(doc: DxfDocument): string {
  // dxf-writer numbers handles from one counter shared by every drawing of the process; restart it
  // for each file, so a file's bytes depend on its content alone (not on what was written before).
  Handle.seed = 0;
  const d = new DxfWriter();
  d.setUnits('Millimeters');
  (d as unknown as { header(v: string, vals: Array<[number, string | number]>): void }).header('ACADVER', [[1, 'AC1015']]);
  d.header('MEASUREMENT', [[70, 1]]);
  for (const l of Object.values(DXF_LAYERS)) d.addLayer(l.name, l.color, 'CONTINUOUS');
  for (const e of doc.entities) {
    d.setActiveLayer(e.layer);
    switch (e.kind) {
      case 'circle':
        d.drawCircle(r6(e.cx), r6(e.cy), r6(e.r));
        break;
      case 'line':
        d.drawLine(r6(e.x1), r6(e.y1), r6(e.x2), r6(e.y2));
        break;
      case 'arc':
        d.drawArc(r6(e.cx), r6(e.cy), r6(e.r), r6(e.startDeg), r6(e.endDeg));
        break;
      case 'polyline': {
        const pts = e.vertices.map((v) => (v.bulge !== 0 ? [r6(v.x), r6(v.y), Math.round(v.bulge * 1e10) / 1e10] : [r6(v.x), r6(v.y)]));
        (d as unknown as { drawPolyline(p: number[][], closed: boolean): void }).drawPolyline(pts, true);
        break;
      }
      case 'text':
        d.drawText(r6(e.x), r6(e.y), r6(e.height), 0, plainLine(e.text));
        break;
      default:
        assertNever(e);
    }
  }
  const comments = dxfCommentLines(doc.comments).map((line) => `999\n${line}\n`).join('');
  return comments + d.toDxfString();
}
