import type { ServerResponse } from 'node:http';
import { Worker } from 'node:worker_threads';
import { checkFrame } from '../checks/report.js';
import { buildGate, summaryLine } from '../checks/text.js';
import { partToDxf } from '../export/dxf.js';
import { partToSvg } from '../export/svgPart.js';
import { frameAnnotation } from '../checks/annotate.js';
import type { ShopProfile } from '../params/shop.js';
import { DesignError } from '../params/errors.js';
import { VariantRequestError } from '../variant/errors.js';
import { hardwareList } from '../assembly/hardware.js';
import { drawingFonts } from '../cli/fonts.js';
import { packagePath } from '../cli/packageRoot.js';
import type { ModesSummary } from './modesSummary.js';
import { errorBody, send, sendJson, type Handler } from './server.js';
import type { LiveSession } from './session.js';
import { planView, type SvgView } from './views.js';

/** File-name-safe text: letters, digits, dot, hyphen. */
const safeName = (s: string): string => s.toLowerCase().replace(/[^a-z0-9.]+/g, '-').replace(/^-+|-+$/g, '') || 'frame';

function attachment(res: ServerResponse, type: string, name: string, body: string | Uint8Array): void {
  send(res, 200, type, body, { 'Content-Disposition': `attachment; filename="${safeName(name)}"` });
}

/** The built frame and its report, or a 409 answer when the design as it stands cannot be built. */
function builtOr409(session: LiveSession, res: ServerResponse) {
  const ev = session.evaluation;
  if (!ev.frame || !ev.report || !ev.design) {
    sendJson(res, 409, errorBody(`the design has problems (${ev.problems[0]?.path || 'file'}: ${ev.problems[0]?.message ?? ''}); fix them first`, ev.problems[0]?.path ?? ''));
    return null;
  }
  return { frame: ev.frame, report: ev.report, design: ev.design };
}

/** A whole number from a query parameter within a range, or null. */
function intParam(url: URL, name: string, min: number, max: number, fallback: number): number | null {
  const t = url.searchParams.get(name);
  if (t === null || t === '') return fallback;
  if (!/^\d+$/.test(t)) return null;
  const n = Number(t);
  return n >= min && n <= max ? n : null;
}

export type VariantPreview = Readonly<{
  props: string;
  name: string;
  plan: SvgView;
  wheelbaseMm: number;
  sourceWheelbaseMm: number;
  massG: number;
  sourceMassG: number;
  checks: string;
  errors: number;
  changes: ReadonlyArray<Readonly<{ path: string; old: string; new: string; why: string }>>;
}>;

const text = (v: unknown): string => (v === undefined ? '(absent)' : typeof v === 'string' ? v : JSON.stringify(v));

/** Run the modes in a worker thread (seconds of work), one at a time, cached by model version. */
function modesRunner(session: LiveSession) {
  let cached: ModesSummary | null = null;
  let running: Promise<ModesSummary> | null = null;
  return (): Promise<ModesSummary> => {
    const version = session.version;
    if (cached && cached.version === version) return Promise.resolve(cached);
    if (running) return running;
    running = new Promise<ModesSummary>((resolve, reject) => {
      const worker = new Worker(packagePath('dist', 'live', 'modesWorker.js'), { workerData: { text: session.text, version } });
      worker.once('message', (m: { ok: boolean; summary?: ModesSummary; message?: string }) => {
        if (m.ok && m.summary) resolve(m.summary);
        else reject(new Error(m.message ?? 'the modes could not be computed'));
        void worker.terminate();
      });
      worker.once('error', reject);
    }).then(
      (s) => {
        running = null;
        cached = s;
        return s;
      },
      (e: unknown) => {
        running = null;
        throw e;
      },
    );
    return running;
  };
}

/**
 * The live page's on-request routes: cut files and the design, the quote drawing, a variant preview
 * and the frame's modes. All read the session; none writes a file.
 */
