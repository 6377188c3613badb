import type { Frame } from '../geometry/frame.js';
import { partArea, partCutLength } from '../geometry/metrics.js';
import type { Part } from '../geometry/part.js';
import type { Vec2 } from '../geometry/types.js';
import { bitReachRule } from './bitReach.js';
import { loopChords } from './chords.js';
import { r4 } from './finding.js';
import { boltHoles, holeEdgeRule, holeStressRule } from './holes.js';
import { optionsForDesign, type CheckOptions } from './options.js';
import { indexPart } from './partIndex.js';
import { cameraViewRule, propClearanceRule, propDiscs } from './props.js';
import { buildAssembly } from '../assembly/build.js';
import type { Assembly } from '../assembly/types.js';
import { batteryFitRule, cameraFitRule, motorScrewRule, stackFitRule } from './componentFit.js';
import { armRootFootprintRule, interferenceRule } from './fit.js';
import { assemblyPrisms, type Prism } from './solids.js';
import type { CheckReport, Finding, PartMetrics, Severity } from './types.js';
import { webLimitMm, webRule } from './webs.js';
import { weaveRule } from './weave.js';

/**
 * Necks and gaps wider than this many times the larger of the web warning level and the tool
 * diameter are not searched for (they can break no rule); `minWebMm` counts necks up to there.
 */
const CHORD_SEARCH_FACTOR = 3;

/** Everything the part rules found about one part. */
export type PartCheck = Readonly<{ metrics: PartMetrics; findings: readonly Finding[] }>;

/** Run the part-level rules (webs, hole edges, bit reach, weave, hole stress) on one part. Pure. */
export function checkPart(part: Part, o: CheckOptions): PartCheck {
  const ix = indexPart(part);
  const warnWeb = webLimitMm(o, part.thicknessMm) * o.limits['web-width'].warnFactor;
  const chords = loopChords(ix, CHORD_SEARCH_FACTOR * Math.max(warnWeb, o.toolDiameterMm));
  const webs = webRule(ix, o, chords);
  const holes = boltHoles(ix);
  const edge = holeEdgeRule(ix, o, holes);
  const findings = [...webs.findings, ...edge.findings, ...holeStressRule(ix, o, holes), ...bitReachRule(ix, o, chords), ...weaveRule(part, o)];
  // The outline's box is the part's (every inner contour lies inside it), already computed by the index.
  const bb = ix.contours[0].bbox;
  const num = (x: number | null): number | null => (x === null ? null : r4(x));
  return {
    findings,
    metrics: {
      name: part.name,
      thicknessMm: part.thicknessMm,
      contours: 1 + part.features.length,
      holes: part.features.length,
      areaMm2: r4(partArea(part)),
      cutLengthMm: r4(partCutLength(part)),
      bboxMm: [r4(bb[0]), r4(bb[1]), r4(bb[2]), r4(bb[3])],
      metrics: {
        minWebMm: num(webs.metrics.minWebMm),
        minHoleEdgeWebMm: num(webs.metrics.minHoleEdgeWebMm),
        minHoleHoleWebMm: num(webs.metrics.minHoleHoleWebMm),
        minEdgeRatio: num(edge.minEdgeRatio),
      },
    },
  };
}

const SEVERITY_ORDER: Record<Severity, number> = { error: 0, warning: 1, info: 2 };

/** Code-unit order: the same on every machine, unlike locale collation. */
const cmp = (a: string, b: string): number => (a < b ? -1 : a > b ? 1 : 0);

/**
 * Findings of one rule closer than this on one part (or the frame) are one finding: the same neck
 * or hole seen by several segment pairs or chords. mm.
 */
export const MERGE_DISTANCE_MM = 1;

/** Rules whose measured value grows with the problem (the others measure a width, ratio or clearance). */
const HIGHER_IS_WORSE: ReadonlySet<string> = new Set(['camera-view', 'hole-stress']);

