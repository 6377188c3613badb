import type { ModesSummary } from '../modesSummary.js';
import type { FindingRow, LiveModel, Problem } from '../model.js';
import type { VariantPreview } from '../routes.js';
import type { FieldEdit } from '../session.js';
import { getJson, postEdits } from './api.js';
import { byId, fill, h, num } from './dom.js';
import { FormView } from './form.js';
import { PartTip, Viewer } from './views.js';

/**
 * The live page: renders the model the server embedded (before the load event), sends each field
 * edit at once and redraws from the answer, and follows the server's change events (the file
 * edited elsewhere). Every control is a native input, button or link, so the page works from the
 * keyboard; f fits the pictures, Esc discards unsaved edits and clears the selection, / filters.
 */

let model: LiveModel = JSON.parse((byId('initial-model') as HTMLScriptElement).textContent ?? '{}') as LiveModel;
/** Edits the server refused as invalid: kept (and re-sent with the next edit) until fixed or discarded. */
const pending = new Map<string, string | null>();
let selected: number | null = null;
let inFlight = false;
let queued = false;

const app = byId('app');
const status = h('span', { id: 'status', role: 'status', 'aria-live': 'polite' });
const counts = h('span', { id: 'counts' });
const banner = h('pre', { id: 'banner', class: 'banner', role: 'alert', hidden: true });
const fileProblems = h('div', { id: 'file-problems', class: 'banner', role: 'alert', hidden: true });
const formRoot = h('form', { id: 'form', 'aria-label': 'design parameters', onsubmit: (e: Event) => e.preventDefault() });
const plan = new Viewer('plan', 'plan view of the assembled frame, front up');
const side = new Viewer('side', 'side view of the assembled frame, front to the right');
const partViewers = new Map<string, Viewer>();
const partsRoot = h('div', { id: 'parts', class: 'parts' });
const findingsRoot = h('ol', { id: 'findings', class: 'findings' });
const figuresRoot = h('div', { id: 'figures' });
const modesRoot = h('div', { id: 'modes' });
const variantRoot = h('div', { id: 'variant-result' });
const downloadsRoot = h('div', { id: 'downloads' });
const keyFigures = h('figure', { id: 'key-figures', class: 'key-figures', 'aria-label': 'key figures' });
const tipEl = h('div', { id: 'tooltip', role: 'tooltip', hidden: true });
const tip = new PartTip(tipEl);

const form = new FormView(formRoot, banner, (path, text) => edit(path, text));

function layout(): void {
  const header = h(
    'header',
    {},
    h('h1', {}, h('span', { id: 'design-name' }), h('span', { id: 'file-name', class: 'file' })),
    counts,
    status,
    h('button', { type: 'button', id: 'fit', title: 'fit every picture (f)', onclick: fitAll }, 'Fit'),
    h('span', { class: 'keys' }, 'f fit · Esc discard / clear · / filter · wheel or + − zoom'),
  );
  const figPlan = h('figure', { class: 'frame-view' }, h('figcaption', {}, 'Plan — front up'), plan.svg);
  const figSide = h('figure', { class: 'frame-view', id: 'side-figure' }, h('figcaption', {}, 'Side — front to the right'), side.svg);
  const modeButton = h('button', { type: 'button', id: 'modes-button', onclick: loadModes }, 'Compute frame modes');
  const variantInput = h('input', { id: 'variant-props', type: 'text', value: '7in', size: 6, 'aria-label': 'prop size for the variant', spellcheck: 'false' });
  const variantMotor = h('select', { id: 'variant-motor', 'aria-label': 'motor for the variant' }, h('option', { value: 'keep' }, 'keep motor'), h('option', { value: 'auto' }, 'motor for the props'));
  const variantButton = h('button', { type: 'button', id: 'variant-button', onclick: () => loadVariant(variantInput.value, variantMotor.value) }, 'Preview');
  variantInput.addEventListener('keydown', (e) => {
    if (e.key === 'Enter') loadVariant(variantInput.value, variantMotor.value);
  });
  fill(
    app,
    header,
    fileProblems,
    h(
      'main',
      {},
      h('aside', { id: 'form-pane', 'aria-label': 'parameters' }, h('h2', {}, 'Parameters'), banner, formRoot),
      h('section', { id: 'views-pane', 'aria-label': 'pictures' }, h('div', { class: 'frame-views' }, figPlan, h('div', { class: 'side-column' }, figSide, keyFigures)), h('h2', {}, 'Parts'), partsRoot),
      h(
        'aside',
        { id: 'info-pane', 'aria-label': 'findings and figures' },
        tabs([
          ['findings', 'Findings', [findingsRoot]],
          ['figures', 'Figures', [figuresRoot]],
          ['modes', 'Modes', [h('p', { class: 'note' }, "The assembled frame's lowest natural modes, on request (a few seconds)."), modeButton, modesRoot]],
          ['variant', 'Variant', [h('p', { class: 'note' }, 'The same frame for another prop size: what `framewright variant` would change.'), h('div', { class: 'row' }, variantInput, variantMotor, variantButton), variantRoot]],
          ['downloads', 'Files', [downloadsRoot, h('h3', {}, 'Cautions'), h('ul', { id: 'cautions', class: 'cautions' })]],
        ]),
      ),
    ),
    tipEl,
  );
  tip.attach(app);
}

