import { featureLabel, loopBBox, partBBox, type Arc, type BBox, type Feature, type Loop, type Part, type Segment, type Vec2 } from '../geometry/index.js';
import type { HardwareItem, HardwareList } from '../assembly/types.js';
import { holeRows } from './cutData.js';
import type { Quote } from './quote.js';

/**
 * Everything the drawing sheets show, computed here so the PDF and SVG writers only lay it out:
 * the scale, the dimension values and where they attach, the hole tables, the cost tables, the notes.
 */

/** The area a part view may fill on an A4 landscape sheet, in paper mm; both writers use it. */
export const DRAWING_VIEW_MM = { width: 158, height: 106 } as const;

/** Preferred drawing scales (ISO 5455), largest first: paper mm per part mm. */
export const DRAWING_SCALES: readonly { factor: number; label: string }[] = [
  { factor: 5, label: '5:1' },
  { factor: 2, label: '2:1' },
  { factor: 1, label: '1:1' },
  { factor: 0.5, label: '1:2' },
  { factor: 0.2, label: '1:5' },
  { factor: 0.1, label: '1:10' },
];

export type TableRow = readonly string[];
export type Table = Readonly<{ title: string; header: TableRow; rows: readonly TableRow[] }>;

/** One round hole of the hole table: its tag (type letter + number), centre and type. */
export type HoleEntry = Readonly<{
  tag: string;
  centerMm: Vec2;
  diameterMm: number;
  /** "Ø3.40 thru", "Ø3.40 csk Ø6.94 90°", with "drill" when the tool is too wide. */
  size: string;
  screw: string;
  /** Holes of this type on the part (the tag's letter). */
  typeCount: number;
}>;

/** A slot, window or other cut-out: tag, the centre of its extent, its size in words and its extent. */
export type CutoutEntry = Readonly<{
  tag: string;
  what: string;
  centerMm: Vec2;
  /** Width and height of its extent (x, y). mm. */
  extentMm: readonly [number, number];
  /** "slot 20.00 × 3.50 at 0.0°", "arc slot R 8.50 × 3.40, 0–50°", "rounded window R 3.00". */
  size: string;
}>;

/** An ordinate dimension: a feature's coordinate along one axis, measured from the datum (part origin). */
export type Ordinate = Readonly<{ axis: 'x' | 'y'; valueMm: number; atMm: Vec2 }>;

export type PartSheet = Readonly<{
  kind: 'part';
  part: Part;
  title: string;
  bboxMm: BBox;
  scale: { factor: number; label: string };
  /** The datum of every coordinate on the sheet: the part's origin, as in its DXF. */
  datumText: string;
  holes: readonly HoleEntry[];
  cutouts: readonly CutoutEntry[];
  /** Distinct ordinates (x: hole and cut-out centres and the extent; y likewise), ascending. */
  ordinates: readonly Ordinate[];
  facts: readonly (readonly [string, string])[];
  /** Angle of the 0° fibre direction on the drawing (part coordinates). deg. */
  weaveDeg: number;
  /** The word for where the part's +x points once assembled (front, motor end). */
  plusX: string;
}>;

export type SummarySheet = Readonly<{
  kind: 'summary';
  title: string;
  tables: readonly Table[];
  /** One row per nested sheet: its utilisation (part area / sheet area). */
  sheetRows: Table;
  lines: readonly string[];
}>;

export type DrawingSheet = PartSheet | SummarySheet;

export type DrawingSet = Readonly<{
  design: string;
  revision: string;
  /** As given on the command line or in the design; never read from the clock here. */
  date: string | null;
  shop: string;
  generalTolerance: string;
  /** The design-rule check summary, or null when the checks were not run. */
  checks: Readonly<{ errors: number; warnings: number }> | null;
  safetyNotes: readonly string[];
  /** Edge finish and handling notes for the shop. */
  edgeNotes: readonly string[];
  /** Screws, nuts and spacers per frame, when the assembly stage provides them (shown on the summary sheet). */
  hardware: Table | null;
  sheets: readonly DrawingSheet[];
}>;

