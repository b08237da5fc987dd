// WOFF 1.0 → the TrueType (sfnt) file it wraps, per the W3C recommendation "WOFF File Format
// 1.0" (2012), §3–5: a 44-byte header, one 20-byte directory entry per table (tag, offset,
// compLength, origLength, origChecksum), each table zlib-packed when compLength < origLength.
// The sfnt is rebuilt with the OpenType table directory (OpenType spec, "Organization of an
// OpenType font": offset table and 16-byte table records, tables 4-byte aligned).
// Done once per process: fontkit reading the WOFF itself unpacks a table on every access, and
// subsetting a proposal's fonts that way took seconds.
import { inflateSync } from "node:zlib";

const WOFF_SIGNATURE = 0x774f4646; // "wOFF"

export function woffToSfnt(woff: Uint8Array): Uint8Array {
  const src = new DataView(woff.buffer, woff.byteOffset, woff.byteLength);
  if (src.getUint32(0) !== WOFF_SIGNATURE) throw new Error("not a WOFF 1.0 file");
  const flavor = src.getUint32(4);
  const numTables = src.getUint16(12);
  const tables = Array.from({ length: numTables }, (_, i) => {
    const at = 44 + i * 20;
    const offset = src.getUint32(at + 4);
    const compLength = src.getUint32(at + 8);
    const origLength = src.getUint32(at + 12);
    const packed = woff.subarray(offset, offset + compLength);
    const data = compLength < origLength ? new Uint8Array(inflateSync(packed)) : packed;
    if (data.length !== origLength) throw new Error(`WOFF table ${i}: ${data.length} bytes unpacked, ${origLength} expected`);
    return { tag: src.getUint32(at), checksum: src.getUint32(at + 16), data };
  });
  const pad4 = (n: number) => (n + 3) & ~3;
  const headerLength = 12 + numTables * 16;
  const out = new Uint8Array(headerLength + tables.reduce((a, t) => a + pad4(t.data.length), 0));
  const dst = new DataView(out.buffer);
  // Offset table: searchRange = 16 × the largest power of 2 ≤ numTables, and so on.
  const entrySelector = Math.floor(Math.log2(numTables));
  dst.setUint32(0, flavor);
  dst.setUint16(4, numTables);
  dst.setUint16(6, 16 * 2 ** entrySelector);
  dst.setUint16(8, entrySelector);
  dst.setUint16(10, numTables * 16 - 16 * 2 ** entrySelector);
  let offset = headerLength;
  tables.forEach((t, i) => {
    const rec = 12 + i * 16;
    dst.setUint32(rec, t.tag);
    dst.setUint32(rec + 4, t.checksum);
    dst.setUint32(rec + 8, offset);
    dst.setUint32(rec + 12, t.data.length);
    out.set(t.data, offset);
    offset += pad4(t.data.length);
  });
  return out;
}