/**
 * Tabs for the right-hand pane (WAI-ARIA tab pattern): the arrow keys move between tabs, each
 * panel is reachable by Tab. Returns the tab list followed by the panels.
 */
function tabs(items: ReadonlyArray<[id: string, label: string, content: Node[]]>): DocumentFragment {
  const list = h('div', { role: 'tablist', class: 'tabs', 'aria-label': 'findings, figures and files' });
  const panels: HTMLElement[] = [];
  const buttons: HTMLButtonElement[] = [];
  const show = (i: number, focus: boolean): void => {
    buttons.forEach((b, k) => {
      b.setAttribute('aria-selected', k === i ? 'true' : 'false');
      b.tabIndex = k === i ? 0 : -1;
      panels[k].hidden = k !== i;
    });
    if (focus) buttons[i].focus();
  };
  items.forEach(([id, label, content], i) => {
    const b = h('button', { type: 'button', role: 'tab', id: `tab-${id}`, 'aria-controls': `panel-${id}`, onclick: () => show(i, false) }, label);
    b.addEventListener('keydown', (e) => {
      const step = e.key === 'ArrowRight' ? 1 : e.key === 'ArrowLeft' ? -1 : 0;
      if (step) {
        e.preventDefault();
        show((i + step + items.length) % items.length, true);
      }
    });
    buttons.push(b);
    list.append(b);
    panels.push(h('section', { role: 'tabpanel', id: `panel-${id}`, 'aria-labelledby': `tab-${id}` }, ...content));
  });
  show(0, false);
  const frag = document.createDocumentFragment();
  frag.append(list, ...panels);
  return frag;
}

function render(m: LiveModel, force = false): void {
  model = m;
  byId('design-name').textContent = `${m.name || '(unnamed)'}${m.revision ? ` rev ${m.revision}` : ''}`;
  byId('file-name').textContent = m.file;
  document.title = `${m.name || m.file} — framewright live`;
  fill(counts, h('span', { class: m.summary.errors ? 'count error' : 'count' }, `${m.summary.errors} errors`), ' ', h('span', { class: 'count warning' }, `${m.summary.warnings} warnings`), ' ', h('span', { class: 'count info' }, `${m.summary.notes} notes`));
  if (m.state === 'invalid') {
    fileProblems.hidden = false;
    fileProblems.textContent = `The design file has ${m.problems.length === 1 ? 'a problem' : `${m.problems.length} problems`}; the pictures show the last design that built.\n${m.problems.map((p) => `${p.path || 'design'}: ${p.value !== '(missing)' ? `${p.value} ` : ''}${p.message}`).join('\n')}`;
  } else {
    fileProblems.hidden = true;
  }
  form.render(m.form, pending, force);
  if (pending.size === 0 && m.state === 'invalid') form.showProblems(m.problems);
  if (m.views) {
    plan.show(m.views.plan);
    byId('side-figure').hidden = !m.views.side;
    if (m.views.side) side.show(m.views.side);
    renderParts(m);
  }
  tip.setParts(m.parts);
  renderFindings(m);
  const tab = document.getElementById('tab-findings');
  if (tab) tab.textContent = `Findings (${m.findings.length})`;
  renderFigures(m);
  renderDownloads(m);
  fill(byId('cautions'), ...m.cautions.map((c) => h('li', {}, c)));
}

