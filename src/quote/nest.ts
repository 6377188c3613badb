import { FillRule, difference, intersect, type Paths64 } from 'clipper2-ts';
import { partArea, type Part, type Transform } from '../geometry/index.js';
import { DesignError } from '../params/errors.js';
import { verifySheet } from './nestCheck.js';
import { bestLattice, clearOf, type Lattice, type LatticeSource, type NfpIndexCache } from './nestLattice.js';
import { NEST_SCALE, dilatedShape, filledGrownAreaMm2, noFitPolygon, occupiedAreaMm2, quarterTurn, ringArea2, ringBox, sameShape, turnPoint, type IBox, type NestShape } from './nestShapes.js';

export type SheetSize = Readonly<{ widthMm: number; heightMm: number }>;

export type NestOptions = Readonly<{
  sheet: SheetSize;
  /** Smallest distance between two parts (tool diameter + a margin). mm. */
  spacingMm: number;
  /** Clear border at each sheet edge. mm. */
  marginMm: number;
  /**
   * Turns from the weave-aligned position the shop allows, degrees, each 0, 90, 180 or 270 (default
   * all four). A part whose weave is not balanced (E1 ≠ E2) is never given a quarter turn: that would
   * swap its stiff and soft directions.
   */
  turnsDeg?: readonly number[];
  /** Stop trying further placement rules after this many milliseconds (needs `now`); every part is placed either way. */
  timeLimitMs?: number;
  /** Clock for the time limit, ms (the CLI passes one; the nesting itself reads no clock). */
  now?: () => number;
  /** Called as sheets are filled, for a progress bar: parts placed so far (estimated within a sheet) and all parts. */
  onProgress?: (placed: number, total: number) => void;
}>;

/** A part and how many copies to nest. */
export type NestItem = Readonly<{ part: Part; count: number }>;

export type Placement = Readonly<{
  /** Index into the items given to nestParts. */
  item: number;
  partName: string;
  copy: number;
  /** Part coordinates → sheet coordinates (sheet origin at its lower-left corner). */
  transform: Transform;
  rotationDeg: number;
}>;

export type NestedSheet = Readonly<{
  thicknessMm: number;
  material: string;
  widthMm: number;
  heightMm: number;
  placements: readonly Placement[];
  partAreaMm2: number;
  /** Part area / sheet area. */
  utilisation: number;
}>;

export type NestGroup = Readonly<{
  thicknessMm: number;
  material: string;
  sheets: number;
  partAreaMm2: number;
  /**
   * Sheets the parts' occupied areas fill (each part grown by half the spacing, minus its inner contours
   * shrunk by it where another part of the group could sit in them, over the usable area grown by half
   * the spacing): no layout can use fewer than its ceiling.
   */
  boundSheets: number;
  /** ceil(boundSheets): a true lower bound on the sheets, spacing and margins included. */
  lowerBoundSheets: number;
  utilisation: number;
  /** Smallest distance between two placed parts, measured on the exact lines and arcs. mm; null with no neighbours. */
  minGapMm: number | null;
  /** Placement rule of the first sheet's layout. */
  rule: string;
}>;

export type NestResult = Readonly<{
  sheets: readonly NestedSheet[];
  groups: readonly NestGroup[];
  spacingMm: number;
  marginMm: number;
  /** True when the time limit cut the search short (the layout is complete but may differ between runs). */
  timedOut: boolean;
}>;

/**
 * Nest copies of parts onto sheets by their true shapes. Each part is grown by half the spacing (exact
 * offset of its lines and arcs, then a polygon that contains it, within 0.01 mm), so two parts are at
 * least the spacing apart exactly when their grown shapes do not overlap. Sheets are filled one at a
 * time: a part goes to the best corner of the region where it fits, which is the usable area minus the
 * no-fit polygons of the parts already there (computed from convex pieces, holes in them being windows
 * of large parts where small ones fit). Several placement rules fill each sheet (among them, per kind
 * of part, its best lattice laid first: see nestLattice.ts) and the fullest sheet is kept; a sheet
 * whose situation repeats (many identical frames) is copied, not recomputed.
 * Rotations keep the weave on the sheet axes; parts of different thickness or material never share a
 * sheet. Every sheet is then checked on the exact geometry (spacing, margins, no overlap).
 * @throws DesignError naming `sheet` when the sheet has no usable area or a part does not fit an
 * empty sheet in any allowed rotation, or `turnsDeg` when no allowed turn keeps a part's weave.
 */
