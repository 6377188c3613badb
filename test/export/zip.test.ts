import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { crc32, zipStore } from '../../src/export/zip.js';
import { REPO } from '../helpers/demo.js';
import { pythonModuleAvailable, requireTool, SYSTEM_PYTHON } from '../helpers/reference.js';

/** The stored ZIP writer, read back by Python's zipfile (an independent reader) and checked against zlib's CRC-32. */

const tmp = mkdtempSync(join(tmpdir(), 'fw-zip-'));
afterAll(() => rmSync(tmp, { recursive: true, force: true }));

type Read = { bad: string | null; entries: Array<{ name: string; size: number; crc: number; method: number; date: number[]; data_b64: string }> };

function readWithPython(bytes: Uint8Array): Read {
  const file = join(tmp, `a${Math.random().toString(36).slice(2)}.zip`);
  writeFileSync(file, bytes);
  const r = spawnSync(SYSTEM_PYTHON, [join(REPO, 'test', 'reference', 'zip', 'read_zip.py'), file], { encoding: 'utf8' });
  if (r.status !== 0) throw new Error(r.stderr);
  return JSON.parse(r.stdout) as Read;
}

const run = requireTool(pythonModuleAvailable('zipfile'), 'python3 (zipfile)');

describe.runIf(run)('zipStore', () => {
  const binary = Uint8Array.from({ length: 3000 }, (_, i) => (i * 37 + 11) % 256);
  const entries = [
    { name: 'arm.dxf', data: '  0\nSECTION\n  2\nENTITIES\n  0\nENDSEC\n  0\nEOF\n' },
    { name: 'sheets/sheet-01-5mm.svg', data: '<svg xmlns="http://www.w3.org/2000/svg"/>' },
    { name: 'notes/größe µm.txt', data: 'ümlaut ✓\n' },
    { name: 'drawing.pdf', data: binary },
    { name: 'empty.txt', data: '' },
  ];

  it('Python reads every entry back byte for byte, with good CRCs, stored, dated 1980-01-01', () => {
    const read = readWithPython(zipStore(entries));
    expect(read.bad).toBeNull();
    expect(read.entries.map((e) => e.name)).toEqual(entries.map((e) => e.name));
    read.entries.forEach((e, i) => {
      const want = typeof entries[i].data === 'string' ? Buffer.from(entries[i].data as string, 'utf8') : Buffer.from(entries[i].data as Uint8Array);
      expect(Buffer.from(e.data_b64, 'base64').equals(want)).toBe(true);
      expect(e.size).toBe(want.length);
      expect(e.method).toBe(0);
      expect(e.date).toEqual([1980, 1, 1, 0, 0, 0]);
    });
  });

  it("CRC-32 equals zlib's (Python's zlib.crc32) and the standard check value", () => {
    // The CRC-32 check value: crc32("123456789") = 0xCBF43926 (ITU-T V.42 / ISO 3309).
    expect(crc32(new TextEncoder().encode('123456789'))).toBe(0xcbf43926);
    const r = spawnSync(SYSTEM_PYTHON, ['-c', 'import sys, zlib; print(zlib.crc32(sys.stdin.buffer.read()))'], { input: Buffer.from(binary) });
    expect(crc32(binary)).toBe(Number(r.stdout.toString().trim()));
  });

  it('is deterministic and refuses names that would land outside the folder', () => {
    expect(Buffer.from(zipStore(entries)).equals(Buffer.from(zipStore(entries)))).toBe(true);
    for (const name of ['../x', '/etc/passwd', 'a/../../b', '']) expect(() => zipStore([{ name, data: 'x' }])).toThrow(RangeError);
    expect(() => zipStore([{ name: 'a', data: '1' }, { name: 'a', data: '2' }])).toThrow(RangeError);
  });
});
