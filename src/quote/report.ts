import type { Quote } from './quote.js';

const r4 = (x: number): number => Math.round(x * 1e4) / 1e4;

/**
 * The quote as plain JSON data for scripts (`framewright quote --json`): every number in the
 * drawing and the summary, lengths in mm, times in min, money in the shop's currency.
 */
export function quoteReport(q: Quote, meta: Readonly<{ design: string; revision: string; date: string | null; checks: { errors: number; warnings: number } | null }>) {
  return {
    units: { length: 'mm', area: 'mm2', mass: 'g', time: 'min', currency: q.currency },
    design: meta.design,
    revision: meta.revision,
    date: meta.date,
    frames: q.frames,
    shop: q.shopName,
    toolDiameterMm: q.toolDiameterMm,
    checks: meta.checks,
    parts: q.parts.map((p) => ({
      name: p.cut.name,
      perFrame: p.cut.quantity,
      total: p.cut.quantity * q.frames,
      thicknessMm: p.cut.thicknessMm,
      material: p.cut.material,
      weaveDeg: r4(p.cut.weaveDeg),
      areaMm2: r4(p.cut.areaMm2),
      massG: r4(p.cut.massG),
      drawnLengthMm: r4(p.cut.drawnLengthMm),
      toolPathMm: r4(p.cut.toolPathMm),
      passes: p.time.passes,
      pierces: p.cut.pierces,
      profiled: p.cut.profiled,
      drilled: p.cut.drilled,
      tooNarrow: p.cut.tooNarrow,
      plunges: p.time.plunges,
      holes: p.cut.holes,
      timeMin: { cut: r4(p.time.cutMin), plunge: r4(p.time.plungeMin), rapid: r4(p.time.rapidMin), allowance: r4(p.time.allowanceMin), total: r4(p.time.totalMin) },
      costEach: { machine: r4(p.cost.machine), material: r4(p.cost.material), tooling: r4(p.cost.tooling), total: r4(p.cost.total) },
    })),
    nesting: {
      spacingMm: r4(q.nesting.spacingMm),
      marginMm: q.nesting.marginMm,
      timedOut: q.nesting.timedOut,
      groups: q.nesting.groups.map((g) => ({
        thicknessMm: g.thicknessMm,
        material: g.material,
        sheets: g.sheets,
        lowerBoundSheets: g.lowerBoundSheets,
        boundSheets: r4(g.boundSheets),
        utilisation: r4(g.utilisation),
        partAreaMm2: r4(g.partAreaMm2),
        minGapMm: g.minGapMm === null ? null : r4(g.minGapMm),
        rule: g.rule,
      })),
      sheets: q.nesting.sheets.map((s, i) => ({
        index: i + 1,
        thicknessMm: s.thicknessMm,
        material: s.material,
        sizeMm: [s.widthMm, s.heightMm],
        parts: s.placements.length,
        utilisation: r4(s.utilisation),
        placements: s.placements.map((p) => ({ part: p.partName, copy: p.copy + 1, rotationDeg: r4(p.rotationDeg), translateMm: [r4(p.transform.translate[0]), r4(p.transform.translate[1])] })),
      })),
    },
    sheetCosts: q.sheetCosts.map((c) => ({ ...c, pricePerSheet: r4(c.pricePerSheet), cost: r4(c.cost) })),
    batch: {
      toolChanges: q.toolChanges,
      timeMin: Object.fromEntries(Object.entries(q.batchTime).map(([k, v]) => [k, r4(v)])),
      cost: Object.fromEntries(Object.entries(q.batchCost).map(([k, v]) => [k, r4(v)])),
    },
    perFrame: {
      timeMin: r4(q.perFrame.timeMin),
      cost: r4(q.perFrame.cost),
      massG: r4(q.perFrame.massG),
      breakdown: Object.fromEntries(Object.entries(q.perFrame.breakdown).map(([k, v]) => [k, r4(v)])),
    },
    warnings: q.warnings,
  };
}
