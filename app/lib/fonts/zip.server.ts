// Reads an uploaded zip from a temporary file without trusting it: the central directory is
// parsed here (PKWARE APPNOTE 6.3 layout), every name is checked before use, sizes the headers
// claim are capped, entries that overlap (a zip bomb's trick) are refused, and each entry is
// inflated as a stream whose real output is counted and cut off at the cap. Memory stays at
// the central directory plus one piece of one entry. (JSZip was not used: it loads the whole
// archive into memory and silently renames or merges unsafe and duplicate names; decision 014.)
import { createReadStream } from "node:fs";
import { open } from "node:fs/promises";
import { Readable, Transform } from "node:stream";
import { createInflateRaw, crc32 } from "node:zlib";
import { checkEntryName, decodeName, findCaseClash, isJunk } from "./names";

export class UploadRefused extends Error {
  constructor(
    message: string,
    readonly status = 400,
  ) {
    super(message);
  }
}

export type ZipLimits = { maxEntries: number; maxEntryBytes: number; maxTotalBytes: number };
export type ZipEntry = { path: string; method: 0 | 8; compressedSize: number; size: number; crc: number; dataStart: number };

const EOCD = 0x06054b50;
const CEN = 0x02014b50;
const LOC = 0x04034b50;
const S_IFMT = 0o170000;
const S_IFLNK = 0o120000;
const mb = (n: number) => `${Math.round(n / 1048576).toLocaleString("en")} MB`;

export async function readZipDirectory(file: string, limits: ZipLimits, label = "The zip"): Promise<ZipEntry[]> {
  const fh = await open(file, "r");
  try {
    const { size } = await fh.stat();
    const tailLen = Math.min(size, 22 + 65535);
    const tail = Buffer.alloc(tailLen);
    await fh.read(tail, 0, tailLen, size - tailLen);
    let at = -1;
    for (let i = tailLen - 22; i >= 0; i--)
      if (tail.readUInt32LE(i) === EOCD) {
        at = i;
        break;
      }
    if (at < 0) throw new UploadRefused(`${label} is not a zip archive (no end-of-archive record); it may be cut off.`);
    const count = tail.readUInt16LE(at + 10);
    const cdSize = tail.readUInt32LE(at + 12);
    const cdOffset = tail.readUInt32LE(at + 16);
    if (count === 0xffff || cdOffset === 0xffffffff || cdSize === 0xffffffff) throw new UploadRefused(`${label} is a Zip64 archive; a font never needs one. Zip the files again with an ordinary zip tool.`);
    if (tail.readUInt16LE(at + 4) !== 0 || tail.readUInt16LE(at + 8) !== count) throw new UploadRefused(`${label} is split over several parts; upload it as one archive.`);
    if (count > limits.maxEntries) throw new UploadRefused(`${label} has ${count.toLocaleString("en")} entries; at most ${limits.maxEntries.toLocaleString("en")} are accepted.`, 413);
    if (cdOffset + cdSize > size) throw new UploadRefused(`${label}'s table of contents points past the end of the file; it is cut off or damaged.`);
    const cd = Buffer.alloc(cdSize);
    await fh.read(cd, 0, cdSize, cdOffset);

    const raw: (ZipEntry & { offset: number })[] = [];
    let declaredTotal = 0;
    let p = 0;
    for (let n = 0; n < count; n++) {
      if (p + 46 > cd.length || cd.readUInt32LE(p) !== CEN) throw new UploadRefused(`${label}'s table of contents is damaged (entry ${n + 1}).`);
      const madeBy = cd.readUInt16LE(p + 4);
      const flags = cd.readUInt16LE(p + 8);
      const method = cd.readUInt16LE(p + 10);
      const crc = cd.readUInt32LE(p + 16);
      const csize = cd.readUInt32LE(p + 20);
      const usize = cd.readUInt32LE(p + 24);
      const nameLen = cd.readUInt16LE(p + 28);
      const extraLen = cd.readUInt16LE(p + 30);
      const commentLen = cd.readUInt16LE(p + 32);
      const external = cd.readUInt32LE(p + 38);
      const offset = cd.readUInt32LE(p + 42);
      const nameBytes = cd.subarray(p + 46, p + 46 + nameLen);
      p += 46 + nameLen + extraLen + commentLen;
      const name = decodeName(nameBytes);
      if (name === null) throw new UploadRefused(`${label} has an entry whose name is not UTF-8 text (an old code page); zip it again with a tool that writes UTF-8 names.`);
      const checked = checkEntryName(name);
      if (!checked.ok) throw new UploadRefused(`${label} was refused: ${checked.message}`);
      if (madeBy >> 8 === 3 && ((external >>> 16) & S_IFMT) === S_IFLNK) throw new UploadRefused(`${label} was refused: ${JSON.stringify(name)} is a symbolic link; fonts are plain files.`);
      if (name.endsWith("/")) continue;
      if (isJunk(checked.path)) continue;
      if (flags & 1) throw new UploadRefused(`${label} was refused: ${JSON.stringify(name)} is encrypted.`);
      if (method !== 0 && method !== 8) throw new UploadRefused(`${label} was refused: ${JSON.stringify(name)} is compressed with method ${method}; only stored and deflated entries are read.`);
      if (csize === 0xffffffff || usize === 0xffffffff) throw new UploadRefused(`${label} is a Zip64 archive; a font never needs one.`);
      if (usize > limits.maxEntryBytes) throw new UploadRefused(`${label} was refused: ${JSON.stringify(name)} would unpack to ${mb(usize)}; a file may have at most ${mb(limits.maxEntryBytes)}.`, 413);
      declaredTotal += usize;
      if (declaredTotal > limits.maxTotalBytes) throw new UploadRefused(`${label} would unpack to more than ${mb(limits.maxTotalBytes)}; that is more than an upload may hold.`, 413);
      raw.push({ path: checked.path, method, compressedSize: csize, size: usize, crc, dataStart: 0, offset });
    }
    const clash = findCaseClash(raw.map((e) => e.path));
    if (clash) {
      const [a, b] = clash;
      throw new UploadRefused(
        a === b ? `${label} holds ${JSON.stringify(a)} twice.` : `${label} holds ${JSON.stringify(a)} and ${JSON.stringify(b)}, which differ only in case; an SD card cannot keep both.`,
      );
    }
    // Local headers: where each entry's data starts, and whether entries share bytes.
    const head = Buffer.alloc(30);
    for (const e of raw) {
      await fh.read(head, 0, 30, e.offset);
      if (e.offset + 30 > size || head.readUInt32LE(0) !== LOC) throw new UploadRefused(`${label}'s entry ${JSON.stringify(e.path)} points at damaged data.`);
      e.dataStart = e.offset + 30 + head.readUInt16LE(26) + head.readUInt16LE(28);
      if (e.dataStart + e.compressedSize > cdOffset) throw new UploadRefused(`${label}'s entry ${JSON.stringify(e.path)} runs past the end of the data; the archive is cut off or damaged.`);
    }
    const byOffset = [...raw].sort((a, b) => a.offset - b.offset);
    for (let i = 1; i < byOffset.length; i++)
      if (byOffset[i].offset < byOffset[i - 1].dataStart + byOffset[i - 1].compressedSize)
        throw new UploadRefused(`${label} was refused: its entries overlap (${JSON.stringify(byOffset[i - 1].path)} and ${JSON.stringify(byOffset[i].path)}), a trick used by zip bombs.`);
    return raw.map(({ offset: _offset, ...e }) => e);
  } finally {
    await fh.close();
  }
}