function renderParts(m: LiveModel): void {
  const names = m.views?.parts.map((p) => p.name) ?? [];
  if (names.join('|') !== [...partViewers.keys()].join('|')) {
    partViewers.clear();
    fill(
      partsRoot,
      ...names.map((name) => {
        const v = new Viewer(`part:${name}`, `part ${name}`);
        partViewers.set(name, v);
        const info = h('figcaption', { 'data-part': name });
        const card = h('figure', { class: 'part-card', 'data-part': name, tabindex: '-1' }, info, v.svg);
        v.svg.setAttribute('data-part', name);
        v.svg.addEventListener('focus', () => {
          const r = v.svg.getBoundingClientRect();
          tip.showFor(name, r.left, r.bottom);
        });
        v.svg.addEventListener('blur', () => tip.hide());
        return card;
      }),
    );
  }
  for (const p of m.views?.parts ?? []) partViewers.get(p.name)?.show(p.view);
  for (const info of m.parts) {
    const cap = partsRoot.querySelector(`figcaption[data-part="${CSS.escape(info.name)}"]`);
    if (cap) fill(cap, h('strong', {}, info.name), ` ×${info.quantity} · ${num(info.thicknessMm, 1)} mm · ${num(info.massG, 1)} g`, info.errors ? h('span', { class: 'count error' }, ` ${info.errors} E`) : null, info.warnings ? h('span', { class: 'count warning' }, ` ${info.warnings} W`) : null);
  }
  drawMarkers();
}

function drawMarkers(): void {
  const findings = model.findings;
  const byView = new Map<string, Array<{ f: FindingRow; at: readonly [number, number] }>>();
  for (const f of findings) {
    f.targets.forEach((t) => {
      // Part findings show on every copy in plan view only while selected; frame findings always.
      const isPlanCopy = t.view === 'plan' && f.part !== 'frame';
      if (isPlanCopy && f.id !== selected) return;
      const list = byView.get(t.view) ?? [];
      list.push({ f, at: t.at });
      byView.set(t.view, list);
    });
  }
  plan.markFindings(byView.get('plan') ?? [], selected, select);
  side.markFindings(byView.get('side') ?? [], selected, select);
  for (const [name, v] of partViewers) v.markFindings(byView.get(`part:${name}`) ?? [], selected, select);
}

function renderFindings(m: LiveModel): void {
  if (m.findings.length === 0) {
    fill(findingsRoot, h('li', { class: 'none' }, 'No findings: every rule passes.'));
    return;
  }
  fill(
    findingsRoot,
    ...m.findings.map((f) =>
      h(
        'li',
        { class: `finding sev-${f.severity}${f.id === selected ? ' selected' : ''}`, 'data-finding': String(f.id) },
        h(
          'button',
          { type: 'button', 'aria-pressed': f.id === selected ? 'true' : 'false', onclick: () => select(f.id), disabled: f.targets.length === 0 },
          h('span', { class: 'n' }, String(f.id + 1)),
          h('span', { class: 'sev' }, f.severity),
          h('span', { class: 'where' }, `${f.part} · ${f.rule}`),
          h('span', { class: 'msg' }, f.message),
        ),
      ),
    ),
  );
}

/** Select a finding: zoom every picture that shows it, mark it, and bring its part into view. */
function select(id: number): void {
  const f = model.findings.find((x) => x.id === id);
  if (!f) return;
  selected = id;
  for (const li of findingsRoot.querySelectorAll('li.finding')) {
    const on = li.getAttribute('data-finding') === String(id);
    li.classList.toggle('selected', on);
    li.querySelector('button')?.setAttribute('aria-pressed', on ? 'true' : 'false');
    if (on) li.scrollIntoView({ block: 'nearest' });
  }
  drawMarkers();
  highlightPart(f.part === 'frame' ? null : f.part);
  const planTarget = f.targets.find((t) => t.view === 'plan');
  if (planTarget) plan.zoomToFinding(planTarget.at);
  const sideTarget = f.targets.find((t) => t.view === 'side');
  if (sideTarget) side.zoomToFinding(sideTarget.at);
  const partTarget = f.targets.find((t) => t.view.startsWith('part:'));
  if (partTarget) {
    const v = partViewers.get(partTarget.view.slice('part:'.length));
    v?.zoomToFinding(partTarget.at);
    v?.svg.closest('figure')?.scrollIntoView({ block: 'nearest', inline: 'nearest' });
  }
}

