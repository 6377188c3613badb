import type { Feature, Member, Part } from '../geometry/part.js';
import { circle, roundedRect } from '../geometry/primitives.js';

/**
 * Drilled test plates for the benchmark and the limit tests: a rounded rectangle with a grid of
 * round holes, as a Part (for the rules) or as ASCII DXF text (for the whole `check` command).
 */

/** Columns × rows of holes on a pitch, the plate 10 mm larger than the grid on every side. */
export type HoleGrid = Readonly<{ holes: number; pitchMm: number; diameterMm: number; cornerMm?: number; square?: boolean }>;

const grid = (g: HoleGrid): { cols: number; rows: number; w: number; h: number } => {
  const cols = Math.ceil(Math.sqrt(g.holes * 1.25));
  const rows = Math.ceil(g.holes / cols);
  return { cols, rows, w: (cols - 1) * g.pitchMm + 20, h: (rows - 1) * g.pitchMm + 20 };
};

/** Hole centres, row by row from the lower left, plate origin at its lower-left corner. mm. */
function centres(g: HoleGrid): Array<[number, number]> {
  const { cols } = grid(g);
  return Array.from({ length: g.holes }, (_, k) => [10 + (k % cols) * g.pitchMm, 10 + Math.floor(k / cols) * g.pitchMm]);
}

/**
 * The plate as a framewright part: holes are imported round holes (every hole rule applies), and one
 * member runs along every row of holes, so the hole-stress and weave rules have work in proportion.
 */
export function drilledPlate(g: HoleGrid): Part {
  const { w, h, rows } = grid(g);
  const features: Feature[] = centres(g).map((c) => ({ loop: circle(c, g.diameterMm / 2, false), kind: 'hole', purpose: 'imported', centerMm: c, diameterMm: g.diameterMm }));
  const members: Member[] = Array.from({ length: rows }, (_, j) => ({ name: `row ${j + 1}`, startMm: [10, 10 + j * g.pitchMm], endMm: [w - 10, 10 + j * g.pitchMm], widthMm: g.pitchMm }));
  const outline = roundedRect([w / 2, h / 2], w, h, g.cornerMm ?? 8);
  return {
    name: 'drilled-plate',
    role: 'imported',
    quantity: 1,
    thicknessMm: 2,
    material: { name: 'woven-cf', e1Gpa: 65, e2Gpa: 65, g12Gpa: 4, nu12: 0.07, densityGPerCm3: 1.57 },
    weaveRad: 0,
    outline,
    features,
    members,
    placements: [],
    sourcePath: 'bench',
  };
}

/** The plate as a drawing a CAD program writes: outline of LINEs and ARCs, holes as CIRCLEs (or squares of four LINEs). */
export function drilledPlateDxf(g: HoleGrid): string {
  const { w, h } = grid(g);
  const r = g.cornerMm ?? 8;
  const out: string[] = ['0', 'SECTION', '2', 'HEADER', '9', '$INSUNITS', '70', '4', '0', 'ENDSEC', '0', 'SECTION', '2', 'ENTITIES'];
  const line = (a: number, b: number, c: number, d: number) => out.push('0', 'LINE', '8', 'CUT', '10', `${a}`, '20', `${b}`, '11', `${c}`, '21', `${d}`);
  const arc = (x: number, y: number, a0: number, a1: number) => out.push('0', 'ARC', '8', 'CUT', '10', `${x}`, '20', `${y}`, '40', `${r}`, '50', `${a0}`, '51', `${a1}`);
  line(r, 0, w - r, 0);
  arc(w - r, r, 270, 360);
  line(w, r, w, h - r);
  arc(w - r, h - r, 0, 90);
  line(w - r, h, r, h);
  arc(r, h - r, 90, 180);
  line(0, h - r, 0, r);
  arc(r, r, 180, 270);
  const s = g.diameterMm / 2;
  for (const [x, y] of centres(g)) {
    if (g.square) {
      line(x - s, y - s, x + s, y - s);
      line(x + s, y - s, x + s, y + s);
      line(x + s, y + s, x - s, y + s);
      line(x - s, y + s, x - s, y - s);
    } else out.push('0', 'CIRCLE', '8', 'CUT', '10', `${x}`, '20', `${y}`, '40', `${s}`);
  }
  out.push('0', 'ENDSEC', '0', 'EOF', '');
  return out.join('\n');
}

/** The 2,000-hole plate of the check figures: 6 mm holes on a 10 mm pitch (4 mm webs), 2 mm thick. */
export const LIGHTENING_GRID: HoleGrid = { holes: 2000, pitchMm: 10, diameterMm: 6 };

/** About a metre square with 99,999 Ø2 mm holes on a 3.1 mm pitch: beyond the checks' contour limit. */
export const METRE_PLATE: HoleGrid = { holes: 99_999, pitchMm: 3.1, diameterMm: 2 };

/** 25,000 square 3 mm holes (four lines each) on a 6.2 mm pitch: beyond what modes meshes. */
export const SQUARES_PLATE: HoleGrid = { holes: 25_000, pitchMm: 6.2, diameterMm: 3, square: true };