export function nestParts(items: readonly NestItem[], options: NestOptions): NestResult {
  const { widthMm: W, heightMm: H } = options.sheet;
  const s = options.spacingMm;
  const m = options.marginMm;
  if (!(Math.min(W, H) - 2 * m > 0)) {
    throw new DesignError([{ path: 'sheet', value: `${W}x${H}`, message: `leaves no room inside the ${m} mm sheet margin` }]);
  }
  const turns = allowedTurns(options.turnsDeg);
  const groups = new Map<string, number[]>();
  items.forEach((it, i) => {
    if (it.count <= 0) return;
    const key = groupKey(it.part);
    groups.set(key, [...(groups.get(key) ?? []), i]);
  });
  const total = items.reduce((a, it) => a + Math.max(0, it.count), 0);
  const clock: Clock = { now: options.now, deadline: options.timeLimitMs !== undefined && options.now ? options.now() + options.timeLimitMs : Infinity, timedOut: false };
  let placedBefore = 0;
  const sheets: NestedSheet[] = [];
  const summary: NestGroup[] = [];
  const usableArea = (W - 2 * m + s) * (H - 2 * m + s);
  for (const key of [...groups.keys()].sort()) {
    const members = groups.get(key)!;
    const g = prepareGroup(items, members, options, turns);
    const progress = (done: number) => options.onProgress?.(Math.min(total, placedBefore + done), total);
    const layout = fillGroup(g, clock, progress);
    // Every distinct sheet measured again on the exact geometry (a copied sheet shares its layout).
    let minGap: number | null = null;
    for (const placed of new Set(layout.map((sheet) => sheet.placed))) {
      const gap = verifySheet(placed.map((p) => ({ part: items[g.items[p.o.item]].part, transform: transformOf(g, p) })), { spacingMm: s, marginMm: m, widthMm: W, heightMm: H });
      if (gap !== null) minGap = minGap === null ? gap : Math.min(minGap, gap);
    }
    const copies = new Map<number, number>();
    let area = 0;
    let occupied = 0;
    const smallestGuest = Math.min(...members.map((i) => filledGrownAreaMm2(items[i].part, s / 2)));
    for (const i of members) occupied += items[i].count * occupiedAreaMm2(items[i].part, s / 2, smallestGuest);
    for (const sheet of layout) {
      const placements: Placement[] = sheet.placed.map((p) => {
        const item = g.items[p.o.item];
        const part = items[item].part;
        const copy = copies.get(item) ?? 0;
        copies.set(item, copy + 1);
        const transform = transformOf(g, p);
        return { item, partName: part.name, copy, transform, rotationDeg: normDeg((transform.rotateRad * 180) / Math.PI) };
      });
      const partAreaMm2 = placements.reduce((a, p) => a + g.areaMm2[g.items.indexOf(p.item)], 0);
      area += partAreaMm2;
      sheets.push({ thicknessMm: items[members[0]].part.thicknessMm, material: items[members[0]].part.material.name, widthMm: W, heightMm: H, placements, partAreaMm2, utilisation: partAreaMm2 / (W * H) });
    }
    placedBefore += members.reduce((a, i) => a + items[i].count, 0);
    const boundSheets = occupied / usableArea;
    summary.push({
      thicknessMm: items[members[0]].part.thicknessMm,
      material: items[members[0]].part.material.name,
      sheets: layout.length,
      partAreaMm2: area,
      boundSheets,
      lowerBoundSheets: Math.max(1, Math.ceil(boundSheets * (1 - 1e-9))),
      utilisation: area / (layout.length * W * H),
      minGapMm: minGap,
      rule: layout[0].rule,
    });
  }
  return { sheets, groups: summary, spacingMm: s, marginMm: m, timedOut: clock.timedOut };
}

