import { inflateSync } from 'node:zlib';

/**
 * A WOFF 1.0 font (W3C, "WOFF File Format 1.0", 2012) unpacked to the plain TrueType/OpenType file
 * it wraps. The PDF writer's font reader can read WOFF itself, but inflates its tables with a
 * JavaScript inflater: about 3 s of processor time per PDF for the drawing font, against a few
 * milliseconds for Node's zlib here. Table data and order are kept as they are; the offset table's
 * search fields are recomputed as the OpenType specification ("Organization of an OpenType Font")
 * defines them.
 * @throws Error naming what is wrong when the bytes are not a well-formed WOFF 1.0 file
 */
export function woffToSfnt(woff: Uint8Array): Uint8Array {
  const src = Buffer.from(woff.buffer, woff.byteOffset, woff.byteLength);
  const fail = (why: string): never => {
    throw new Error(`not a well-formed WOFF 1.0 font: ${why}`);
  };
  if (src.length < 44) fail(`${src.length} bytes, shorter than the 44-byte header`);
  if (src.readUInt32BE(0) !== 0x774f4646) fail('no "wOFF" signature');
  const flavor = src.readUInt32BE(4);
  const numTables = src.readUInt16BE(12);
  if (numTables === 0) fail('no tables');
  if (44 + 20 * numTables > src.length) fail(`the directory of ${numTables} tables runs past the end of the file`);

  const tables = Array.from({ length: numTables }, (_, i) => {
    const at = 44 + 20 * i;
    const [tag, offset, compLength, origLength, checksum] = [0, 4, 8, 12, 16].map((k) => src.readUInt32BE(at + k));
    const name = src.toString('latin1', at, at + 4);
    if (offset + compLength > src.length) fail(`table ${name} runs past the end of the file`);
    if (compLength > origLength) fail(`table ${name} is stored longer (${compLength} bytes) than it is (${origLength})`);
    const stored = src.subarray(offset, offset + compLength);
    const data = compLength < origLength ? inflateSync(stored) : stored;
    if (data.length !== origLength) fail(`table ${name} inflates to ${data.length} bytes, not ${origLength}`);
    return { tag, checksum, data };
  });

  const pad4 = (n: number): number => (n + 3) & ~3;
  const headerBytes = 12 + 16 * numTables;
  const out = Buffer.alloc(headerBytes + tables.reduce((s, t) => s + pad4(t.data.length), 0));
  const power = 2 ** Math.floor(Math.log2(numTables));
  out.writeUInt32BE(flavor, 0);
  out.writeUInt16BE(numTables, 4);
  out.writeUInt16BE(power * 16, 6);
  out.writeUInt16BE(Math.log2(power), 8);
  out.writeUInt16BE(numTables * 16 - power * 16, 10);
  let offset = headerBytes;
  tables.forEach((t, i) => {
    const at = 12 + 16 * i;
    out.writeUInt32BE(t.tag, at);
    out.writeUInt32BE(t.checksum, at + 4);
    out.writeUInt32BE(offset, at + 8);
    out.writeUInt32BE(t.data.length, at + 12);
    t.data.copy(out, offset);
    offset += pad4(t.data.length);
  });
  return new Uint8Array(out.buffer, out.byteOffset, out.byteLength);
}
