import { performance } from 'node:perf_hooks';
import { frameAnnotation } from '../checks/annotate.js';
import { propDiscs, tipGaps } from '../checks/props.js';
import { checkFrame, type PartCheckCache } from '../checks/report.js';
import { CHECK_CAUTIONS } from '../checks/text.js';
import type { CheckReport, Severity } from '../checks/types.js';
import { buildAssembly } from '../assembly/build.js';
import { massBalance } from '../assembly/balance.js';
import { hardwareList } from '../assembly/hardware.js';
import type { Assembly, HardwareItem } from '../assembly/types.js';
import { buildFrame, type Frame } from '../geometry/frame.js';
import { wheelbaseOf } from '../geometry/layout.js';
import { partArea, partBBox, partMassG } from '../geometry/metrics.js';
import { validateDesign, type Design } from '../params/design.js';
import { DesignError } from '../params/errors.js';
import { parseYamlText } from '../params/yamlInput.js';
import { designForm, type FormSection, type SchemaNode } from './form.js';
import { findingTargets, partView, planView, sideView, type FindingTarget, type SvgView } from './views.js';

/** What the live page shows, as plain JSON. Lengths mm, masses g. */

export type Problem = Readonly<{ path: string; message: string; value: string }>;

export type PartInfo = Readonly<{
  name: string;
  role: string;
  quantity: number;
  thicknessMm: number;
  material: string;
  massG: number;
  areaMm2: number;
  sizeMm: readonly [number, number];
  holes: number;
  errors: number;
  warnings: number;
}>;

export type FindingRow = Readonly<{
  id: number;
  rule: string;
  severity: Severity;
  part: string;
  message: string;
  measured: number | null;
  limit: number | null;
  unit: string;
  targets: readonly FindingTarget[];
}>;

export type TipGapRow = Readonly<{ between: string; gapMm: number; minMm: number }>;

export type Figures = Readonly<{
  /** Every plate copy of one frame. g. */
  plateMassG: number;
  tipGaps: readonly TipGapRow[];
  wheelbaseMm: number;
  propDiameterMm: number;
  /** Mass by group and all up. g. */
  massG: Readonly<{ frame: number; hardware: number; motors: number; components: number; battery: number; allUp: number }>;
  /** Centre of gravity, all up, frame axes. mm. */
  cgMm: readonly [number, number, number];
  /** Plan distance from the motors' centroid (thrust centre) to the CG, and that over the mean motor distance. */
  cgOffsetMm: number;
  cgOffsetShare: number;
  /** Heights of the stack-up. mm. */
  propPlaneMm: number;
  hardware: readonly HardwareItem[];
}>;

export type Views = Readonly<{ plan: SvgView; side: SvgView | null; parts: ReadonlyArray<Readonly<{ name: string; view: SvgView }>> }>;

export type LiveModel = Readonly<{
  /** Increases with every change of the model (edit here, or the file changed on disk). */
  version: number;
  file: string;
  name: string;
  revision: string;
  /** 'invalid': the file as it stands cannot be built; `problems` says why and the pictures are the last good ones. */
  state: 'ok' | 'invalid';
  problems: readonly Problem[];
  form: readonly FormSection[];
  views: Views | null;
  parts: readonly PartInfo[];
  findings: readonly FindingRow[];
  summary: Readonly<{ errors: number; warnings: number; notes: number }>;
  figures: Figures | null;
  cautions: readonly string[];
  /** Time to rebuild and re-check, ms (shown on the page; not part of any file). */
  buildMs: number;
}>;

/** A design text evaluated: the model parts that follow from it, and the frame when it could be built. */
export type Evaluation = Readonly<{
  raw: unknown;
  problems: readonly Problem[];
  design: Design | null;
  frame: Frame | null;
  assembly: Assembly | null;
  report: CheckReport | null;
}>;

const shown = (v: unknown): string => (v === undefined ? '(missing)' : JSON.stringify(v) ?? String(v));

/** Design errors as problems the page can put next to fields; anything else is a defect, reported as one. */
export function problemsOf(e: unknown): Problem[] {
  if (e instanceof DesignError) return e.issues.map((i) => ({ path: i.path, message: i.message, value: shown(i.value) }));
  return [{ path: '', message: `internal error while building (please report it with the design file): ${(e as Error)?.message ?? String(e)}`, value: '' }];
}

/**
 * Parse, validate, build and check design text. Never throws: what goes wrong becomes problems.
 * `cache` keeps the checks of parts an edit did not change.
 */
export function evaluate(text: string, sourceName: string, cache?: PartCheckCache): Evaluation {
  let raw: unknown = {};
  try {
    raw = parseYamlText(text, sourceName);
    const design = validateDesign(raw);
    const frame = buildFrame(design);
    const assembly = buildAssembly(design, frame);
    return { raw, problems: [], design, frame, assembly, report: checkFrame(frame, {}, assembly, cache) };
  } catch (e) {
    return { raw, problems: problemsOf(e), design: null, frame: null, assembly: null, report: null };
  }
}