type Clock = { now?: () => number; deadline: number; timedOut: boolean };

/** The quarter turns (0–3) the shop allows. */
function allowedTurns(turnsDeg: readonly number[] | undefined): number[] {
  const list = turnsDeg ?? [0, 90, 180, 270];
  const bad = list.find((d) => ![0, 90, 180, 270].includes(d));
  if (bad !== undefined || list.length === 0) {
    throw new DesignError([{ path: 'turnsDeg', value: bad ?? '[]', message: 'must list turns from 0, 90, 180, 270 degrees (at least one)' }]);
  }
  return [...new Set(list.map((d) => d / 90))].sort((a, b) => a - b);
}

/** Rotations that put the part's weave on the sheet axes: −weaveRad + k·90° for the allowed k. */
export function allowedRotations(part: Part, turnsDeg?: readonly number[]): number[] {
  return partTurns(part, allowedTurns(turnsDeg)).map((k) => -part.weaveRad + (k * Math.PI) / 2);
}

/** Allowed quarter turns for one part: all the shop allows for a balanced weave, the half turns otherwise. */
function partTurns(part: Part, turns: readonly number[]): number[] {
  const balanced = Math.abs(part.material.e1Gpa - part.material.e2Gpa) <= 1e-9 * Math.max(part.material.e1Gpa, part.material.e2Gpa);
  return turns.filter((k) => balanced || k % 2 === 0);
}

/** One allowed orientation of a group member, with the reference-point box where it stays on the sheet. */
type Orient = Readonly<{ item: number; turn: number; shape: NestShape; ifp: IBox | null }>;

type Group = Readonly<{
  /** Item indices (into the caller's items) of the group's members. */
  items: readonly number[];
  counts: readonly number[];
  areaMm2: readonly number[];
  /** Grown outline area, integer units², for the fill order. */
  sizeOrder: readonly number[];
  orients: readonly Orient[];
  orientsOf: readonly (readonly number[])[];
  /** Per member, the orientation each quarter turn (0–3) lands on (a turn that gives the same shape shares one), or -1 when not allowed. */
  turnOrient: readonly (readonly number[])[];
  /** Best lattice of each member on an empty sheet, computed when first asked for. */
  lattices: Map<number, Lattice | null>;
  /** Indexed no-fit polygons for checking lattice copies. */
  nfpIndex: NfpIndexCache;
  base: readonly NestShape[];
  nfps: Map<number, Paths64>;
  nfpBase: Map<string, Paths64>;
  weaveRad: readonly number[];
  names: readonly string[];
}>;

