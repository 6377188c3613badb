import { copyFileSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { request } from 'node:http';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { allowedHosts, judgeRequest } from '../../src/live/security.js';
import { spawnSync } from 'node:child_process';
import { assembledFrameModes } from '../../src/analysis/frameModes.js';
import { buildAssembly } from '../../src/assembly/build.js';
import { buildFrame } from '../../src/geometry/frame.js';
import { parseDesignText } from '../../src/params/design.js';
import { DESIGNS_DIR, REPO } from '../helpers/demo.js';
import { outputNames, runCli } from '../helpers/cli.js';
import { commandAvailable, pythonModuleAvailable, requireTool, SYSTEM_PYTHON } from '../helpers/reference.js';
import { startLive, type RunningLive } from '../helpers/live.js';

/**
 * The live server's rules, tried against the built CLI: only its own Host and Origin, only the
 * design file written, bounded requests, bad edits refused with the file untouched.
 */

type Answer = { status: number; body: string; headers: Record<string, string | string[] | undefined> };

/** A raw HTTP request (node:http lets a test set Host and Origin as a hostile page or DNS name would). */
function send(port: number, method: string, path: string, headers: Record<string, string> = {}, body?: string): Promise<Answer> {
  return new Promise((resolve, reject) => {
    const req = request({ host: '127.0.0.1', port, method, path, headers: { Host: `127.0.0.1:${port}`, ...headers } }, (res) => {
      let text = '';
      res.on('data', (c: Buffer) => (text += c.toString()));
      res.on('end', () => resolve({ status: res.statusCode ?? 0, body: text, headers: res.headers }));
    });
    req.on('error', reject);
    if (body !== undefined) req.write(body);
    req.end();
  });
}

const editBody = (edits: unknown): string => JSON.stringify({ edits });

/** A download's bytes. */
function download(port: number, path: string): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    request({ host: '127.0.0.1', port, path, headers: { Host: `127.0.0.1:${port}` } }, (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => resolve(Buffer.concat(chunks)));
    })
      .on('error', reject)
      .end();
  });
}
const JSON_TYPE = { 'Content-Type': 'application/json' };

describe('which requests the server answers (pure rules)', () => {
  const allowed = allowedHosts('127.0.0.1', 4000);
  it('loopback names with the right port only', () => {
    for (const h of ['127.0.0.1:4000', 'localhost:4000', '[::1]:4000']) expect(judgeRequest({ host: h }, allowed).ok).toBe(true);
    for (const h of ['127.0.0.1:4001', 'evil.example:4000', 'localhost', '', '127.0.0.1.evil.example:4000']) expect(judgeRequest({ host: h }, allowed).ok).toBe(false);
  });
  it('an Origin must be this server', () => {
    expect(judgeRequest({ host: 'localhost:4000', origin: 'http://localhost:4000' }, allowed).ok).toBe(true);
    expect(judgeRequest({ host: 'localhost:4000', origin: 'http://evil.example' }, allowed).ok).toBe(false);
    expect(judgeRequest({ host: 'localhost:4000', origin: 'https://localhost:4000' }, allowed).ok).toBe(false);
    expect(judgeRequest({ host: 'localhost:4000', origin: 'null' }, allowed).ok).toBe(false);
    expect(judgeRequest({ host: 'localhost:4000', 'sec-fetch-site': 'cross-site' }, allowed).ok).toBe(false);
  });
  it('a server bound to another address answers to that address', () => {
    const lan = allowedHosts('192.168.1.20', 4000);
    expect(judgeRequest({ host: '192.168.1.20:4000' }, lan).ok).toBe(true);
    expect(judgeRequest({ host: 'localhost:4000' }, lan).ok).toBe(false);
  });
});