/** In plan view, the part a finding is about stands out (it may lie under other plates). */
function highlightPart(name: string | null): void {
  for (const el of plan.svg.querySelectorAll('.plate')) el.classList.toggle('dim', name !== null && el.getAttribute('data-part') !== name);
}

function fitAll(): void {
  plan.fit();
  side.fit();
  for (const v of partViewers.values()) v.fit();
}

/** The few numbers a designer watches while moving a parameter, beside the pictures. */
function renderKeyFigures(m: LiveModel): void {
  const fg = m.figures;
  if (!fg) return fill(keyFigures);
  const minGap = Math.min(...fg.tipGaps.map((t) => t.gapMm));
  const item = (label: string, value: string, bad = false): HTMLElement => h('div', { class: `key${bad ? ' bad' : ''}` }, h('span', { class: 'k' }, label), h('span', { class: 'v' }, value));
  fill(
    keyFigures,
    item('all up', `${num(fg.massG.allUp, 0)} g`),
    item('plates', `${num(fg.massG.frame, 1)} g`),
    item('CG off thrust centre', `${num(fg.cgOffsetMm, 1)} mm`),
    item('CG height', `${num(fg.cgMm[2], 1)} mm`),
    item('wheelbase', `${num(fg.wheelbaseMm, 1)} mm`),
    item('smallest tip gap', `${num(minGap, 1)} mm`, minGap < (fg.tipGaps[0]?.minMm ?? 0)),
    item('errors', String(m.summary.errors), m.summary.errors > 0),
    item('warnings', String(m.summary.warnings)),
  );
}

function renderFigures(m: LiveModel): void {
  renderKeyFigures(m);
  const fg = m.figures;
  if (!fg) {
    fill(figuresRoot, h('p', { class: 'note' }, 'No figures until the design builds.'));
    return;
  }
  const table = (id: string, rows: Array<[string, string]>): HTMLTableElement =>
    h('table', { class: 'figures', id }, h('tbody', {}, ...rows.map(([k, v]) => h('tr', {}, h('th', { scope: 'row' }, k), h('td', {}, v)))));
  const g = fg.massG;
  fill(
    figuresRoot,
    h('h3', {}, 'Mass and balance'),
    table('mass', [
      ['all up', `${num(g.allUp, 1)} g`],
      ['plates', `${num(g.frame, 1)} g`],
      ['hardware', `${num(g.hardware, 1)} g`],
      ['motors', `${num(g.motors, 1)} g`],
      ['components', `${num(g.components, 1)} g`],
      ['battery', `${num(g.battery, 1)} g`],
      ['centre of gravity x, y, z', `${num(fg.cgMm[0], 1)}, ${num(fg.cgMm[1], 1)}, ${num(fg.cgMm[2], 1)} mm`],
      ['CG from thrust centre (plan)', `${num(fg.cgOffsetMm, 1)} mm (${num(fg.cgOffsetShare * 100, 1)} % of motor distance)`],
    ]),
    h('h3', {}, 'Layout'),
    table('layout-figures', [
      ['wheelbase', `${num(fg.wheelbaseMm, 1)} mm`],
      ['props', `${num(fg.propDiameterMm, 1)} mm`],
      ['prop plane', `${num(fg.propPlaneMm, 1)} mm above the bottom plate's underside`],
    ]),
    h('h3', {}, 'Tip gaps'),
    h(
      'table',
      { class: 'figures', id: 'tip-gaps' },
      h('thead', {}, h('tr', {}, h('th', {}, 'props'), h('th', {}, 'gap mm'), h('th', {}, 'min mm'))),
      h('tbody', {}, ...fg.tipGaps.map((t) => h('tr', { class: t.gapMm < t.minMm ? 'bad' : '' }, h('td', {}, t.between), h('td', {}, num(t.gapMm, 1)), h('td', {}, num(t.minMm, 1))))),
    ),
    h('h3', {}, 'Hardware, one frame'),
    h(
      'table',
      { class: 'figures', id: 'hardware' },
      h('thead', {}, h('tr', {}, h('th', {}, 'n'), h('th', {}, 'item'), h('th', {}, 'size'), h('th', {}, 'use'))),
      h('tbody', {}, ...fg.hardware.map((it) => h('tr', { title: it.standard === 'none' ? '' : it.standard }, h('td', {}, String(it.count)), h('td', {}, it.item), h('td', {}, `${it.size}${it.lengthMm !== null ? ` × ${num(it.lengthMm, 0)}` : ''}`), h('td', {}, it.use)))),
    ),
  );
}

