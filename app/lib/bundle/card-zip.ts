// Reads a card's zip a piece at a time, for Check a card in the browser: the end record and the
// central directory first (names and sizes, so files whose size is wrong are never read), then
// one entry's bytes only when its hash is wanted. Memory stays at the directory plus one file,
// whatever the zip's size. Layout per PKWARE's APPNOTE.TXT 6.3 (end of central directory record,
// Zip64 end record and locator, central file header, local file header). Stored entries are
// read as they are; deflated ones go through the platform's DecompressionStream("deflate-raw").

/** Bytes [offset, offset + length) of the zip. */
export type ReadAt = (offset: number, length: number) => Promise<Uint8Array<ArrayBuffer>>;

export type CardZipEntry = {
  path: string;
  size: number;
  /** The entry's bytes, inflated; refuses with a clear message where it cannot. */
  bytes: () => Promise<Uint8Array<ArrayBuffer>>;
};

export class CardZipError extends Error {}

const EOCD = 0x06054b50;
const Z64_LOCATOR = 0x07064b50;
const Z64_EOCD = 0x06064b50;
const CEN = 0x02014b50;
const LOC = 0x04034b50;

const u16 = (b: Uint8Array, at: number) => b[at] | (b[at + 1] << 8);
const u32 = (b: Uint8Array, at: number) => (b[at] | (b[at + 1] << 8) | (b[at + 2] << 16) | (b[at + 3] << 24)) >>> 0;
/** A 64-bit little-endian size as a number; past 2^53 a zip is not a card's. */
function u64(b: Uint8Array, at: number): number {
  const n = u32(b, at) + u32(b, at + 4) * 2 ** 32;
  if (!Number.isSafeInteger(n)) throw new CardZipError("the zip gives a size too large to be real; it is damaged.");
  return n;
}

/** Deflate-raw through the platform's own decompressor, stopped as soon as it passes `expected` bytes. */
export type Inflate = (raw: Uint8Array, expected: number) => Promise<Uint8Array<ArrayBuffer>>;

export const platformInflate: Inflate = async (raw, expected) => {
  const reader = new Blob([raw as Uint8Array<ArrayBuffer>]).stream().pipeThrough(new DecompressionStream("deflate-raw")).getReader();
  const out = new Uint8Array(expected);
  let at = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    if (at + value.length > expected) {
      await reader.cancel();
      throw new CardZipError(`a file inflates to more than the ${expected.toLocaleString("en")} bytes the zip says; the zip is damaged or hostile.`);
    }
    out.set(value, at);
    at += value.length;
  }
  return out.subarray(0, at);
};