describe('the running live server', () => {
  let dir: string;
  let design: string;
  let live: RunningLive;
  const original = readFileSync(join(DESIGNS_DIR, 'mote-3.yaml'), 'utf8');
  const files = (): string[] => readdirSync(dir).sort();

  beforeAll(async () => {
    dir = mkdtempSync(join(tmpdir(), 'fw-live-sec-'));
    design = join(dir, 'mote-3.yaml');
    copyFileSync(join(DESIGNS_DIR, 'mote-3.yaml'), design);
    writeFileSync(join(dir, 'neighbour.txt'), 'not the design\n');
    live = await startLive(design);
  });
  afterAll(async () => {
    await live?.stop();
    rmSync(dir, { recursive: true, force: true });
  });

  it('listens on 127.0.0.1 unless told otherwise', () => {
    expect(live.url).toMatch(/^http:\/\/127\.0\.0\.1:\d+\/$/);
  });

  it('serves the page and its script to its own Host', async () => {
    const page = await send(live.port, 'GET', '/');
    expect(page.status).toBe(200);
    expect(page.headers['content-security-policy']).toContain("default-src 'none'");
    expect(page.body).toContain('<script src="/app.js">');
    expect((await send(live.port, 'GET', '/app.js')).status).toBe(200);
    expect((await send(live.port, 'GET', '/', { Host: `localhost:${live.port}` })).status).toBe(200);
  });

  it('answers a foreign Host with 403 (DNS rebinding)', async () => {
    for (const host of ['evil.example', `evil.example:${live.port}`, `127.0.0.1:${live.port + 1}`]) {
      const r = await send(live.port, 'GET', '/api/model', { Host: host });
      expect(r.status).toBe(403);
      expect(r.body).not.toContain('Mote');
    }
  });

  it('answers a foreign Origin with 403 and does not write', async () => {
    const r = await send(live.port, 'POST', '/api/edit', { ...JSON_TYPE, Origin: 'http://evil.example' }, editBody([{ path: 'layout.wheelbaseMm', text: '200' }]));
    expect(r.status).toBe(403);
    const cross = await send(live.port, 'POST', '/api/edit', { ...JSON_TYPE, 'Sec-Fetch-Site': 'cross-site' }, editBody([{ path: 'layout.wheelbaseMm', text: '200' }]));
    expect(cross.status).toBe(403);
    expect(readFileSync(design, 'utf8')).toBe(original);
  });

  it('refuses a form post (not JSON), an oversized body, a long URL and other methods', async () => {
    expect((await send(live.port, 'POST', '/api/edit', { 'Content-Type': 'application/x-www-form-urlencoded' }, 'path=layout.wheelbaseMm&text=200')).status).toBe(415);
    expect((await send(live.port, 'POST', '/api/edit', JSON_TYPE, 'x'.repeat(70 * 1024))).status).toBe(413);
    expect((await send(live.port, 'GET', `/${'a'.repeat(3000)}`)).status).toBe(414);
    expect((await send(live.port, 'PUT', '/api/edit', JSON_TYPE, '{}')).status).toBe(405);
    expect((await send(live.port, 'POST', '/download/design', JSON_TYPE, '{}')).status).toBe(405);
    expect(readFileSync(design, 'utf8')).toBe(original);
  });

  it('writes nothing outside the design: paths that are not design fields are refused', async () => {
    const before = files();
    const neighbour = readFileSync(join(dir, 'neighbour.txt'), 'utf8');
    for (const path of ['../neighbour.txt', '/etc/passwd', '__proto__.polluted', 'constructor.prototype.x', '$schema', 'layout.nonsense', 'materials.__proto__.e1Gpa', 'file', '']) {
      const r = await send(live.port, 'POST', '/api/edit', JSON_TYPE, editBody([{ path, text: '1' }]));
      expect(r.status, path).toBe(400);
      expect(JSON.parse(r.body).error.message).toBeTruthy();
    }
    // A body naming another file is not a thing the API has: the field path is all there is.
    const other = await send(live.port, 'POST', '/api/edit', JSON_TYPE, JSON.stringify({ file: join(dir, 'neighbour.txt'), edits: [{ path: 'name', text: 'Hijack' }] }));
    expect(other.status).toBe(200);
    expect(readFileSync(join(dir, 'neighbour.txt'), 'utf8')).toBe(neighbour);
    expect(readFileSync(design, 'utf8')).toContain('name: Hijack');
    expect(files()).toEqual(before);
    // Put the name back for the next tests.
    await send(live.port, 'POST', '/api/edit', JSON_TYPE, editBody([{ path: 'name', text: 'Mote 3' }]));
    expect(readFileSync(design, 'utf8')).toBe(original);
  });

  it('downloads name parts, not paths', async () => {
    expect((await send(live.port, 'GET', '/download/part/..%2F..%2Fetc%2Fpasswd.dxf')).status).toBe(404);
    expect((await send(live.port, 'GET', '/download/part/../../neighbour.txt')).status).toBe(404);
    const dxf = await send(live.port, 'GET', '/download/part/bottom-plate.dxf');
    expect(dxf.status).toBe(200);
    expect(dxf.body).toContain('SECTION');
    expect(dxf.headers['content-disposition']).toBe('attachment; filename="bottom-plate.dxf"');
  });

  it('a bad value is refused with its field named, and the file is left exactly as it was', async () => {
    // Mote 3 is a unibody frame: its arms' thickness is the bottom plate's (arms.thicknessMm is no field of it)
    const r = await send(live.port, 'POST', '/api/edit', JSON_TYPE, editBody([{ path: 'body.thicknessMm', text: '40' }]));
    expect(r.status).toBe(200);
    const answer = JSON.parse(r.body) as { ok: boolean; problems: Array<{ path: string; message: string }> };
    expect(answer.ok).toBe(false);
    expect(answer.problems[0].path).toBe('body.thicknessMm');
    expect(answer.problems[0].message).toMatch(/0\.5 to 8/);
    expect(readFileSync(design, 'utf8')).toBe(original);
  });

  it('a good value is written in place, and the model follows', async () => {
    const r = await send(live.port, 'POST', '/api/edit', JSON_TYPE, editBody([{ path: 'body.thicknessMm', text: '3.5' }]));
    const answer = JSON.parse(r.body) as { ok: boolean; model: { parts: Array<{ name: string; thicknessMm: number }> } };
    expect(answer.ok).toBe(true);
    expect(answer.model.parts.find((p) => p.name === 'bottom-plate')?.thicknessMm).toBe(3.5);
    expect(readFileSync(design, 'utf8')).toBe(original.replace(/(\nbody:[\s\S]*?thicknessMm: )3\b/, '$13.5'));
  });
});