export const SAFETY_NOTES: readonly string[] = [
  'Carbon dust is respirable and conducts electricity: cut wet or with on-tool extraction (H-class/HEPA), wear a P3/P100 respirator and eye protection, seal nearby electronics, vacuum - never blow - clean.',
  'Test a new frame with the props off first; inspect plates after every crash.',
  'Times, prices, masses and structural figures are estimates, not a certification; local regulations and the shop\'s own practice apply.',
];

/** Edge finish and handling for routed carbon plate. Common practice, no source. */
export const EDGE_NOTES: readonly string[] = [
  'Edges: remove burrs and break sharp edges 0.2-0.5 mm; sand wet, never dry; no delamination or frayed fibres at holes and edges.',
  'Holes marked "drill" are smaller than the end mill: drill them. Inside corners keep the tool radius unless a relief is drawn.',
];

export type DrawingOptions = Readonly<{
  design: string;
  revision: string;
  date: string | null;
  generalTolerance?: string;
  checks: Readonly<{ errors: number; warnings: number }> | null;
  /** The frame's screws, nuts and spacers (the assembly's hardware list), counted for the batch on the summary sheet. */
  hardware?: HardwareList;
}>;

const mm = (x: number, d = 1): string => {
  const s = x.toFixed(d);
  return s === `-${(0).toFixed(d)}` ? (0).toFixed(d) : s;
};
const money = (x: number): string => x.toFixed(2);
const minutes = (x: number): string => x.toFixed(1);

/**
 * The drawing sheets for a quote: one per part (view at a stated scale, overall dimensions, key
 * hole positions from the lower-left corner of the part's extent, hole table, cut data and its cost)
 * and a summary sheet (parts, sheets and utilisation, time and cost breakdown, per frame and batch).
 */
