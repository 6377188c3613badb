import { spawn } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { MAX_DESIGN_BYTES, MAX_DXF_BYTES } from '../../src/cli/io.js';
import { DEMO_FILES, DESIGNS_DIR, demoText, REPO } from '../helpers/demo.js';
import { outputNames, runCliAsync, STACK_LINE } from '../helpers/cli.js';

const dir = mkdtempSync(join(tmpdir(), 'fw-bad-'));
const file = (name: string, data: string | Buffer): string => {
  writeFileSync(join(dir, name), data);
  return join(dir, name);
};

/** Bad input: exit 2, one short message naming the problem, no stack trace, no Node warning, nothing written. */
function expectRefused(r: { code: number; stdout: string; stderr: string }, message: RegExp, out?: string): void {
  expect(r.code, r.stderr).toBe(2);
  expect(r.stderr).toMatch(message);
  expect(r.stderr).not.toMatch(STACK_LINE);
  expect(r.stderr).not.toMatch(/\(node:\d+\)|Warning:/);
  expect(r.stderr.length).toBeLessThan(600);
  if (out) expect(existsSync(out)).toBe(false);
}

describe('input the CLI refuses: exit 2, a one-line reason, nothing written (the built CLI)', () => {
  it('stated limits: a design file of at most 1 MB, a DXF of at most 64 MB', () => {
    expect(MAX_DESIGN_BYTES).toBe(1024 * 1024);
    expect(MAX_DXF_BYTES).toBe(64 * 1024 * 1024);
  });

  it('files that are not text are named for what they are, not echoed', async () => {
    const out = join(dir, 'never');
    const cases: Array<[string, RegExp]> = [
      ['/dev/zero', /\/dev\/zero is binary data, not a design file/],
      [file('random.yaml', randomBytes(50 * 1024 * 1024)), /random\.yaml is 50 MB, more than the 1 MB allowed for a design file/],
      [file('small-random.yaml', Buffer.concat([Buffer.from([0, 1, 2, 3]), randomBytes(4000)])), /small-random\.yaml is binary data, not a design file/],
      [file('drawing.yaml', Buffer.from('%PDF-1.7\n%\xe2\xe3\xcf\xd3\n1 0 obj\n', 'latin1')), /is a PDF document, not a design file/],
      [file('photo.yaml', Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13])), /is a PNG image, not a design file/],
      [file('utf32.yaml', Buffer.from([0xff, 0xfe, 0, 0, 0x6e, 0, 0, 0])), /is UTF-32 text; save it as UTF-8$/m],
      [file('latin1.yaml', Buffer.from('name: Tessel caf\xe9\n', 'latin1')), /is not valid UTF-8 text \(at byte 16\)/],
      [dir, /is a folder, not a design file/],
    ];
    const results = await Promise.all(cases.map(([path]) => runCliAsync(['build', path, '--out', out])));
    results.forEach((r, i) => expectRefused(r, cases[i][1], out));
    // The same for DXF input: a random 50 MB file is refused by its first bytes, not read to the end.
    expectRefused(await runCliAsync(['check', file('random.dxf', randomBytes(50 * 1024 * 1024))]), /random\.dxf is binary data, not a DXF drawing/);
  });

  it('YAML that would confuse a parser: unknown tags, 5,000 levels of nesting, .nan and .inf, control characters', async () => {
    const out = join(dir, 'never2');
    const base = demoText('tessel-5.yaml');
    const cases: Array<[string, RegExp]> = [
      [base.replace('name: Tessel 5', 'name: !shout Tessel 5'), /uses a tag framewright does not read \(line \d+, column \d+\): !shout/],
      [base.replace('name: Tessel 5', 'name: !!python/object:os.system Tessel 5'), /uses a tag framewright does not read .*python\/object/],
      [base.replace('name: Tessel 5', 'name: !!binary VGVzc2Vs'), /uses a tag framewright does not read .*binary/],
      [`${'{a: '.repeat(5000)}1${'}'.repeat(5000)}\n`, /nests collections more than 64 levels deep \(line 1, column \d+\)/],
      [`${'- '.repeat(5000)}x\n`, /nests collections more than 64 levels deep/],
      [base.replace(/diameter: .*/, 'diameter: .inf'), /props\.diameter: \.inf is not a finite number/],
      [base.replace(/wheelbaseMm: .*/, 'wheelbaseMm: .nan'), /layout\.wheelbaseMm: \.nan is not a finite number/],
      [base.replace('name: Tessel 5', 'name: "Tessel\\e[31m 5"'), /name: "Tessel\\u001b\[31m 5" contains the control character U\+001B/],
      ['a: &x {b: *x}\n', /contains itself \(an alias inside its own anchor\)/],
      // Aliases of aliases nine wide and six deep would expand to 9^6 values ("billion laughs").
      [['a: &a [1,1,1,1,1,1,1,1,1]', ...'bcde'.split('').map((k, i) => `${k}: &${k} [${Array(9).fill(`*${'abcd'[i]}`).join(',')}]`), `f: [${Array(9).fill('*e').join(',')}]`].join('\n'), /cannot be read: Excessive alias count/],
      ['name: [unclosed\n', /is not valid YAML or JSON \(line \d+, column \d+\)/],
    ];
    const results = await Promise.all(cases.map(([text], i) => runCliAsync(['build', file(`y${i}.yaml`, text), '--out', out])));
    results.forEach((r, i) => expectRefused(r, cases[i][1], out));
  });

  it('modes on a drawing whose contours cross is refused with the drawing error, not a failed solver (exit 2)', async () => {
    const rect = (x0: number, y0: number, x1: number, y1: number) =>
      [[x0, y0, x1, y0], [x1, y0, x1, y1], [x1, y1, x0, y1], [x0, y1, x0, y0]].map(([a, b, c, d]) => `0\nLINE\n8\n0\n10\n${a}\n20\n${b}\n11\n${c}\n21\n${d}`).join('\n');
    const circle = (x: number, y: number, r: number) => `0\nCIRCLE\n8\n0\n10\n${x}\n20\n${y}\n40\n${r}`;
    // Two holes overlapping inside one plate: the part is formed, its holes cross.
    const dxf = file('crossing-holes.dxf', `0\nSECTION\n2\nENTITIES\n${rect(0, 0, 100, 40)}\n${circle(20, 20, 5)}\n${circle(24, 20, 5)}\n0\nENDSEC\n0\nEOF\n`);
    expectRefused(await runCliAsync(['modes', dxf, '--thickness', '2']), /part crossing-holes cannot be analysed: dxf-contours-cross: two contours .* cross or touch/);
  });
});