const round = (x: number, d = 2): number => Math.round(x * 10 ** d) / 10 ** d;

function partInfos(frame: Frame, report: CheckReport): PartInfo[] {
  return frame.parts.map((p) => {
    const b = partBBox(p);
    const mine = report.findings.filter((f) => f.part === p.name);
    return {
      name: p.name,
      role: p.role,
      quantity: p.quantity,
      thicknessMm: p.thicknessMm,
      material: p.material.name,
      massG: round(partMassG(p)),
      areaMm2: round(partArea(p), 1),
      sizeMm: [round(b[2] - b[0], 1), round(b[3] - b[1], 1)],
      holes: p.features.filter((f) => f.kind === 'hole').length,
      errors: mine.filter((f) => f.severity === 'error').length,
      warnings: mine.filter((f) => f.severity === 'warning').length,
    };
  });
}

function figures(frame: Frame, a: Assembly): Figures {
  const discs = propDiscs(frame);
  // Adjacent pairs: as many of the smallest gaps as there are props (the ring round the frame).
  const gaps = tipGaps(discs).slice(0, discs.length);
  const mb = massBalance(a);
  const m = mb.massG;
  return {
    plateMassG: round(m.frame),
    tipGaps: gaps.map((g) => ({ between: `${g.a} / ${g.b}`, gapMm: round(g.gapMm), minMm: frame.design.props.minTipGapMm })),
    wheelbaseMm: round(wheelbaseOf(frame.sites), 1),
    propDiameterMm: round(frame.propDiameterMm, 1),
    massG: { frame: round(m.frame, 1), hardware: round(m.hardware, 1), motors: round(m.motors, 1), components: round(m.components, 1), battery: round(m.battery, 1), allUp: round(m.allUp, 1) },
    cgMm: [round(mb.cgMm[0], 1), round(mb.cgMm[1], 1), round(mb.cgMm[2], 1)],
    cgOffsetMm: round(mb.cgOffsetMm, 1),
    cgOffsetShare: round(mb.cgOffsetShare, 4),
    propPlaneMm: round(a.stackUp.propPlaneMm, 1),
    hardware: hardwareList(a, frame.design).items,
  };
}

/** Everything the page draws for a built frame: pictures, parts, findings with their places, figures. */
export function frameViews(frame: Frame, assembly: Assembly, report: CheckReport): Pick<LiveModel, 'views' | 'parts' | 'findings' | 'summary' | 'figures'> {
  const a = frameAnnotation(frame, report);
  return {
    views: { plan: planView(frame, a), side: sideView(assembly), parts: frame.parts.map((p) => ({ name: p.name, view: partView(p) })) },
    parts: partInfos(frame, report),
    findings: report.findings.map((f, id) => ({ id, rule: f.rule, severity: f.severity, part: f.part, message: f.message, measured: f.measured, limit: f.limit, unit: f.unit, targets: findingTargets(frame, f) })),
    summary: { errors: report.summary.errors, warnings: report.summary.warnings, notes: report.findings.filter((f) => f.severity === 'info').length },
    figures: figures(frame, assembly),
  };
}

/**
 * The page's model for design text. When the text cannot be built, the pictures, parts and findings
 * of `previous` (the last good model) are kept and marked invalid, so the page keeps its context.
 */
export function liveModel(text: string, o: Readonly<{ version: number; file: string; schema: SchemaNode; previous: LiveModel | null; cache?: PartCheckCache }>): { model: LiveModel; evaluation: Evaluation } {
  const t0 = performance.now();
  const ev = evaluate(text, o.file, o.cache);
  const base = {
    version: o.version,
    file: o.file,
    form: designForm(o.schema, ev.raw),
    cautions: CHECK_CAUTIONS,
  };
  if (!ev.frame || !ev.report || !ev.design || !ev.assembly) {
    const prev = o.previous;
    const rec = (ev.raw ?? {}) as Record<string, unknown>;
    const model: LiveModel = {
      ...base,
      name: typeof rec.name === 'string' ? rec.name : (prev?.name ?? ''),
      revision: typeof rec.revision === 'string' ? rec.revision : (prev?.revision ?? ''),
      state: 'invalid',
      problems: ev.problems,
      views: prev?.views ?? null,
      parts: prev?.parts ?? [],
      findings: prev?.findings ?? [],
      summary: prev?.summary ?? { errors: 0, warnings: 0, notes: 0 },
      figures: prev?.figures ?? null,
      buildMs: round(performance.now() - t0, 1),
    };
    return { model, evaluation: ev };
  }
  const model: LiveModel = {
    ...base,
    name: ev.design.name,
    revision: ev.design.revision,
    state: 'ok',
    problems: [],
    ...frameViews(ev.frame, ev.assembly, ev.report),
    buildMs: round(performance.now() - t0, 1),
  };
  return { model, evaluation: ev };
}