function renderDownloads(m: LiveModel): void {
  const qty = h('input', { id: 'quote-qty', type: 'number', min: 1, max: 1000, step: 1, value: 1, 'aria-label': 'frames to quote' });
  const drawing = h('a', { href: '/download/drawing.pdf?qty=1', id: 'download-drawing' }, 'quote drawing (PDF)');
  qty.addEventListener('input', () => drawing.setAttribute('href', `/download/drawing.pdf?qty=${encodeURIComponent(qty.value)}`));
  fill(
    downloadsRoot,
    h('p', {}, h('a', { href: '/download/design' }, 'design file'), ' · ', h('a', { href: '/download/cut-files.zip', id: 'download-all' }, 'all cut files and views (ZIP)')),
    h('p', {}, drawing, ' for ', qty, ' frames'),
    h('ul', { class: 'cut-files' }, ...m.parts.map((p) => h('li', {}, `${p.name}: `, h('a', { href: `/download/part/${encodeURIComponent(p.name)}.dxf` }, 'DXF'), ' ', h('a', { href: `/download/part/${encodeURIComponent(p.name)}.svg` }, 'SVG')))),
    m.summary.errors ? h('p', { class: 'note' }, 'The checks find errors: the cut files say so inside.') : null,
  );
}

async function loadModes(): Promise<void> {
  const version = model.version;
  fill(modesRoot, h('p', { class: 'note' }, 'Computing…'));
  try {
    const r = await getJson<ModesSummary>('/api/modes');
    const motion = (x: { displacementRatio: number; rotationDegPerMm: number } | null): string => (x ? `${num(x.displacementRatio * 100, 0)} %, ${num(x.rotationDegPerMm, 3)}°/mm` : '–');
    fill(
      modesRoot,
      h(
        'table',
        { class: 'figures modes', id: 'modes-table' },
        h('thead', {}, h('tr', {}, h('th', {}, 'Hz'), h('th', {}, 'shape'), h('th', { title: 'flight controller: share of the largest motion, tilt per mm' }, 'FC moves'))),
        h('tbody', {}, ...r.modes.map((x) => h('tr', { class: x.inRotationBand ? 'bad' : '', title: `camera: ${motion(x.camera)}` }, h('td', {}, num(x.frequencyHz, 0)), h('td', {}, x.name), h('td', {}, motion(x.flightController))))),
      ),
      h('p', { class: 'note' }, `${r.rotationBand ? `Motor rotation ${num(r.rotationBand.lowHz, 0)}–${num(r.rotationBand.highHz, 0)} Hz (${r.rotationBand.source}); modes inside it in red. ` : ''}${r.dof} degrees of freedom, ${num(r.massG, 0)} g. ${r.cautions}${r.version !== model.version || version !== model.version ? ' The design changed since: compute again.' : ''}`),
    );
  } catch (e) {
    fill(modesRoot, h('p', { class: 'error' }, (e as Error).message));
  }
}

