import { spawn } from 'node:child_process';
import { copyFileSync, mkdtempSync } from 'node:fs';
import { request } from 'node:http';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { designJsonSchema } from '../params/jsonSchema.js';
import type { SchemaNode } from '../live/form.js';
import { LiveSession } from '../live/session.js';
import type { BenchCase } from './types.js';

const designPath = (name: string): string => fileURLToPath(new URL(`../../designs/${name}.yaml`, import.meta.url));

/** A live session on a copy of a demo design (the edits write to the copy). */
function session(name: string): { s: LiveSession; flip: () => string } {
  const dir = mkdtempSync(join(tmpdir(), 'fw-bench-live-'));
  const file = join(dir, `${name}.yaml`);
  copyFileSync(designPath(name), file);
  const s = new LiveSession(file, file, designJsonSchema() as SchemaNode);
  s.load();
  const raw = s.evaluation.raw as { layout: { kind: string; wheelbaseMm?: number }; body: { lengthMm: number } };
  // A new value every time (as a spinner gives), so no run meets parts it has checked before.
  const [path, base] = raw.layout.wheelbaseMm !== undefined ? ['layout.wheelbaseMm', raw.layout.wheelbaseMm] : ['body.lengthMm', raw.body.lengthMm];
  let n = 0;
  const flip = (): string => `${path}=${base + (++n % 40) * 0.25}`;
  // The server is a long-running process: a few edits first, as a designer's first moves would.
  for (let i = 0; i < 3; i++) {
    const [p, t] = flip().split('=');
    s.applyEdits([{ path: p, text: t }]);
  }
  return { s, flip };
}

const editCase = (name: string): BenchCase => ({
  name: `live edit → rebuilt model and findings (${name})`,
  target: 'under 100 ms from the edit to the model the page draws',
  budgetMs: 100,
  setup: () => session(name),
  run: (state) => {
    const { s, flip } = state as ReturnType<typeof session>;
    const cpu0 = process.cpuUsage();
    const [path, text] = flip().split('=');
    const r = s.applyEdits([{ path, text }]);
    if (!r.ok) throw new Error(`bench edit refused: ${JSON.stringify(r.problems)}`);
    // The answer the server sends: serialising it is part of the round trip.
    const answer = JSON.stringify(r);
    const cpu = process.cpuUsage(cpu0);
    return { answer, cpuMs: (cpu.user + cpu.system) / 1000 };
  },
  note: (r) => {
    // CPU time beside the wall time: on a shared machine the difference is the wait for a core.
    const { answer, cpuMs } = r as { answer: string; cpuMs: number };
    const m = (JSON.parse(answer) as { model: { findings: unknown[]; buildMs: number } }).model;
    return `${m.findings.length} findings; build+check ${m.buildMs} ms; last edit ${cpuMs.toFixed(0)} ms CPU; answer ${(answer.length / 1024).toFixed(0)} KB`;
  },
});

/** Milliseconds from starting `framewright live` to the first page served. */
function startUp(): Promise<number> {
  const cli = fileURLToPath(new URL('../cli/framewright.cjs', import.meta.url));
  const t0 = performance.now();
  const p = spawn(process.execPath, [cli, 'live', designPath('tessel-5'), '--no-open'], { stdio: ['ignore', 'pipe', 'ignore'] });
  return new Promise((resolve, reject) => {
    let out = '';
    p.stdout.on('data', (c: Buffer) => {
      out += c.toString();
      const m = /at http:\/\/127\.0\.0\.1:(\d+)\//.exec(out);
      if (!m) return;
      const req = request({ host: '127.0.0.1', port: Number(m[1]), path: '/' }, (res) => {
        res.resume();
        res.on('end', () => {
          const ms = performance.now() - t0;
          p.kill('SIGTERM');
          if (res.statusCode === 200) resolve(ms);
          else reject(new Error(`status ${res.statusCode}`));
        });
      });
      req.on('error', reject);
      req.end();
    });
    p.on('error', reject);
  });
}

export const cases: BenchCase[] = [
  editCase('tessel-5'),
  editCase('mote-3'),
  editCase('farline-7'),
  {
    name: 'live start-up to the first page (tessel-5)',
    target: 'under 1 s from the command to the page served',
    budgetMs: 1000,
    run: () => startUp(),
    note: (r) => `${(r as number).toFixed(0)} ms measured from spawn`,
  },
];