export function drawingSet(parts: readonly Part[], quote: Quote, options: DrawingOptions): DrawingSet {
  const cur = quote.currency;
  const partSheets: PartSheet[] = parts.map((part, i) => partSheet(part, quote, i));
  const t = quote.batchTime;
  const c = quote.batchCost;
  const summary: SummarySheet = {
    kind: 'summary',
    title: 'summary',
    tables: [
      {
        title: 'Parts',
        header: ['part', 'per frame', 'total', 'thickness mm', 'tool path mm', 'pierces', 'time min', `direct each ${cur}`, `direct all ${cur}`],
        rows: quote.parts.map((p) => {
          const n = p.cut.quantity * quote.frames;
          return [p.cut.name, String(p.cut.quantity), String(n), mm(p.cut.thicknessMm, 2), mm(p.cut.toolPathMm), String(p.cut.pierces), minutes(p.time.totalMin), money(p.cost.total), money(p.cost.total * n)];
        }),
      },
      {
        title: 'Sheets',
        header: ['thickness mm', 'sheet mm', 'sheets', 'fewest possible', 'utilisation', `price each ${cur}`, `material ${cur}`],
        rows: quote.sheetCosts.map((s) => {
          const g = quote.nesting.groups.find((x) => x.thicknessMm === s.thicknessMm && x.material === s.material)!;
          return [mm(s.thicknessMm, 2), `${mm(s.widthMm, 0)} x ${mm(s.heightMm, 0)}`, String(s.sheets), String(g.lowerBoundSheets), `${mm(g.utilisation * 100, 1)} %`, money(s.pricePerSheet), money(s.cost)];
        }),
      },
      {
        title: `Batch of ${quote.frames} frame${quote.frames === 1 ? '' : 's'}`,
        header: ['item', 'time min', `cost ${cur}`],
        rows: [
          ['cutting', minutes(t.cutMin), ''],
          ['plunges', minutes(t.plungeMin), ''],
          ['rapids', minutes(t.rapidMin), ''],
          ['non-cutting allowance', minutes(t.allowanceMin), ''],
          ['machine time', minutes(t.cutMin + t.plungeMin + t.rapidMin + t.allowanceMin), money(c.machine)],
          ['setup and sheet handling', minutes(t.setupMin), ''],
          [`tool changes (${quote.toolChanges})`, minutes(t.toolChangeMin), ''],
          ['setup and tool changes', minutes(t.setupMin + t.toolChangeMin), money(c.setup)],
          ['material (whole sheets)', '', money(c.material)],
          ['tool wear', '', money(c.tooling)],
          ['subtotal', minutes(t.totalMin), money(c.subtotal)],
          ['margin', '', money(c.margin)],
          ['total', minutes(t.totalMin), money(c.total)],
          ['per frame', minutes(quote.perFrame.timeMin), money(quote.perFrame.cost)],
          ['per frame: material', '', money(quote.perFrame.breakdown.material)],
          ['per frame: machine', '', money(quote.perFrame.breakdown.machine)],
          ['per frame: setup', '', money(quote.perFrame.breakdown.setup)],
        ],
      },
    ],
    sheetRows: {
      title: 'Sheet layouts (files sheets/sheet-NN-*)',
      header: ['sheet', 'thickness mm', 'parts', 'utilisation'],
      rows: quote.nesting.sheets.map((sh, i) => [String(i + 1).padStart(2, '0'), mm(sh.thicknessMm, 2), String(sh.placements.length), `${mm(sh.utilisation * 100, 1)} %`]),
    },
    lines: [
      `Quoted for ${quote.shopName}; ${quote.toolDiameterMm} mm end mill; part spacing ${mm(quote.nesting.spacingMm, 2)} mm, sheet margin ${mm(quote.nesting.marginMm, 1)} mm.`,
      `Frame mass (plates only): ${mm(quote.perFrame.massG, 1)} g.`,
      ...quote.warnings.map((w) => `Note: ${w}`),
    ],
  };
  const all: DrawingSheet[] = [summary, ...partSheets];
  return {
    design: options.design,
    revision: options.revision,
    date: options.date,
    shop: quote.shopName,
    generalTolerance: options.generalTolerance ?? 'ISO 2768-m unless stated',
    checks: options.checks,
    safetyNotes: SAFETY_NOTES,
    edgeNotes: EDGE_NOTES,
    hardware: options.hardware?.items.length ? hardwareTable(options.hardware.items, quote.frames) : null,
    sheets: all,
  };
}

/** The largest preferred scale at which the part fits the view area. */
export function chooseScale(widthMm: number, heightMm: number): { factor: number; label: string } {
  for (const s of DRAWING_SCALES) {
    if (widthMm * s.factor <= DRAWING_VIEW_MM.width && heightMm * s.factor <= DRAWING_VIEW_MM.height) return s;
  }
  return DRAWING_SCALES[DRAWING_SCALES.length - 1];
}

/** The hardware list as a table: per frame and for the batch. */
export function hardwareTable(items: readonly HardwareItem[], frames: number): Table {
  return {
    title: `Hardware (screws, nuts, spacers) for ${frames} frame${frames === 1 ? '' : 's'}`,
    header: ['item', 'standard', 'size', 'length mm', 'per frame', 'all', 'use'],
    rows: items.map((h) => [h.item, h.standard, h.size, h.lengthMm === null ? '-' : mm(h.lengthMm, 1), String(h.count), String(h.count * frames), h.use]),
  };
}

/** The tag letters of hole types, in the order of the quote's hole rows (A, B, … Z, AA, AB …). */
export function tagLetters(k: number): string {
  const a = 'ABCDEFGHIJKLMNOPQRSTUVWXYZ';
  return k < 26 ? a[k] : `${tagLetters(Math.floor(k / 26) - 1)}${a[k % 26]}`;
}

/** Sort key for tagging: top to bottom, then left to right, as a shop reads the view. */
const readingOrder = (a: Vec2, b: Vec2): number => b[1] - a[1] || a[0] - b[0];

/**
 * Every round hole tagged by type: the type letter follows the quote's hole rows (ascending
 * diameter, through before countersunk); numbers follow reading order (top row first, left to right).
 */