async function loadVariant(props: string, motor: string): Promise<void> {
  fill(variantRoot, h('p', { class: 'note' }, 'Working…'));
  try {
    const v = await getJson<VariantPreview>(`/api/variant?props=${encodeURIComponent(props)}${motor === 'auto' ? '&motor=auto' : ''}`);
    const viewer = new Viewer('variant', `plan view of the ${v.props} variant`);
    viewer.show(v.plan);
    fill(
      variantRoot,
      h('p', {}, `${v.name}: wheelbase ${num(v.sourceWheelbaseMm, 1)} → ${num(v.wheelbaseMm, 1)} mm, plates ${num(v.sourceMassG, 1)} → ${num(v.massG, 1)} g; checks: ${v.checks}.`),
      viewer.svg,
      h('table', { class: 'figures changes' }, h('thead', {}, h('tr', {}, h('th', {}, 'parameter'), h('th', {}, 'old'), h('th', {}, 'new'))), h('tbody', {}, ...v.changes.map((c) => h('tr', { title: c.why }, h('td', {}, c.path), h('td', {}, c.old), h('td', {}, c.new))))),
      h('p', { class: 'note' }, 'A preview only; `framewright variant` writes the design file.'),
    );
  } catch (e) {
    fill(variantRoot, h('p', { class: 'error' }, (e as Error).message));
  }
}

function setStatus(text: string, kind: 'ok' | 'busy' | 'error' = 'ok'): void {
  status.textContent = text;
  status.className = kind;
}

/** Send a field's new text together with the edits still pending; redraw from the answer. */
function edit(path: string, text: string | null): void {
  pending.set(path, text);
  void flush();
}

async function flush(): Promise<void> {
  if (inFlight) {
    queued = true;
    return;
  }
  inFlight = true;
  const edits: FieldEdit[] = [...pending].map(([path, text]) => (text === null ? { path, remove: true } : { path, text }));
  const t0 = performance.now();
  setStatus('rebuilding…', 'busy');
  try {
    const answer = await postEdits(edits);
    if (answer.kind === 'saved') {
      for (const e of edits) if (pending.get(e.path) === (e.remove ? null : e.text)) pending.delete(e.path);
      form.clearProblems();
      render(answer.model);
      setStatus(`saved · rebuilt and checked in ${num(answer.model.buildMs, 0)} ms, redrawn in ${num(performance.now() - t0, 0)} ms`);
    } else if (answer.kind === 'invalid') {
      render(model);
      form.showProblems(answer.problems);
      setStatus(`not saved: ${describe(answer.problems)} (Esc discards)`, 'error');
    } else {
      pending.delete(answer.path);
      form.showProblems([{ path: answer.path, message: answer.message, value: '' }]);
      setStatus(`refused: ${answer.message}`, 'error');
    }
  } catch (e) {
    setStatus(`cannot reach the server: ${(e as Error).message}`, 'error');
  } finally {
    inFlight = false;
    if (queued) {
      queued = false;
      void flush();
    }
  }
}

const describe = (ps: readonly Problem[]): string => (ps.length === 1 ? `${ps[0].path || 'design'} ${ps[0].message}` : `${ps.length} problems`);

function discard(): void {
  if (pending.size) {
    pending.clear();
    form.clearProblems();
    render(model, true);
    setStatus('unsaved edits discarded');
  }
  if (selected !== null) {
    selected = null;
    highlightPart(null);
    drawMarkers();
    renderFindings(model);
    fitAll();
  }
}

/** Follow the server: a newer model (the file edited elsewhere, or another page) replaces this one. */
function follow(): void {
  const events = new EventSource('/api/events');
  events.addEventListener('model', (e) => {
    const { version } = JSON.parse((e as MessageEvent<string>).data) as { version: number };
    if (version <= model.version) return;
    void getJson<LiveModel>('/api/model').then((m) => {
      if (m.version <= model.version) return;
      pending.clear();
      form.clearProblems();
      render(m, true);
      setStatus(`reloaded: the file changed (version ${m.version})`);
    });
  });
}

document.addEventListener('keydown', (e) => {
  const typing = e.target instanceof HTMLInputElement || e.target instanceof HTMLSelectElement || e.target instanceof HTMLTextAreaElement;
  if (e.key === 'Escape') discard();
  else if (!typing && e.key === 'f') fitAll();
  else if (!typing && e.key === '/') {
    e.preventDefault();
    form.focusFilter();
  }
});

layout();
render(model);
setStatus(model.state === 'ok' ? `built and checked in ${num(model.buildMs, 0)} ms` : 'the design file has problems', model.state === 'ok' ? 'ok' : 'error');
follow();
