import { watch, type FSWatcher } from 'node:fs';
import { basename, dirname } from 'node:path';
import type { PartCheckCache } from '../checks/report.js';
import { readText, writeAllAtomically } from '../cli/io.js';
import { editDesignText, type Change } from '../variant/changes.js';
import { FieldTextError, schemaAt, valueFromText, type SchemaNode } from './form.js';
import { convertLayoutKind } from './layoutKind.js';
import { liveModel, type Evaluation, type LiveModel, type Problem } from './model.js';

/** One edit from the page: a field's dotted path and its new text, or `remove` to go back to the default. */
export type FieldEdit = Readonly<{ path: string; text?: string; remove?: boolean }>;

export type EditOutcome =
  | Readonly<{ ok: true; model: LiveModel }>
  | Readonly<{ ok: false; problems: readonly Problem[] }>;

/** An edit the server refuses outright (not a field of the design, too many, too long): HTTP 400. */
export class EditRefused extends Error {
  constructor(
    message: string,
    readonly path: string,
  ) {
    super(message);
  }
}

/** Most edits one request may carry, and the longest text of one field (a standoff list is ~100 characters). */
export const MAX_EDITS = 64;
export const MAX_FIELD_TEXT = 4000;

/** `stacks.0.place` → ['stacks', 0, 'place']. */
export function splitPath(path: string): (string | number)[] {
  return path.split('.').map((k) => (/^\d+$/.test(k) ? Number(k) : k));
}

/**
 * The design file a live page edits: its text, the model built from it, edits that are written back
 * only when the result validates, and a watch on the file so an edit in another editor reloads the
 * model. Writes go to this one file only (atomically: a temporary file beside it, then a rename).
 */
export class LiveSession {
  text = '';
  version = 0;
  model!: LiveModel;
  evaluation!: Evaluation;
  private watcher: FSWatcher | null = null;
  private timer: NodeJS.Timeout | null = null;
  private readonly listeners = new Set<(m: LiveModel) => void>();
  /** Checks of parts an edit left unchanged are reused. */
  private readonly checks: PartCheckCache = new Map();

  /** `realPath`: the design file with symbolic links resolved; `label`: how the page names it. */
  constructor(
    readonly realPath: string,
    readonly label: string,
    readonly schema: SchemaNode,
  ) {}

  /** Read the file (bounded, as every command reads a design) and build the first model. Throws UsageError. */
  load(): LiveModel {
    this.setText(readText(this.realPath, 'a design file (YAML or JSON)'));
    return this.model;
  }

  private setText(text: string): void {
    this.text = text;
    this.version += 1;
    const previous = this.model && this.model.state === 'ok' ? this.model : (this.model ?? null);
    const { model, evaluation } = liveModel(text, { version: this.version, file: this.label, schema: this.schema, previous, cache: this.checks });
    this.model = model;
    this.evaluation = evaluation;
  }

  /** Called with every new model (an edit here, or the file changed on disk). */
  onChange(listener: (m: LiveModel) => void): () => void {
    this.listeners.add(listener);
    return () => this.listeners.delete(listener);
  }

  private notify(): void {
    for (const l of this.listeners) l(this.model);
  }

  /**
   * Apply the page's edits together. When the edited design validates and builds, the file is
   * rewritten (comments, key order and formatting kept) and the new model returned; otherwise the
   * problems are returned and the file is left exactly as it was.
   * @throws EditRefused for a path that is not a field of the design, or too many or too long edits
   */
  applyEdits(edits: readonly FieldEdit[]): EditOutcome {
    if (!Array.isArray(edits) || edits.length === 0 || edits.length > MAX_EDITS) throw new EditRefused(`send 1 to ${MAX_EDITS} edits`, '');
    const raw = this.evaluation.raw;
    const changes: Change[] = [];
    const problems: Problem[] = [];
    for (const e of edits) {
      if (typeof e?.path !== 'string' || e.path.length > 200) throw new EditRefused('an edit needs a field path', '');
      const path = splitPath(e.path);
      const node = schemaAt(this.schema, path, raw);
      if (!node || e.path === '$schema') throw new EditRefused(`${e.path} is not a field of the design`, e.path);
      if (!e.remove && (typeof e.text !== 'string' || e.text.length > MAX_FIELD_TEXT)) throw new EditRefused(`${e.path}: the text must be at most ${MAX_FIELD_TEXT} characters`, e.path);
      try {
        const value = e.remove ? undefined : valueFromText(node, e.text as string);
        changes.push({ path, old: null, new: value, why: 'live edit' });
      } catch (err) {
        if (!(err instanceof FieldTextError)) throw err;
        problems.push({ path: e.path, message: err.message, value: JSON.stringify(e.text) });
      }
    }
    if (problems.length) return { ok: false, problems };
    let text: string;
    try {
      text = editDesignText(this.text, convertLayoutKind(changes, raw));
    } catch (err) {
      return { ok: false, problems: [{ path: edits[0].path, message: (err as Error).message, value: '' }] };
    }
    if (text === this.text) return { ok: true, model: this.model };
    const { model, evaluation } = liveModel(text, { version: this.version + 1, file: this.label, schema: this.schema, previous: this.model, cache: this.checks });
    if (model.state !== 'ok') return { ok: false, problems: model.problems };
    writeAllAtomically([{ path: this.realPath, data: text }]);
    this.text = text;
    this.version += 1;
    this.model = model;
    this.evaluation = evaluation;
    this.notify();
    return { ok: true, model };
  }

  /** Watch the file: a change made elsewhere (another editor, a script) reloads the model. */
  watch(): void {
    if (this.watcher) return;
    const name = basename(this.realPath);
    // The folder, not the file: editors save by writing a new file and renaming it over the old one.
    this.watcher = watch(dirname(this.realPath), (_event, file) => {
      if (file !== null && file !== name) return;
      if (this.timer) clearTimeout(this.timer);
      this.timer = setTimeout(() => this.reloadFromDisk(), 30);
    });
    this.watcher.on('error', () => undefined);
  }

  /** Re-read the file; rebuild and notify when its text differs from what this session holds. */
  reloadFromDisk(): boolean {
    let text: string;
    try {
      text = readText(this.realPath, 'a design file (YAML or JSON)');
    } catch {
      return false; // Mid-save (renamed away), deleted, or not a design now: keep the last model; a later save reloads.
    }
    if (text === this.text) return false;
    this.setText(text);
    this.notify();
    return true;
  }

  close(): void {
    if (this.timer) clearTimeout(this.timer);
    this.watcher?.close();
    this.watcher = null;
    this.listeners.clear();
  }
}