function prepareGroup(items: readonly NestItem[], members: readonly number[], options: NestOptions, turns: readonly number[]): Group {
  const { widthMm: W, heightMm: H } = options.sheet;
  const half = options.spacingMm / 2;
  const m = options.marginMm;
  // Grown shapes stay inside the usable area grown by half the spacing (the rounding allowance of the
  // shapes then keeps the parts a hair inside the margin).
  const lo = Math.ceil((m - half) * NEST_SCALE);
  const hiX = Math.floor((W - m + half) * NEST_SCALE);
  const hiY = Math.floor((H - m + half) * NEST_SCALE);
  const ifpOf = (b: IBox): IBox | null => {
    const box: IBox = [lo - b[0], lo - b[1], hiX - b[2], hiY - b[3]];
    // A part that fits with no play at all is treated as not fitting (a region without area).
    return box[0] < box[2] && box[1] < box[3] ? box : null;
  };
  const turnsOf = members.map((i) => {
    const t = partTurns(items[i].part, turns);
    if (!t.length) {
      throw new DesignError([{ path: 'turnsDeg', value: turns.map((k) => k * 90).join(', '), message: `allows only quarter turns, which would turn the unbalanced weave of ${items[i].part.name} across its stiff direction` }]);
    }
    return t;
  });
  // Solid shapes first: they tell which windows could hold a part at all.
  const solid = members.map((i) => dilatedShape(items[i].part, half, -items[i].part.weaveRad));
  const dims = solid.flatMap((sh, j) => turnsOf[j].map((k) => quarterTurn(sh, k).box)).map((b) => [b[2] - b[0], b[3] - b[1]] as const);
  const smallest = Math.min(...solid.map((sh) => ringArea2(sh.rings[0])));
  const holdsAPart = (ring: Paths64[number]): boolean => {
    const b = ringBox(ring);
    return -ringArea2(ring) >= smallest && dims.some(([w, h]) => w <= b[2] - b[0] && h <= b[3] - b[1]);
  };
  const base = members.map((i, j) => (items[i].part.features.length ? dilatedShape(items[i].part, half, -items[i].part.weaveRad, holdsAPart) : solid[j]));
  const orients: Orient[] = [];
  const orientsOf: number[][] = [];
  const turnOrient: number[][] = [];
  members.forEach((i, j) => {
    const mine: number[] = [];
    const byTurn = [-1, -1, -1, -1];
    for (const k of turnsOf[j]) {
      const shape = quarterTurn(base[j], k);
      const same = mine.find((o) => sameShape(orients[o].shape, shape));
      if (same !== undefined) {
        byTurn[k] = same;
        continue;
      }
      byTurn[k] = orients.length;
      mine.push(orients.length);
      orients.push({ item: j, turn: k, shape, ifp: ifpOf(shape.box) });
    }
    orientsOf.push(mine);
    turnOrient.push(byTurn);
    if (items[i].count > 0 && mine.every((o) => orients[o].ifp === null)) {
      throw new DesignError([{
        path: 'sheet',
        value: `${W}x${H}`,
        message: `is too small for part ${items[i].part.name} (with ${m} mm margins and ${options.spacingMm.toFixed(2)} mm spacing, in any rotation that keeps the weave aligned)`,
      }]);
    }
  });
  return {
    items: members,
    counts: members.map((i) => items[i].count),
    areaMm2: members.map((i) => partArea(items[i].part)),
    sizeOrder: solid.map((sh) => ringArea2(sh.rings[0])),
    orients,
    orientsOf,
    turnOrient,
    lattices: new Map(),
    nfpIndex: new Map(),
    base,
    nfps: new Map(),
    nfpBase: new Map(),
    weaveRad: members.map((i) => items[i].part.weaveRad),
    names: members.map((i) => items[i].part.name),
  };
}

/**
 * No-fit polygon of orientation b around orientation a (a at the origin). Turning both shapes by the
 * same quarter turn turns their no-fit polygon, so only the relative turn is computed, once.
 */
function nfpOf(g: Group, a: number, b: number): Paths64 {
  const key = a * g.orients.length + b;
  const hit = g.nfps.get(key);
  if (hit) return hit;
  const A = g.orients[a];
  const B = g.orients[b];
  const rel = (((B.turn - A.turn) % 4) + 4) % 4;
  const baseKey = `${A.item}|${B.item}|${rel}`;
  let base = g.nfpBase.get(baseKey);
  if (!base) {
    base = noFitPolygon(g.base[A.item], quarterTurn(g.base[B.item], rel));
    g.nfpBase.set(baseKey, base);
  }
  const turned = A.turn === 0 ? base : base.map((p) => p.map((v) => turnPoint(v, A.turn)));
  g.nfps.set(key, turned);
  return turned;
}

/** A placed copy: orientation and reference point in integer units. */
type Placed = Readonly<{ o: Orient; x: number; y: number }>;