/** A counter shared by the entries of one upload: real inflated bytes, never the headers' word. */
export type InflateBudget = { total: number; maxTotalBytes: number; maxEntryBytes: number };

/** The entry's bytes, inflated as a stream; errors with UploadRefused past a cap or on a bad CRC. */
export function openEntry(file: string, e: ZipEntry, budget: InflateBudget, label = "The zip"): Readable {
  const raw = e.compressedSize === 0 ? Readable.from([]) : createReadStream(file, { start: e.dataStart, end: e.dataStart + e.compressedSize - 1 });
  let seen = 0;
  let crc = 0;
  const counter = new Transform({
    transform(chunk: Buffer, _enc, done) {
      seen += chunk.length;
      budget.total += chunk.length;
      if (seen > budget.maxEntryBytes || seen > e.size)
        return done(new UploadRefused(`${label} was refused: ${JSON.stringify(e.path)} inflates to more than ${seen > e.size ? "its header says" : mb(budget.maxEntryBytes)} (a zip bomb or a damaged archive).`, 413));
      if (budget.total > budget.maxTotalBytes) return done(new UploadRefused(`${label} inflates to more than ${mb(budget.maxTotalBytes)}; that is more than an upload may hold.`, 413));
      crc = crc32(chunk, crc);
      done(null, chunk);
    },
    flush(done) {
      if (seen !== e.size) return done(new UploadRefused(`${label}'s entry ${JSON.stringify(e.path)} is ${seen} bytes where its header says ${e.size}; the archive is damaged.`));
      if (crc !== e.crc) return done(new UploadRefused(`${label}'s entry ${JSON.stringify(e.path)} fails its checksum; the archive is damaged.`));
      done();
    },
  });
  const fail = (err: Error) => counter.destroy(err instanceof UploadRefused ? err : new UploadRefused(`${label}'s entry ${JSON.stringify(e.path)} cannot be unpacked (${err.message}); the archive is damaged.`));
  raw.on("error", fail);
  if (e.method === 8) {
    const inflate = createInflateRaw();
    inflate.on("error", fail);
    raw.pipe(inflate).pipe(counter);
    counter.on("close", () => inflate.destroy());
  } else raw.pipe(counter);
  counter.on("close", () => raw.destroy());
  return counter;
}