describe('input the CLI takes', () => {
  it('a UTF-16 design (as some editors save it) builds the same files as its UTF-8 original', async () => {
    const text = demoText('mote-3.yaml');
    const utf16 = file('mote-3-utf16.yaml', Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(text, 'utf16le')]));
    const [a, b] = [join(dir, 'u8'), join(dir, 'u16')];
    const [ra, rb] = await Promise.all([runCliAsync(['build', join(DESIGNS_DIR, 'mote-3.yaml'), '--out', a]), runCliAsync(['build', utf16, '--out', b])]);
    expect([ra.code, rb.code]).toEqual([0, 0]);
    expect(outputNames(b)).toEqual(outputNames(a));
    for (const f of outputNames(a)) expect(readFileSync(join(b, f)).equals(readFileSync(join(a, f))), f).toBe(true);
  });

  it('a design on standard input ("-")', async () => {
    const out = join(dir, 'stdin');
    const r = await runCliAsync(['build', '-', '--out', out], demoText(DEMO_FILES[0]));
    expect(r.code, r.stderr).toBe(0);
    expect(outputNames(out).length).toBeGreaterThan(3);
  });

  it('standard input beyond 1 MB is refused without reading it all', async () => {
    const r = await runCliAsync(['check', '-'], Buffer.alloc(3 * 1024 * 1024, 'a: 1\n'));
    expectRefused(r, /standard input is more than the 1 MB allowed for a design file/);
  });
});

describe('a reader that stops early (`framewright schema | head -1`)', () => {
  it('ends the command quietly: no stack trace for the write that could not be delivered', async () => {
    const child = spawn(process.execPath, [join(REPO, 'dist', 'cli', 'main.js'), 'schema'], { cwd: REPO });
    let stderr = '';
    child.stderr.on('data', (b: Buffer) => (stderr += b.toString()));
    // The reading end closes before the command writes: its write must fail with EPIPE.
    child.stdout.destroy();
    const code = await new Promise<number | null>((done) => child.on('close', done));
    expect(stderr).toBe('');
    expect(code).toBe(0);
  });
});