function transformOf(g: Group, p: Placed): Transform {
  return { rotateRad: -g.weaveRad[p.o.item] + (p.o.turn * Math.PI) / 2, translate: [p.x / NEST_SCALE, p.y / NEST_SCALE] };
}

/** Lexicographic score of putting orientation o's reference point at (x, y): lower wins. */
type Score = (x: number, y: number, o: Orient, placedBox: IBox | null) => readonly [number, number, number];

/** A placement rule: the order parts are tried in and where each goes. */
type Strategy = Readonly<{
  name: string;
  /** Largest kinds of part first (by grown area), or the smallest first. */
  order: 'area' | 'smallest';
  score: Score;
  /** Score for every kind but the largest (default `score`): big plates in rows, small ones in a grid round them. */
  scoreSmall?: Score;
  /** Member whose best lattice is laid first (as many copies as are left), the rest then placed by the score. */
  lattice?: number;
}>;

const boxAt = (x: number, y: number, o: Orient): IBox => [x + o.shape.box[0], y + o.shape.box[1], x + o.shape.box[2], y + o.shape.box[3]];
const grownArea = (b: IBox | null, c: IBox): number => (b ? (Math.max(b[2], c[2]) - Math.min(b[0], c[0])) * (Math.max(b[3], c[3]) - Math.min(b[1], c[1])) : (c[2] - c[0]) * (c[3] - c[1]));

/**
 * Placement rules tried on every sheet (the fullest sheet wins). Greedy placement is myopic, so a few
 * rules beat any single one: bottom-left packs rows, left-bottom columns; "lowest top edge" keeps the
 * skyline flat; "compact" grows the occupied box least; diagonal fronts let interlocking parts step
 * into each other; the turn rules put copies one way round while they fit (a grid of small parts,
 * long parts in a band with the strip left over filled the other way). Each rule here won at least
 * one demo sheet on its own; rules that only ever tied were dropped to save time.
 */
const STRATEGIES: readonly Strategy[] = [
  { name: 'bottom-left', order: 'area', score: (x, y, o) => { const b = boxAt(x, y, o); return [0, b[1], b[0]]; } },
  { name: 'left-bottom', order: 'area', score: (x, y, o) => { const b = boxAt(x, y, o); return [0, b[0], b[1]]; } },
  { name: 'lowest top edge', order: 'area', score: (x, y, o) => { const b = boxAt(x, y, o); return [0, b[3], b[0]]; } },
  { name: 'leftmost right edge', order: 'area', score: (x, y, o) => { const b = boxAt(x, y, o); return [0, b[2], b[1]]; } },
  { name: 'compact', order: 'area', score: (x, y, o, pb) => { const b = boxAt(x, y, o); return [grownArea(pb, b), b[1], b[0]]; } },
  // Diagonal fronts: rows that step, so tapered parts lean into the ones before them.
  { name: 'diagonal, rows', order: 'area', score: (x, y, o) => { const b = boxAt(x, y, o); return [0, b[0] + 2 * b[1], b[1]]; } },
  { name: 'diagonal, columns', order: 'area', score: (x, y, o) => { const b = boxAt(x, y, o); return [0, 2 * b[0] + b[1], b[0]]; } },
  { name: 'quarter-turned first', order: 'area', score: (x, y, o) => { const b = boxAt(x, y, o); return [1 - (o.turn % 2), b[3], b[0]]; } },
  // One turn for every copy where it fits: many small identical parts then form a regular grid.
  ...[0, 1].map((k): Strategy => ({ name: `turn ${90 * k}° first, left-bottom`, order: 'area', score: (x, y, o) => { const b = boxAt(x, y, o); return [o.turn === k ? 0 : 1, b[0], b[1]]; } })),
  // Large parts bottom-left, the small ones each turned the same way into a grid in what is left.
  ...[0, 1].map((k): Strategy => ({
    name: `bottom-left, small parts turn ${90 * k}° first`,
    order: 'area',
    score: (x, y, o) => { const b = boxAt(x, y, o); return [0, b[1], b[0]]; },
    scoreSmall: (x, y, o) => { const b = boxAt(x, y, o); return [o.turn === k ? 0 : 1, b[1], b[0]]; },
  })),
  // Smallest parts first: a last sheet of mixed leftovers packs the many small ones in a grid.
  ...[0, 1].map((k): Strategy => ({ name: `smallest first, turn ${90 * k}° first`, order: 'smallest', score: (x, y, o) => { const b = boxAt(x, y, o); return [o.turn === k ? 0 : 1, b[0], b[1]]; } })),
];

