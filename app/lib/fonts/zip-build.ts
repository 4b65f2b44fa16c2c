// Builds zip archives byte by byte for tests, including the hostile ones a real zip tool would
// refuse to write: climbing names, symlinks, lying sizes, overlapping entries, non-UTF-8 names.
// Layout per PKWARE's APPNOTE (local headers, then the central directory, then its end record).
import { crc32, deflateRawSync } from "node:zlib";

export type ZipInput = {
  name: string | Uint8Array;
  data: Uint8Array;
  deflate?: boolean;
  /** Unix mode for the external attributes (e.g. 0o120777 for a symlink). */
  unixMode?: number;
  /** Sizes to write instead of the real ones (lying headers). */
  claimSize?: number;
  utf8Flag?: boolean;
};

export function buildZip(entries: ZipInput[], opts: { overlapSecondOntoFirst?: boolean } = {}): Buffer {
  const locals: Buffer[] = [];
  const cens: Buffer[] = [];
  let offset = 0;
  const offsets: number[] = [];
  for (const e of entries) {
    const name = typeof e.name === "string" ? Buffer.from(e.name, "utf8") : Buffer.from(e.name);
    const body = e.deflate ? deflateRawSync(e.data) : Buffer.from(e.data);
    const crc = crc32(e.data);
    const usize = e.claimSize ?? e.data.length;
    const flags = e.utf8Flag === false ? 0 : 0x800;
    const loc = Buffer.alloc(30);
    loc.writeUInt32LE(0x04034b50, 0);
    loc.writeUInt16LE(20, 4);
    loc.writeUInt16LE(flags, 6);
    loc.writeUInt16LE(e.deflate ? 8 : 0, 8);
    loc.writeUInt32LE(crc, 14);
    loc.writeUInt32LE(body.length, 18);
    loc.writeUInt32LE(usize, 22);
    loc.writeUInt16LE(name.length, 26);
    const entryOffset = opts.overlapSecondOntoFirst && offsets.length === 1 ? offsets[0] : offset;
    offsets.push(entryOffset);
    const cen = Buffer.alloc(46);
    cen.writeUInt32LE(0x02014b50, 0);
    cen.writeUInt16LE(e.unixMode !== undefined ? (3 << 8) | 20 : 20, 4);
    cen.writeUInt16LE(20, 6);
    cen.writeUInt16LE(flags, 8);
    cen.writeUInt16LE(e.deflate ? 8 : 0, 10);
    cen.writeUInt32LE(crc, 16);
    cen.writeUInt32LE(body.length, 20);
    cen.writeUInt32LE(usize, 24);
    cen.writeUInt16LE(name.length, 28);
    cen.writeUInt32LE(e.unixMode !== undefined ? (e.unixMode << 16) >>> 0 : 0, 38);
    cen.writeUInt32LE(entryOffset, 42);
    cens.push(Buffer.concat([cen, name]));
    if (!(opts.overlapSecondOntoFirst && offsets.length === 2)) {
      locals.push(loc, name, body);
      offset += 30 + name.length + body.length;
    }
  }
  const cd = Buffer.concat(cens);
  const end = Buffer.alloc(22);
  end.writeUInt32LE(0x06054b50, 0);
  end.writeUInt16LE(entries.length, 8);
  end.writeUInt16LE(entries.length, 10);
  end.writeUInt32LE(cd.length, 12);
  end.writeUInt32LE(offset, 16);
  return Buffer.concat([...locals, cd, end]);
}