export async function readCardZip(total: number, readAt: ReadAt, o: { maxEntries: number; inflate?: Inflate }): Promise<CardZipEntry[]> {
  const inflate = o.inflate ?? platformInflate;
  const tailLen = Math.min(total, 22 + 65535);
  const tail = await readAt(total - tailLen, tailLen);
  let at = -1;
  for (let i = tailLen - 22; i >= 0; i--)
    if (u32(tail, i) === EOCD) {
      at = i;
      break;
    }
  if (at < 0) throw new CardZipError("it is not a zip archive (no end-of-archive record); it may be cut off.");
  let count = u16(tail, at + 10);
  let cdSize = u32(tail, at + 12);
  let cdOffset = u32(tail, at + 16);
  if (count === 0xffff || cdSize === 0xffffffff || cdOffset === 0xffffffff) {
    // Zip64: the locator sits just before the end record and points at the Zip64 end record.
    const locAt = total - tailLen + at - 20;
    if (locAt < 0) throw new CardZipError("its Zip64 records are missing; it is damaged.");
    const loc = await readAt(locAt, 20);
    if (u32(loc, 0) !== Z64_LOCATOR) throw new CardZipError("its Zip64 records are missing; it is damaged.");
    const z64At = u64(loc, 8);
    if (z64At + 56 > total) throw new CardZipError("its Zip64 end record points past the end of the file; it is damaged.");
    const z64 = await readAt(z64At, 56);
    if (u32(z64, 0) !== Z64_EOCD) throw new CardZipError("its Zip64 end record is damaged.");
    count = u64(z64, 32);
    cdSize = u64(z64, 40);
    cdOffset = u64(z64, 48);
  }
  if (count > o.maxEntries) throw new CardZipError(`the zip has ${count.toLocaleString("en")} entries; a card bundle has far fewer (at most ${o.maxEntries.toLocaleString("en")} are read).`);
  if (cdOffset + cdSize > total) throw new CardZipError("its table of contents points past the end of the file; it is cut off or damaged.");
  const cd = await readAt(cdOffset, cdSize);
  const utf8 = new TextDecoder("utf-8");
  const latin1 = new TextDecoder("latin1");
  const out: CardZipEntry[] = [];
  let p = 0;
  for (let n = 0; n < count; n++) {
    if (p + 46 > cd.length || u32(cd, p) !== CEN) throw new CardZipError(`its table of contents is damaged (entry ${n + 1}).`);
    const flags = u16(cd, p + 8);
    const method = u16(cd, p + 10);
    let compressed = u32(cd, p + 20);
    let size = u32(cd, p + 24);
    const nameLen = u16(cd, p + 28);
    const extraLen = u16(cd, p + 30);
    const commentLen = u16(cd, p + 32);
    let offset = u32(cd, p + 42);
    const nameBytes = cd.subarray(p + 46, p + 46 + nameLen);
    const path = (flags & 0x800 ? utf8 : latin1).decode(nameBytes);
    // Zip64 extra field (id 1): the 64-bit values, in this order, for those whose 32-bit field is all ones.
    const extra = cd.subarray(p + 46 + nameLen, p + 46 + nameLen + extraLen);
    for (let e = 0; e + 4 <= extra.length; ) {
      const id = u16(extra, e);
      const len = u16(extra, e + 2);
      if (id === 1) {
        let q = e + 4;
        if (size === 0xffffffff) (size = u64(extra, q)), (q += 8);
        if (compressed === 0xffffffff) (compressed = u64(extra, q)), (q += 8);
        if (offset === 0xffffffff) offset = u64(extra, q);
      }
      e += 4 + len;
    }
    p += 46 + nameLen + extraLen + commentLen;
    if (path.endsWith("/")) continue; // a folder
    const entryOffset = offset;
    const entryCompressed = compressed;
    const entrySize = size;
    out.push({
      path,
      size: entrySize,
      bytes: async () => {
        if (flags & 0x1) throw new CardZipError(`"${path}" is encrypted; a card bundle never is.`);
        if (method !== 0 && method !== 8) throw new CardZipError(`"${path}" is packed with method ${method}, which only stored and deflated files use here; zip it again with an ordinary zip tool.`);
        const head = await readAt(entryOffset, 30);
        if (u32(head, 0) !== LOC) throw new CardZipError(`"${path}" points at damaged data.`);
        const dataAt = entryOffset + 30 + u16(head, 26) + u16(head, 28);
        if (dataAt + entryCompressed > total) throw new CardZipError(`"${path}" runs past the end of the zip; it is cut off.`);
        const raw = await readAt(dataAt, entryCompressed);
        const data = method === 0 ? raw : await inflate(raw, entrySize);
        if (data.length !== entrySize) throw new CardZipError(`"${path}" is ${data.length.toLocaleString("en")} bytes where the zip says ${entrySize.toLocaleString("en")}; the zip is damaged.`);
        return data;
      },
    });
  }
  return out;
}

/** A File (or any Blob) as a ReadAt. */
export const blobReader =
  (blob: Blob): ReadAt =>
  async (offset, length) =>
    new Uint8Array(await blob.slice(offset, offset + length).arrayBuffer());