/** What one rule did on one sheet, enough to tell when the same situation comes back. */
type Fill = Readonly<{ placed: Placed[]; used: number[]; exhausted: boolean[]; areaMm2: number; box: IBox | null; rule: string }>;

type SheetLayout = Readonly<{ placed: Placed[]; rule: string }>;

/** Fill sheets until every copy is placed. */
function fillGroup(g: Group, clock: Clock, progress: (done: number) => void): SheetLayout[] {
  // One more rule per kind of part: its best lattice first, the rest bottom-left round it.
  const lattices = g.items.map((_, t): Strategy => ({ name: `lattice of ${g.names[t]}, then bottom-left`, order: 'area', score: STRATEGIES[0].score, lattice: t }));
  return fillSheets(g, g.counts, [...STRATEGIES, ...lattices], clock, progress);
}

/** The best lattice of member t on an empty sheet (cached per group). */
function latticeOf(g: Group, t: number): Lattice | null {
  if (!g.lattices.has(t)) {
    const half = (oi: number): number | null => {
      const o = g.orients[oi];
      const twin = g.turnOrient[t][(o.turn + 2) % 4];
      return twin >= 0 ? twin : null;
    };
    g.lattices.set(t, bestLattice(latticeSource(g), { orients: g.orientsOf[t].filter((oi) => g.orients[oi].ifp), halfTurn: half, box: (oi) => g.orients[oi].shape.box }));
  }
  return g.lattices.get(t)!;
}

const latticeSource = (g: Group): LatticeSource => ({ ifp: (oi) => g.orients[oi].ifp, nfp: (a, b) => nfpOf(g, a, b) });

/** Fill sheets one after the other with the best of the rules; a sheet whose situation repeats is copied. */
function fillSheets(g: Group, counts: readonly number[], rules: readonly Strategy[], clock: Clock, progress: (done: number) => void): SheetLayout[] {
  const remaining = [...counts];
  const memo: Array<{ tries: Fill[]; best: Fill }> = [];
  const out: SheetLayout[] = [];
  let done = 0;
  while (remaining.some((c) => c > 0)) {
    const known = memo.find((r) => r.tries.every((f) => f.used.every((u, t) => (f.exhausted[t] ? remaining[t] === u : remaining[t] >= u))));
    let best: Fill;
    if (known) best = known.best;
    else {
      const tries: Fill[] = [];
      for (const strategy of rules) {
        // A lattice rule is tried while its kind has copies left for at least half its lattice (with
        // fewer, any rule fits them and the lattice only costs time).
        if (strategy.lattice !== undefined && 2 * remaining[strategy.lattice] < (latticeOf(g, strategy.lattice)?.points.length ?? Infinity)) continue;
        if (tries.length && clock.now && clock.now() > clock.deadline) {
          clock.timedOut = true;
          break;
        }
        tries.push(fillSheet(g, remaining, strategy));
        const so = Math.max(...tries.map((f) => f.used.reduce((a, b) => a + b, 0)));
        progress(done + Math.floor((so * tries.length) / rules.length));
      }
      best = tries.reduce((a, b) => (better(b, a) ? b : a));
      memo.push({ tries, best });
    }
    if (!best.placed.length) throw new Error('nesting: an empty sheet took no part');
    best.used.forEach((u, t) => (remaining[t] -= u));
    done += best.used.reduce((a, b) => a + b, 0);
    out.push({ placed: best.placed, rule: best.rule });
    progress(done);
  }
  return out;
}