/** How bad a finding is, for choosing which of several at one place to keep: lower is worse. */
function badness(f: Finding): [number, number] {
  const m = f.measured ?? 0;
  return [SEVERITY_ORDER[f.severity], HIGHER_IS_WORSE.has(f.rule) ? -m : m];
}

/**
 * One finding per rule and place: of the findings of one rule on one part lying within
 * MERGE_DISTANCE_MM of each other, the worst is kept (most severe, then furthest past its limit);
 * findings without a place are kept once per message. Any two kept findings of one rule and part are
 * at least MERGE_DISTANCE_MM apart. Uses a 1 mm grid, so it stays linear in the finding count.
 */
export function mergeFindings(findings: readonly Finding[]): Finding[] {
  // Badness as two numbers per finding and an index sort (thousands of findings on a drilled plate:
  // no key arrays, no per-finding strings). Ties keep the findings' order.
  const n = findings.length;
  const sev = new Float64Array(n);
  const past = new Float64Array(n);
  findings.forEach((f, i) => {
    const [a, b] = badness(f);
    sev[i] = a;
    past[i] = b;
  });
  const order = Array.from({ length: n }, (_, i) => i).sort((x, y) => sev[x] - sev[y] || past[x] - past[y] || x - y);
  // Per part, then per rule, kept places by grid cell (a number key).
  const groups = new Map<string, Map<string, Map<number, Vec2[]>>>();
  const seenMessages = new Map<string, Map<string, Set<string>>>();
  const kept = new Uint8Array(n);
  // A hashed 32-bit cell key (a small integer, where an exact key above 2^31 made every Map entry a
  // boxed number): two cells that share a key only add candidates, and the distance test decides.
  const cellKey = (i: number, j: number): number => Math.imul(i | 0, 73856093) ^ Math.imul(j | 0, 19349663);
  const inner = <V>(outer: Map<string, Map<string, V>>, part: string, rule: string, make: () => V): V => {
    let byRule = outer.get(part);
    if (!byRule) outer.set(part, (byRule = new Map()));
    let v = byRule.get(rule);
    if (v === undefined) byRule.set(rule, (v = make()));
    return v;
  };
  for (const k of order) {
    const f = findings[k];
    if (!f.atMm) {
      const messages = inner(seenMessages, f.part, f.rule, () => new Set<string>());
      if (!messages.has(f.message)) kept[k] = 1;
      messages.add(f.message);
      continue;
    }
    const cells = inner(groups, f.part, f.rule, () => new Map<number, Vec2[]>());
    const [x, y] = f.atMm;
    const i = Math.floor(x / MERGE_DISTANCE_MM);
    const j = Math.floor(y / MERGE_DISTANCE_MM);
    let near = false;
    for (let di = -1; di <= 1 && !near; di++) {
      for (let dj = -1; dj <= 1 && !near; dj++) {
        const list = cells.get(cellKey(i + di, j + dj));
        if (!list) continue;
        for (const g of list) {
          if (Math.hypot(g[0] - x, g[1] - y) < MERGE_DISTANCE_MM) {
            near = true;
            break;
          }
        }
      }
    }
    if (near) continue;
    kept[k] = 1;
    const key = cellKey(i, j);
    const list = cells.get(key);
    if (list) list.push(f.atMm);
    else cells.set(key, [f.atMm]);
  }
  return findings.filter((_, k) => kept[k] === 1);
}

/**
 * Assemble a report: findings merged (one per rule and place, `mergeFindings`) in a stable order
 * (part order, then severity, rule, position).
 */