describe('the on-request routes (variant preview, quote drawing, modes)', () => {
  let dir: string;
  let live: RunningLive;
  beforeAll(async () => {
    dir = mkdtempSync(join(tmpdir(), 'fw-live-routes-'));
    copyFileSync(join(DESIGNS_DIR, 'tessel-5.yaml'), join(dir, 'tessel-5.yaml'));
    live = await startLive(join(dir, 'tessel-5.yaml'));
  });
  afterAll(async () => {
    await live?.stop();
    rmSync(dir, { recursive: true, force: true });
  });

  it('a variant preview is what `framewright variant` makes, and writes nothing', async () => {
    const r = await send(live.port, 'GET', '/api/variant?props=7in');
    expect(r.status).toBe(200);
    const v = JSON.parse(r.body) as { wheelbaseMm: number; changes: Array<{ path: string; new: string }>; plan: { markup: string } };
    const cli = JSON.parse(runCli(['variant', join(DESIGNS_DIR, 'tessel-5.yaml'), '--props', '7in', '--json', '--out', join(dir, 'v.yaml')]).stdout) as { wheelbase: { chosenMm: number } };
    expect(v.wheelbaseMm).toBeCloseTo(cli.wheelbase.chosenMm, 1);
    expect(v.changes.find((c) => c.path === 'props.diameter')?.new).toBe('7in');
    expect(v.plan.markup).toContain('class="plate');
    expect(readdirSync(dir).sort()).toEqual(['tessel-5.yaml', 'v.yaml']);
    const bad = await send(live.port, 'GET', '/api/variant?props=big');
    expect(bad.status).toBe(422);
    expect(JSON.parse(bad.body).error.message).toMatch(/not a length/);
  });

  it.skipIf(!requireTool(commandAvailable('pdftotext'), 'poppler-utils (pdftotext)'))('the quote drawing downloads as a PDF that pdftotext reads', async () => {
    const pdf = await download(live.port, '/download/drawing.pdf?qty=3');
    writeFileSync(join(dir, 'drawing.pdf'), pdf);
    const text = spawnSync('pdftotext', ['-layout', join(dir, 'drawing.pdf'), '-'], { encoding: 'utf8' }).stdout;
    expect(text).toContain('Tessel 5');
    expect(text).toMatch(/3 frames?/);
    expect((await send(live.port, 'GET', '/download/drawing.pdf?qty=0')).status).toBe(400);
  });

  it.skipIf(!requireTool(pythonModuleAvailable('zipfile'), 'python3 (zipfile)'))('all cut files download as one ZIP holding exactly what `framewright build` writes', async () => {
    const zip = await download(live.port, '/download/cut-files.zip');
    writeFileSync(join(dir, 'cut.zip'), zip);
    const read = JSON.parse(spawnSync(SYSTEM_PYTHON, [join(REPO, 'test', 'reference', 'zip', 'read_zip.py'), join(dir, 'cut.zip')], { encoding: 'utf8' }).stdout) as { bad: string | null; entries: Array<{ name: string; data_b64: string }> };
    expect(read.bad).toBeNull();
    const out = join(dir, 'built');
    expect(runCli(['build', join(dir, 'tessel-5.yaml'), '--out', out]).code).toBe(0);
    expect(read.entries.map((e) => e.name).sort()).toEqual(outputNames(out));
    for (const e of read.entries) expect(Buffer.from(e.data_b64, 'base64').equals(readFileSync(join(out, e.name))), e.name).toBe(true);
  });

  it('the frame modes come from the analysis, computed in the background', async () => {
    const r = await send(live.port, 'GET', '/api/modes');
    expect(r.status).toBe(200);
    const m = JSON.parse(r.body) as { modes: Array<{ frequencyHz: number; name: string }> };
    expect(m.modes.length).toBe(6);
    // The same modes the analysis gives in this process for the same design.
    const d = parseDesignText(readFileSync(join(dir, 'tessel-5.yaml'), 'utf8'));
    const direct = assembledFrameModes(buildAssembly(d, buildFrame(d)), { modes: 6 });
    expect(m.modes.map((x) => x.name)).toEqual(direct.modes.map((x) => x.name));
    m.modes.forEach((x, i) => expect(x.frequencyHz).toBeCloseTo(direct.modes[i].frequencyHz, 0));
  }, 180_000);
});