export function holeEntries(part: Part, toolDiameterMm: number): HoleEntry[] {
  const rows = holeRows(part);
  const out: HoleEntry[] = [];
  rows.forEach((row, k) => {
    const same = part.features.filter(
      (f) => f.kind === 'hole' && f.diameterMm !== undefined && Math.abs(f.diameterMm - row.diameterMm) < 5e-4 && (f.countersink ? 'countersunk' : 'through') === row.finish && (f.countersink?.headDiameterMm ?? null) === row.countersinkHeadMm,
    );
    const centres = same.map((f) => f.centerMm!).sort(readingOrder);
    const drill = row.diameterMm <= toolDiameterMm + 1e-9 ? ' drill' : '';
    const size = row.finish === 'countersunk' ? `Ø${mm(row.diameterMm, 2)} csk Ø${mm(row.countersinkHeadMm ?? 0, 2)} 90°${drill}` : `Ø${mm(row.diameterMm, 2)} thru${drill}`;
    centres.forEach((c, n) => out.push({ tag: `${tagLetters(k)}${n + 1}`, centerMm: c, diameterMm: row.diameterMm, size, screw: row.screw ?? '-', typeCount: centres.length }));
  });
  return out;
}

/**
 * Slots, windows and cut-outs with their sizes: a straight slot by its overall length, width and
 * axis angle; an arc slot by its centre-line radius, width and angular range; other cut-outs by
 * their extent and smallest corner radius. Tags S1… for slots, W1… for the rest, in reading order.
 */
export function cutoutEntries(part: Part): CutoutEntry[] {
  const others = part.features.filter((f) => !(f.kind === 'hole' && f.diameterMm !== undefined));
  const rows = others.map((f) => {
    const b = loopBBox(f.loop);
    const centerMm: Vec2 = [(b[0] + b[2]) / 2, (b[1] + b[3]) / 2];
    return { f, centerMm, extentMm: [b[2] - b[0], b[3] - b[1]] as const, size: cutoutSize(f.loop, f.kind) };
  });
  const slots = rows.filter((r) => r.f.kind === 'slot').sort((a, b) => readingOrder(a.centerMm, b.centerMm));
  const windows = rows.filter((r) => r.f.kind !== 'slot').sort((a, b) => readingOrder(a.centerMm, b.centerMm));
  const what = (f: Feature): string => featureLabel(f);
  return [
    ...slots.map((r, n) => ({ tag: `S${n + 1}`, what: what(r.f), centerMm: r.centerMm, extentMm: r.extentMm, size: r.size })),
    ...windows.map((r, n) => ({ tag: `W${n + 1}`, what: what(r.f), centerMm: r.centerMm, extentMm: r.extentMm, size: r.size })),
  ];
}

const HALF_TURN = (s: Segment): boolean => s.kind === 'arc' && Math.abs(Math.abs(s.sweepRad) - Math.PI) < 1e-6;

/** A slot or cut-out's size in words (see cutoutEntries). */
export function cutoutSize(loop: Loop, kind: Feature['kind']): string {
  const caps = loop.filter(HALF_TURN) as Arc[];
  if (kind === 'slot' && caps.length === 2 && loop.length === 4) {
    const [a, b] = caps;
    const w = 2 * a.radius;
    const sides = loop.filter((s) => !HALF_TURN(s));
    if (sides.every((s) => s.kind === 'line')) {
      const len = Math.hypot(b.center[0] - a.center[0], b.center[1] - a.center[1]) + w;
      let ang = (Math.atan2(b.center[1] - a.center[1], b.center[0] - a.center[0]) * 180) / Math.PI;
      ang = ((ang % 180) + 180) % 180;
      return `slot ${mm(len, 2)} x ${mm(w, 2)}, axis ${mm(ang, 1)}°`;
    }
    const arcs = sides as Arc[];
    if (arcs.every((s) => s.kind === 'arc')) {
      const r = (arcs[0].radius + arcs[1].radius) / 2;
      const c = arcs[0].center;
      const angles = caps.map((k) => (Math.atan2(k.center[1] - c[1], k.center[0] - c[0]) * 180) / Math.PI).sort((x, y) => x - y);
      return `arc slot R${mm(r, 2)} x ${mm(w, 2)}, ${mm(angles[0], 1)}° to ${mm(angles[1], 1)}° about (${mm(c[0], 2)}, ${mm(c[1], 2)})`;
    }
  }
  const radii = loop.filter((s): s is Arc => s.kind === 'arc').map((s) => s.radius);
  const b = loopBBox(loop);
  const corner = radii.length ? `, corners R${mm(Math.min(...radii), 2)}` : ', sharp corners';
  return `${mm(b[2] - b[0], 2)} x ${mm(b[3] - b[1], 2)}${corner}`;
}

