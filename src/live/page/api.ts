import type { LiveModel, Problem } from '../model.js';
import type { FieldEdit } from '../session.js';

export type ErrorBody = { error: { message: string; path: string } };

export type EditAnswer =
  | { kind: 'saved'; model: LiveModel }
  | { kind: 'invalid'; problems: Problem[] }
  | { kind: 'refused'; message: string; path: string };

/** GET a JSON answer; an error answer becomes an Error with the server's message. */
export async function getJson<T>(url: string): Promise<T> {
  const r = await fetch(url, { headers: { Accept: 'application/json' } });
  const body = (await r.json()) as T | ErrorBody;
  if (!r.ok) throw new Error((body as ErrorBody).error?.message ?? `${r.status} ${r.statusText}`);
  return body as T;
}

/** Send edits; the server writes the file only when the edited design validates and builds. */
export async function postEdits(edits: readonly FieldEdit[]): Promise<EditAnswer> {
  const r = await fetch('/api/edit', { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify({ edits }) });
  const body = (await r.json()) as { ok: true; model: LiveModel } | { ok: false; problems: Problem[] } | ErrorBody;
  if ('error' in body) return { kind: 'refused', message: body.error.message, path: body.error.path };
  if (body.ok) return { kind: 'saved', model: body.model };
  return { kind: 'invalid', problems: body.problems };
}