export function liveRoutes(session: LiveSession, shop: ShopProfile): { routes: Record<string, Handler>; prefixRoutes: Record<string, Handler> } {
  const modes = modesRunner(session);
  const routes: Record<string, Handler> = {
    '/download/design': (_url, res) => attachment(res, 'application/yaml; charset=utf-8', session.label.split(/[\\/]/).pop() ?? 'design.yaml', session.text),
    '/download/drawing.pdf': async (url, res) => {
      const built = builtOr409(session, res);
      if (!built) return;
      const quantity = intParam(url, 'qty', 1, 1000, 1);
      if (quantity === null) return sendJson(res, 400, errorBody('qty must be a whole number of frames from 1 to 1000', 'qty'));
      // Quoting, nesting and the PDF writer load on the first download, not at start-up.
      const [{ quoteParts }, { quotePackage }] = await Promise.all([import('../quote/quote.js'), import('../export/quotePackage.js')]);
      try {
        const quote = quoteParts(built.frame.parts, { quantity, shop, toolDiameterMm: shop.toolDiameterMm ?? built.design.cutting.toolDiameterMm });
        const assembly = session.evaluation.assembly!;
        const checks = checkFrame(built.frame, { toolDiameterMm: quote.toolDiameterMm }, assembly).summary;
        const pkg = await quotePackage(built.frame.parts, quote, { design: built.design.name, revision: built.design.revision, date: null, checks, hardware: hardwareList(assembly, built.design), fonts: drawingFonts() });
        const pdf = pkg.files.find((f) => f.name === 'drawing.pdf')!;
        attachment(res, 'application/pdf', `${built.design.name}-drawing.pdf`, pdf.data);
      } catch (e) {
        if (e instanceof DesignError) return sendJson(res, 422, errorBody(e.message, e.issues[0]?.path ?? ''));
        throw e;
      }
    },
    // Every file `framewright build` writes (cut files, overview, side and front views, hardware, assembly), zipped.
    '/download/cut-files.zip': async (_url, res) => {
      const built = builtOr409(session, res);
      if (!built) return;
      const [{ buildOutputs }, { assemblyOutputs }, { zipStore }] = await Promise.all([import('../cli/commands/build.js'), import('../cli/commands/assemblyFiles.js'), import('../export/zip.js')]);
      const comment = buildGate(built.report, true).comment;
      const { files } = await buildOutputs(built.frame, '', {}, comment);
      const assembly = session.evaluation.assembly!;
      files.push(...assemblyOutputs(built.frame, assembly, built.report, '').files);
      attachment(res, 'application/zip', `${built.design.name}-cut-files.zip`, zipStore(files.map((f) => ({ name: f.path, data: f.data }))));
    },
    '/api/modes': async (_url, res) => {
      if (!builtOr409(session, res)) return;
      try {
        sendJson(res, 200, await modes());
      } catch (e) {
        sendJson(res, 422, errorBody((e as Error).message));
      }
    },
    '/api/variant': async (url, res) => {
      const built = builtOr409(session, res);
      if (!built) return;
      const props = (url.searchParams.get('props') ?? '').trim();
      const motor = url.searchParams.get('motor') === 'auto' ? 'auto' : 'keep';
      if (props === '' || props.length > 20) return sendJson(res, 400, errorBody('give a prop size with a unit, e.g. 7in', 'props'));
      const [{ makeVariant }, { pathText }, { VariantRefusal }] = await Promise.all([import('../variant/variant.js'), import('../variant/changes.js'), import('../variant/errors.js')]);
      try {
        const v = makeVariant(session.text, { props, motor }, session.label);
        const report = v.report;
        const preview: VariantPreview = {
          props,
          name: v.design.name,
          plan: planView(v.frame, frameAnnotation(v.frame, report)),
          wheelbaseMm: Math.round(v.wheelbase.chosenMm * 10) / 10,
          sourceWheelbaseMm: Math.round(v.wheelbase.sourceMm * 10) / 10,
          massG: Math.round(v.massG * 10) / 10,
          sourceMassG: Math.round(v.sourceMassG * 10) / 10,
          checks: summaryLine(report),
          errors: report.summary.errors,
          changes: v.changes.map((c) => ({ path: pathText(c.path), old: text(c.old), new: text(c.new), why: c.why })),
        };
        sendJson(res, 200, preview);
      } catch (e) {
        if (e instanceof VariantRequestError) return sendJson(res, 422, errorBody(e.message, e.option));
        if (e instanceof VariantRefusal) return sendJson(res, 422, errorBody(`no ${e.props} variant passes every check: ${e.constraint}. Nearest valid alternative: ${e.alternative}`, 'props'));
        if (e instanceof DesignError) return sendJson(res, 422, errorBody(e.message, e.issues[0]?.path ?? ''));
        throw e;
      }
    },
  };
  const prefixRoutes: Record<string, Handler> = {
    '/download/part/': (url, res) => {
      const built = builtOr409(session, res);
      if (!built) return;
      const m = /^\/download\/part\/(.+)\.(dxf|svg)$/.exec(decodeURIComponent(url.pathname));
      const part = m ? built.frame.parts.find((p) => p.name === m[1]) : undefined;
      if (!m || !part) return send(res, 404, 'text/plain; charset=utf-8', 'no such part\n');
      // Cut files of a design with check errors say so inside, as `build --force` does.
      const comment = buildGate(built.report, true).comment;
      if (m[2] === 'dxf') return attachment(res, 'application/dxf', `${part.name}.dxf`, partToDxf(part, comment ? { comment } : {}));
      return attachment(res, 'image/svg+xml', `${part.name}.svg`, partToSvg(part, comment ? { comment } : {}));
    },
  };
  return { routes, prefixRoutes };
}
