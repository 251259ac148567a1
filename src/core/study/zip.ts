/**
 * A minimal ZIP writer (stored entries, no compression), enough to hand a study export to the browser as
 * one download. Layout per the .ZIP File Format Specification (PKWARE APPNOTE.TXT, version 6.3.x):
 * local file header (signature 0x04034b50) + name + data for each entry, then the central directory
 * (0x02014b50 per entry) and the end-of-central-directory record (0x06054b50). Names are UTF-8 (general
 * purpose flag bit 11). CRC-32 is the IEEE 802.3 polynomial 0xEDB88320 (reflected), check value
 * CRC32("123456789") = 0xCBF43926 (Williams 1993, "A painless guide to CRC error detection algorithms").
 * Entries and the archive stay below 4 GiB (no ZIP64).
 */

const CRC_TABLE = (() => {
  const t = new Uint32Array(256);
  for (let n = 0; n < 256; n++) {
    let c = n;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
    t[n] = c >>> 0;
  }
  return t;
})();

export function crc32(bytes: Uint8Array): number {
  let c = 0xffffffff;
  for (let i = 0; i < bytes.length; i++) c = CRC_TABLE[(c ^ bytes[i]) & 0xff] ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}

export interface ZipEntry {
  /** "/"-separated path inside the archive, no leading "/". */
  readonly path: string;
  readonly data: Uint8Array | string;
}

/** MS-DOS date and time fields of a Date (local fields as given; 2-second resolution). */
function dosDateTime(d: Date): { time: number; date: number } {
  const year = Math.min(Math.max(d.getUTCFullYear(), 1980), 2107);
  return {
    time: (d.getUTCHours() << 11) | (d.getUTCMinutes() << 5) | (d.getUTCSeconds() >> 1),
    date: ((year - 1980) << 9) | ((d.getUTCMonth() + 1) << 5) | d.getUTCDate(),
  };
}

export function zipStore(entries: readonly ZipEntry[], modified = new Date()): Uint8Array {
  const enc = new TextEncoder();
  const { time, date } = dosDateTime(modified);
  const files = entries.map((e) => {
    if (e.path === '' || e.path.startsWith('/') || e.path.split('/').includes('..')) throw new RangeError(`zipStore: bad entry path "${e.path}"`);
    const data = typeof e.data === 'string' ? enc.encode(e.data) : e.data;
    return { name: enc.encode(e.path), data, crc: crc32(data) };
  });
  const localSize = files.reduce((s, f) => s + 30 + f.name.length + f.data.length, 0);
  const centralSize = files.reduce((s, f) => s + 46 + f.name.length, 0);
  const total = localSize + centralSize + 22;
  if (total > 0xffffffff || files.length > 0xffff) throw new RangeError('zipStore: archive too large for a ZIP without ZIP64');
  const out = new Uint8Array(total);
  const v = new DataView(out.buffer);
  let p = 0;
  const offsets: number[] = [];
  for (const f of files) {
    offsets.push(p);
    v.setUint32(p, 0x04034b50, true);
    v.setUint16(p + 4, 20, true); // version needed: 2.0
    v.setUint16(p + 6, 0x0800, true); // bit 11: UTF-8 names
    v.setUint16(p + 8, 0, true); // method: stored
    v.setUint16(p + 10, time, true);
    v.setUint16(p + 12, date, true);
    v.setUint32(p + 14, f.crc, true);
    v.setUint32(p + 18, f.data.length, true);
    v.setUint32(p + 22, f.data.length, true);
    v.setUint16(p + 26, f.name.length, true);
    v.setUint16(p + 28, 0, true);
    out.set(f.name, p + 30);
    out.set(f.data, p + 30 + f.name.length);
    p += 30 + f.name.length + f.data.length;
  }
  const central = p;
  for (const [i, f] of files.entries()) {
    v.setUint32(p, 0x02014b50, true);
    v.setUint16(p + 4, 20, true); // version made by
    v.setUint16(p + 6, 20, true);
    v.setUint16(p + 8, 0x0800, true);
    v.setUint16(p + 10, 0, true);
    v.setUint16(p + 12, time, true);
    v.setUint16(p + 14, date, true);
    v.setUint32(p + 16, f.crc, true);
    v.setUint32(p + 20, f.data.length, true);
    v.setUint32(p + 24, f.data.length, true);
    v.setUint16(p + 28, f.name.length, true);
    // extra, comment, disk, internal attributes: 0; external attributes: 0
    v.setUint32(p + 42, offsets[i], true);
    out.set(f.name, p + 46);
    p += 46 + f.name.length;
  }
  v.setUint32(p, 0x06054b50, true);
  v.setUint16(p + 8, files.length, true);
  v.setUint16(p + 10, files.length, true);
  v.setUint32(p + 12, centralSize, true);
  v.setUint32(p + 16, central, true);
  return out;
}