export function makeReport(parts: readonly PartMetrics[], findings: readonly Finding[]): CheckReport {
  const order = new Map(parts.map((p, i) => [p.name, i]));
  // Sort keys computed once per finding (thousands of findings on a drilled plate).
  const keyed = mergeFindings(findings).map((f) => ({ f, part: order.get(f.part) ?? parts.length, sev: SEVERITY_ORDER[f.severity], x: f.atMm?.[0] ?? 0, y: f.atMm?.[1] ?? 0 }));
  keyed.sort((a, b) => a.part - b.part || a.sev - b.sev || cmp(a.f.rule, b.f.rule) || a.x - b.x || a.y - b.y || cmp(a.f.message, b.f.message));
  const sorted = keyed.map((k) => k.f);
  return {
    units: 'mm',
    parts,
    findings: sorted,
    summary: { errors: sorted.filter((f) => f.severity === 'error').length, warnings: sorted.filter((f) => f.severity === 'warning').length },
  };
}

/**
 * Part-level rules for every part (framewright's own or imported from DXF). Parts without members
 * (e.g. role 'imported') skip the weave rule. Pure: no files, no clock.
 * @example checkParts(parts, checkOptions({ toolDiameterMm: 3.175 })).summary.errors
 */
export function checkParts(parts: readonly Part[], options: CheckOptions): CheckReport {
  const results = parts.map((p) => checkPart(p, options));
  return makeReport(results.map((r) => r.metrics), results.flatMap((r) => r.findings));
}

/**
 * Part results kept between checks of the same design as it is edited (the live page): a part whose
 * geometry and options are unchanged is not checked again. Keyed by the part and options as JSON.
 */
export type PartCheckCache = Map<string, PartCheck>;

/** Entries a cache keeps: a frame has a handful of distinct parts, a few edits' worth is plenty. */
const CACHE_ENTRIES = 64;

function checkPartCached(part: Part, o: CheckOptions, cache: PartCheckCache | undefined): PartCheck {
  if (!cache) return checkPart(part, o);
  const key = JSON.stringify([part, o]);
  const hit = cache.get(key);
  if (hit) return hit;
  const result = checkPart(part, o);
  if (cache.size >= CACHE_ENTRIES) cache.delete(cache.keys().next().value as string);
  cache.set(key, result);
  return result;
}

/**
 * Every rule for a built frame: the part rules for each distinct part plus the frame rules on the
 * assembled frame (prop tip gaps and prop discs against every solid, props in the camera view,
 * interference, stack, camera and battery fit, motor screws). The assembly is built when not given. Options default from the design's `checks` section, its cutting tool
 * and props.minTipGapMm. `cache` (optional) reuses the part results of earlier calls for parts that
 * have not changed; the report is the same with or without it.
 * @example const report = checkFrame(buildFrame(design)); if (report.summary.errors) ...
 */
export function checkFrame(frame: Frame, options: Partial<CheckOptions> = {}, assembly: Assembly = buildAssembly(frame.design, frame), cache?: PartCheckCache): CheckReport {
  const o = optionsForDesign(frame.design, options);
  const results = frame.parts.map((p) => checkPartCached(p, o, cache));
  const discs = propDiscs(frame);
  const prisms = assemblyPrisms(assembly);
  const frameFindings = [...propClearanceRule(frame, o, discs, assembly, prisms), ...cameraViewRule(frame, o, discs), ...fitFindings(frame, assembly, o, prisms)];
  return makeReport(results.map((r) => r.metrics), [...results.flatMap((r) => r.findings), ...frameFindings]);
}

/**
 * The fit rules on the assembled frame (interference, stack, camera, battery, motor screws), sharing
 * one set of prisms.
 */
export function fitFindings(frame: Frame, a: Assembly, o: CheckOptions, prisms: readonly Prism[] = assemblyPrisms(a)): Finding[] {
  return [
    ...interferenceRule(a, o, prisms),
    ...armRootFootprintRule(a, o, prisms),
    ...stackFitRule(a, o, prisms),
    ...cameraFitRule(a, o, prisms),
    ...batteryFitRule(a, o, frame.design.topPlate.strapSlots.slotWidthMm),
    ...motorScrewRule(a, o),
  ];
}