/** More part area on the sheet wins; then the smaller occupied box (a larger offcut). */
function better(a: Fill, b: Fill): boolean {
  if (Math.abs(a.areaMm2 - b.areaMm2) > 1e-6) return a.areaMm2 > b.areaMm2;
  const area = (x: IBox | null) => (x ? (x[2] - x[0]) * (x[3] - x[1]) : 0);
  return area(a.box) < area(b.box);
}

/**
 * Where one orientation's reference point may still go: the usable box minus the no-fit polygons of
 * the parts placed, kept in square tiles so that a new part only touches the few tiles near it.
 */
type FreeRegion = { tiles: Array<{ box: IBox; paths: Paths64 }>; seen: number };

function freeRegion(o: Orient): FreeRegion | null {
  const b = o.ifp;
  if (!b) return null;
  // Tiles about twice the part: a no-fit polygon with a like-sized part then meets at most four.
  const size = 2 * Math.max(o.shape.box[2] - o.shape.box[0], o.shape.box[3] - o.shape.box[1]);
  const nx = Math.max(1, Math.min(16, Math.round((b[2] - b[0]) / size)));
  const ny = Math.max(1, Math.min(16, Math.round((b[3] - b[1]) / size)));
  const tiles: FreeRegion['tiles'] = [];
  for (let i = 0; i < nx; i++) {
    for (let j = 0; j < ny; j++) {
      const box: IBox = [b[0] + Math.floor(((b[2] - b[0]) * i) / nx), b[1] + Math.floor(((b[3] - b[1]) * j) / ny), b[0] + Math.floor(((b[2] - b[0]) * (i + 1)) / nx), b[1] + Math.floor(((b[3] - b[1]) * (j + 1)) / ny)];
      if (box[0] < box[2] && box[1] < box[3]) tiles.push({ box, paths: [rect(box)] });
    }
  }
  return { tiles, seen: 0 };
}

/**
 * Place as much as fits on one empty sheet with one rule. Parts placed since an orientation was last
 * looked at are subtracted from its free region in one go, tile by tile, when it is next needed.
 */
