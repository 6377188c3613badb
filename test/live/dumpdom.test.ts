import { spawn } from 'node:child_process';
import { createServer, type AddressInfo } from 'node:net';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DESIGNS_DIR } from '../helpers/demo.js';
import { CHROMIUM, CHROMIUM_FLAGS, chromiumAvailable, freshProfile, startLive, type RunningLive } from '../helpers/live.js';
import { copyFileSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';

/**
 * The page as a headless browser leaves it after the load event (`chromium --headless --dump-dom`):
 * the frame's parts as SVG and the findings list are there without any further request, and the
 * browser logged no console message (errors, CSP violations) on the way.
 */

/** A port nothing listens on right now. */
function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = createServer();
    srv.once('error', reject);
    srv.listen(0, '127.0.0.1', () => {
      const { port } = srv.address() as AddressInfo;
      srv.close(() => resolve(port));
    });
  });
}

function dumpDom(url: string): Promise<{ dom: string; log: string; code: number | null }> {
  const profile = freshProfile();
  return new Promise((resolve, reject) => {
    const p = spawn(CHROMIUM, ['--headless', ...CHROMIUM_FLAGS, `--user-data-dir=${profile.dir}`, '--enable-logging=stderr', '--v=0', '--dump-dom', url], { stdio: ['ignore', 'pipe', 'pipe'] });
    let dom = '';
    let log = '';
    p.stdout.on('data', (c: Buffer) => (dom += c.toString()));
    p.stderr.on('data', (c: Buffer) => (log += c.toString()));
    const timer = setTimeout(() => p.kill('SIGKILL'), 90_000);
    p.on('error', reject);
    p.on('exit', (code) => {
      clearTimeout(timer);
      profile.remove();
      resolve({ dom, log, code });
    });
  });
}

const run = chromiumAvailable();

describe.runIf(run)('chromium --headless --dump-dom of the live page (Tessel 5)', () => {
  let live: RunningLive;
  let dir: string;
  let result: { dom: string; log: string; code: number | null };
  let model: { findings: unknown[]; parts: Array<{ name: string }> };

  beforeAll(async () => {
    dir = mkdtempSync(join(tmpdir(), 'fw-dump-'));
    copyFileSync(join(DESIGNS_DIR, 'tessel-5.yaml'), join(dir, 'tessel-5.yaml'));
    // As the issue runs it: `framewright live designs/tessel-5.yaml --port P --no-open`.
    const port = await freePort();
    live = await startLive(join(dir, 'tessel-5.yaml'), ['--port', String(port)]);
    expect(live.port).toBe(port);
    model = (await (await fetch(`${live.url}api/model`)).json()) as typeof model;
    result = await dumpDom(live.url);
  });
  afterAll(async () => {
    await live?.stop();
    rmSync(dir, { recursive: true, force: true });
  });

  it('holds every part as SVG, in plan view and on its own', () => {
    expect(result.code).toBe(0);
    const names = model.parts.map((p) => p.name);
    expect(names).toEqual(['bottom-plate', 'arm', 'top-plate', 'brace', 'camera-side']);
    for (const name of names) {
      expect(result.dom).toContain(`<svg class="view" role="img" aria-label="part ${name}"`);
      expect(result.dom).toMatch(new RegExp(`<path class="outline" data-part="${name}" d="M`));
    }
    // Plan view: every copy of every plate (1 bottom + 4 arms + 1 top + 2 braces + 2 camera sides).
    expect(result.dom.match(/<path class="plate role-[a-z-]+" data-part=/g)?.length).toBe(10);
    expect(result.dom.match(/<circle class="prop[^"]*" data-site=/g)?.length).toBe(4);
  });

  it('holds the findings list, one entry per finding of the report', () => {
    const n = result.dom.match(/<li class="finding sev-(error|warning|info)/g)?.length ?? 0;
    expect(n).toBe(model.findings.length);
    expect(n).toBeGreaterThan(0);
  });

  it('logged no console message (no script error, no blocked resource)', () => {
    const consoleLines = result.log.split('\n').filter((l) => /:CONSOLE/.test(l));
    expect(consoleLines).toEqual([]);
  });

  it('the page is served from the package: its script and style are the built assets', () => {
    expect(result.dom).toContain('<script src="/app.js"></script>');
    expect(result.dom).toContain('<link rel="stylesheet" href="/app.css">');
    expect(result.dom).not.toMatch(/(src|href)="https?:\/\//);
    expect(readFileSync(join(dir, 'tessel-5.yaml'), 'utf8')).toBe(readFileSync(join(DESIGNS_DIR, 'tessel-5.yaml'), 'utf8'));
  });
});