/** Distinct ordinates of the hole and cut-out centres and the part's extent, per axis, ascending. */
export function ordinates(part: Part, holes: readonly HoleEntry[], cutouts: readonly CutoutEntry[], bbox: BBox): Ordinate[] {
  const pts: Vec2[] = [...holes.map((h) => h.centerMm), ...cutouts.map((c) => c.centerMm)];
  const out: Ordinate[] = [];
  for (const axis of ['x', 'y'] as const) {
    const k = axis === 'x' ? 0 : 1;
    const seen = new Map<string, Ordinate>();
    const add = (v: number, at: Vec2): void => {
      const key = mm(v, 2);
      if (!seen.has(key)) seen.set(key, { axis, valueMm: Number(key), atMm: at });
    };
    add(bbox[k], axis === 'x' ? [bbox[0], bbox[1]] : [bbox[0], bbox[1]]);
    add(bbox[k + 2], axis === 'x' ? [bbox[2], bbox[1]] : [bbox[0], bbox[3]]);
    for (const p of pts) add(p[k], p);
    out.push(...[...seen.values()].sort((a, b) => a.valueMm - b.valueMm));
  }
  return out;
}

/** Where the part's +x points once assembled, in words. */
export function plusXWord(part: Part): string {
  return part.role === 'arm' ? 'motor end' : part.role === 'imported' ? '+x' : 'front';
}

function partSheet(part: Part, quote: Quote, i: number): PartSheet {
  const q = quote.parts[i];
  const bbox = partBBox(part);
  const w = bbox[2] - bbox[0];
  const h = bbox[3] - bbox[1];
  const holes = holeEntries(part, q.cut.toolDiameterMm);
  const cutouts = cutoutEntries(part);
  const copies = part.quantity * quote.frames;
  return {
    kind: 'part',
    part,
    title: part.name,
    bboxMm: bbox,
    scale: chooseScale(w, h),
    datumText: 'datum (0, 0): the part origin, as in its DXF; x to the right, y up',
    holes,
    cutouts,
    ordinates: ordinates(part, holes, cutouts, bbox),
    facts: [
      ['material', `${part.material.name}, woven 0/90 carbon/epoxy`],
      ['thickness', `${mm(part.thicknessMm, 2)} mm`],
      ['weave', `0° fibres at ${mm(q.cut.weaveDeg, 0)}° to part x (arrow)`],
      ['quantity', `${part.quantity} per frame, ${copies} for ${quote.frames} frame${quote.frames === 1 ? '' : 's'}`],
      ['overall size', `${mm(w, 2)} x ${mm(h, 2)} mm`],
      ['x from, to', `${mm(bbox[0], 2)} to ${mm(bbox[2], 2)}`],
      ['y from, to', `${mm(bbox[1], 2)} to ${mm(bbox[3], 2)}`],
      ['area, mass', `${mm(q.cut.areaMm2, 0)} mm², ${mm(q.cut.massG, 1)} g each`],
      ['cut per copy', `${mm(q.cut.toolPathMm, 0)} mm path, ${q.cut.pierces} pierces, ${minutes(q.time.totalMin)} min`],
    ],
    weaveDeg: q.cut.weaveDeg,
    plusX: plusXWord(part),
  };
}
