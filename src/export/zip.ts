/**
 * A ZIP archive of files stored as they are (method 0, no compression): what a browser downloads as
 * "all cut files". Deterministic: every entry carries the same fixed date (1980-01-01, the format's
 * earliest) and the entries keep the given order. Names are UTF-8 (general-purpose flag bit 11).
 * Format: PKWARE APPNOTE 6.3 (local headers, central directory, end record); no ZIP64, so the whole
 * archive must stay under 4 GiB and 65,535 entries.
 */

export type ZipEntry = Readonly<{ name: string; data: string | Uint8Array }>;

const CRC_TABLE = (() => {
  const t = new Uint32Array(256);
  for (let n = 0; n < 256; n++) {
    let c = n;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
    t[n] = c >>> 0;
  }
  return t;
})();

/** CRC-32 (ISO 3309 / ITU-T V.42 polynomial, as ZIP uses it). */
export function crc32(bytes: Uint8Array): number {
  let c = 0xffffffff;
  for (const b of bytes) c = CRC_TABLE[(c ^ b) & 0xff] ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}

/** 1980-01-01 00:00 in MS-DOS date and time fields. */
const DOS_DATE = (0 << 9) | (1 << 5) | 1;
const DOS_TIME = 0;
const UTF8_NAMES = 0x0800;
const VERSION = 20;

/**
 * The archive's bytes. Throws RangeError for an empty or duplicate name, a name with a `..` step or
 * a leading `/`, or an archive beyond the format's 32-bit limits.
 * @example zipStore([{ name: 'arm.dxf', data: dxfText }])
 */
export function zipStore(entries: readonly ZipEntry[]): Uint8Array {
  const enc = new TextEncoder();
  const seen = new Set<string>();
  const locals: Uint8Array[] = [];
  const centrals: Uint8Array[] = [];
  let offset = 0;
  if (entries.length > 0xffff) throw new RangeError(`a ZIP without ZIP64 holds at most 65535 entries, not ${entries.length}`);
  for (const e of entries) {
    if (e.name === '' || e.name.startsWith('/') || e.name.split('/').includes('..') || seen.has(e.name)) throw new RangeError(`bad or repeated entry name ${JSON.stringify(e.name)}`);
    seen.add(e.name);
    const name = enc.encode(e.name);
    const data = typeof e.data === 'string' ? enc.encode(e.data) : e.data;
    const crc = crc32(data);
    // The local header and the central directory entry share one run of fields (APPNOTE 4.3.7 and
    // 4.3.12: version needed … file name length), at offset 4 and 6.
    const shared = (v: DataView, at: number): void => {
      v.setUint16(at, VERSION, true);
      v.setUint16(at + 2, UTF8_NAMES, true);
      v.setUint16(at + 4, 0, true); // stored
      v.setUint16(at + 6, DOS_TIME, true);
      v.setUint16(at + 8, DOS_DATE, true);
      v.setUint32(at + 10, crc, true);
      v.setUint32(at + 14, data.length, true);
      v.setUint32(at + 18, data.length, true);
      v.setUint16(at + 22, name.length, true);
    };
    const local = new Uint8Array(30 + name.length);
    const lv = new DataView(local.buffer);
    lv.setUint32(0, 0x04034b50, true);
    shared(lv, 4);
    lv.setUint16(28, 0, true);
    local.set(name, 30);
    const central = new Uint8Array(46 + name.length);
    const cv = new DataView(central.buffer);
    cv.setUint32(0, 0x02014b50, true);
    cv.setUint16(4, VERSION, true);
    shared(cv, 6);
    // extra length, comment length, disk number, internal attributes: 0
    cv.setUint32(38, 0, true); // external attributes
    cv.setUint32(42, offset, true);
    central.set(name, 46);
    locals.push(local, data);
    centrals.push(central);
    offset += local.length + data.length;
    if (offset > 0xffffffff) throw new RangeError('the archive passes the 4 GiB a ZIP without ZIP64 can hold');
  }
  const cdSize = centrals.reduce((a, c) => a + c.length, 0);
  const end = new Uint8Array(22);
  const ev = new DataView(end.buffer);
  ev.setUint32(0, 0x06054b50, true);
  ev.setUint16(8, entries.length, true);
  ev.setUint16(10, entries.length, true);
  ev.setUint32(12, cdSize, true);
  ev.setUint32(16, offset, true);
  const out = new Uint8Array(offset + cdSize + end.length);
  let at = 0;
  for (const part of [...locals, ...centrals, end]) {
    out.set(part, at);
    at += part.length;
  }
  return out;
}