function fillSheet(g: Group, counts: readonly number[], strategy: Strategy): Fill {
  const n = g.items.length;
  const remaining = [...counts];
  const used = new Array<number>(n).fill(0);
  const full = new Array<boolean>(n).fill(false);
  const free = g.orients.map(freeRegion);
  const key = (t: number) =>
    strategy.order === 'area' ? g.sizeOrder[t] : -g.sizeOrder[t];
  const order = [...Array(n).keys()].sort((a, b) => key(b) - key(a) || a - b);
  const largest = [...Array(n).keys()].reduce((a, b) => (g.sizeOrder[b] > g.sizeOrder[a] ? b : a), 0);
  const placed: Array<Placed & { oi: number }> = [];
  const catchUp = (oj: number): FreeRegion | null => {
    const F = free[oj];
    if (!F || F.seen === placed.length) return F;
    const clips = F.tiles.map((): Paths64 => []);
    for (let k = F.seen; k < placed.length; k++) {
      const p = placed[k];
      const nb = nfpBox(g, p.oi, oj);
      const x0 = nb[0] + p.x;
      const y0 = nb[1] + p.y;
      const x1 = nb[2] + p.x;
      const y1 = nb[3] + p.y;
      let moved: Paths64 | null = null;
      F.tiles.forEach((t, i) => {
        if (x0 >= t.box[2] || x1 <= t.box[0] || y0 >= t.box[3] || y1 <= t.box[1]) return;
        moved ??= nfpOf(g, p.oi, oj).map((ring) => ring.map((v) => ({ x: v.x + p.x, y: v.y + p.y })));
        // Only the part of the no-fit polygon over this tile matters. (clipper2's rectClip was faster but
        // dropped pieces when a tile's corner fell on a no-fit polygon's vertex: rows of half-turned
        // triangles then overlapped.)
        clips[i].push(...intersect(moved, [rect([t.box[0] - 1, t.box[1] - 1, t.box[2] + 1, t.box[3] + 1])], FillRule.NonZero));
      });
    }
    F.seen = placed.length;
    F.tiles = F.tiles.flatMap((t, i) => {
      if (!clips[i].length) return [t];
      const paths = difference(t.paths, clips[i], FillRule.NonZero);
      return paths.length ? [{ box: pathsBox(paths), paths }] : [];
    });
    if (!F.tiles.length) free[oj] = null;
    return free[oj];
  };
  let box: IBox | null = null;
  let areaMm2 = 0;
  const put = (t: number, oi: number, x: number, y: number) => {
    const o = g.orients[oi];
    placed.push({ o, oi, x, y });
    remaining[t]--;
    used[t]++;
    areaMm2 += g.areaMm2[t];
    const b = boxAt(x, y, o);
    box = box ? [Math.min(box[0], b[0]), Math.min(box[1], b[1]), Math.max(box[2], b[2]), Math.max(box[3], b[3])] : b;
  };
  if (strategy.lattice !== undefined) {
    const t = strategy.lattice;
    const src = latticeSource(g);
    for (const p of latticeOf(g, t)?.points ?? []) {
      if (remaining[t] <= 0) break;
      // Each copy checked on the exact integer no-fit polygons against those already placed.
      if (placed.every((q) => clearOf(src, g.nfpIndex, q, p))) put(t, p.oi, p.x, p.y);
    }
  }
  for (;;) {
    const t = order.find((k) => remaining[k] > 0 && !full[k]);
    if (t === undefined) break;
    let best: { o: number; x: number; y: number; sc: readonly number[] } | null = null;
    const score = t === largest ? strategy.score : (strategy.scoreSmall ?? strategy.score);
    for (const oi of g.orientsOf[t]) {
      const F = catchUp(oi);
      if (!F) continue;
      const o = g.orients[oi];
      for (const tile of F.tiles) {
        for (const path of tile.paths) {
          for (const v of path) {
            const sc = score(v.x, v.y, o, box);
            if (!best || sc[0] < best.sc[0] || (sc[0] === best.sc[0] && (sc[1] < best.sc[1] || (sc[1] === best.sc[1] && sc[2] < best.sc[2])))) best = { o: oi, x: v.x, y: v.y, sc };
          }
        }
      }
    }
    if (!best) {
      full[t] = true;
      continue;
    }
    put(t, best.o, best.x, best.y);
  }
  return { placed: placed.map(({ o, x, y }) => ({ o, x, y })), used, exhausted: used.map((u, t) => u === counts[t]), areaMm2, box, rule: strategy.name };
}

const nfpBoxes = new WeakMap<Paths64, IBox>();
function nfpBox(g: Group, a: number, b: number): IBox {
  const p = nfpOf(g, a, b);
  let box = nfpBoxes.get(p);
  if (!box) {
    box = pathsBox(p);
    nfpBoxes.set(p, box);
  }
  return box;
}

function pathsBox(ps: Paths64): IBox {
  let b: [number, number, number, number] = [Infinity, Infinity, -Infinity, -Infinity];
  for (const p of ps) {
    const r = ringBox(p);
    b = [Math.min(b[0], r[0]), Math.min(b[1], r[1]), Math.max(b[2], r[2]), Math.max(b[3], r[3])];
  }
  return b;
}

const rect = (b: IBox) => [{ x: b[0], y: b[1] }, { x: b[2], y: b[1] }, { x: b[2], y: b[3] }, { x: b[0], y: b[3] }];

const groupKey = (p: Part): string => `${p.thicknessMm.toFixed(3).padStart(8, '0')}|${p.material.name}`;

const normDeg = (d: number): number => {
  const r = Math.round(d * 1e6) / 1e6;
  return ((r % 360) + 360) % 360;
};
