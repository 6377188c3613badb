import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { binaryKind, decodeText, detectEncoding } from '../../src/cli/fileKind.js';

const b = (...xs: number[]): Uint8Array => Uint8Array.from(xs);

describe('what an input file is, from its bytes', () => {
  it('encodings by the detection table of YAML 1.2, section 5.2 (byte order marks and the zeros around a first ASCII character)', () => {
    expect(detectEncoding(b(0x00, 0x00, 0xfe, 0xff))).toBe('utf-32be');
    expect(detectEncoding(b(0x00, 0x00, 0x00, 0x6e))).toBe('utf-32be');
    expect(detectEncoding(b(0xff, 0xfe, 0x00, 0x00))).toBe('utf-32le');
    expect(detectEncoding(b(0x6e, 0x00, 0x00, 0x00))).toBe('utf-32le');
    expect(detectEncoding(b(0xfe, 0xff, 0x00, 0x6e))).toBe('utf-16be');
    expect(detectEncoding(b(0x00, 0x6e, 0x00, 0x61))).toBe('utf-16be');
    expect(detectEncoding(b(0xff, 0xfe, 0x6e, 0x00))).toBe('utf-16le');
    expect(detectEncoding(b(0x6e, 0x00, 0x61, 0x00))).toBe('utf-16le');
    expect(detectEncoding(b(0xef, 0xbb, 0xbf, 0x6e))).toBe('utf-8');
    expect(detectEncoding(b(0x6e, 0x61, 0x6d, 0x65))).toBe('utf-8');
  });

  it('file signatures: PDF (ISO 32000-1 7.5.2), PNG (PNG spec 5.2), ZIP local header (APPNOTE 4.3.7), gzip (RFC 1952)', () => {
    expect(binaryKind(Buffer.from('%PDF-1.7\n'))).toBe('a PDF document');
    expect(binaryKind(b(0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a))).toBe('a PNG image');
    expect(binaryKind(b(0x50, 0x4b, 0x03, 0x04, 0x14, 0x00))).toMatch(/^a ZIP archive/);
    expect(binaryKind(b(0x1f, 0x8b, 0x08, 0x00))).toBe('gzip-compressed data');
    // The 22-byte binary DXF sentinel as an independent writer puts it (ezdxf, test/fixtures/dxf/make_fixtures.py).
    const sentinel = readFileSync(new URL('../fixtures/dxf/binary.dxf', import.meta.url)).subarray(0, 22);
    expect(binaryKind(sentinel)).toMatch(/binary DXF/);
    expect(binaryKind(Buffer.from('AC1015\u0000\u0000\u0000\u0000\u0000\u0001', 'latin1'))).toMatch(/binary CAD drawing/);
    // Text that happens to begin like a signature stays text.
    expect(binaryKind(Buffer.from('AC1: a key\n'))).toBeNull();
    expect(binaryKind(Buffer.from('name: Tessel 5\n\tx: 1\r\n'))).toBeNull();
  });

  it('decoding: UTF-8 and UTF-16 with or without a byte order mark give the same text; others are refused', () => {
    const text = 'name: Tessel 5 — ünï 🛩\n';
    for (const bytes of [Buffer.from(text), Buffer.concat([b(0xef, 0xbb, 0xbf), Buffer.from(text)]), Buffer.concat([b(0xff, 0xfe), Buffer.from(text, 'utf16le')]), Buffer.from(text, 'utf16le'), Buffer.from(text, 'utf16le').swap16()]) {
      expect(decodeText(bytes)).toMatchObject({ text });
    }
    // RFC 3629: 0xE9 alone (Latin-1 "é") starts no valid sequence; the offset points at it.
    expect(decodeText(Buffer.from('name: caf\xe9 x', 'latin1'))).toEqual({ problem: 'not valid UTF-8 text (at byte 9); save it as UTF-8' });
    expect(decodeText(b(0xff, 0xfe, 0, 0, 0x6e, 0, 0, 0))).toEqual({ problem: 'UTF-32 text; save it as UTF-8' });
    expect(decodeText(b(0x6e, 0x61, 0x00, 0x6d))).toEqual({ kind: 'binary data' });
  });
});
