// Check a card's zip reader: what yazl (the bundle's writer, Zip64 forced too) and JSZip write reads
// back file for file, and broken or hostile zips get a clear message. Runs the same
// DecompressionStream code the browser does (Node has it too).
import { randomFillSync } from "node:crypto";
import { once } from "node:events";
import JSZip from "jszip";
import { describe, expect, it } from "vitest";
import { ZipFile } from "yazl";
import { buildZip } from "../fonts/zip-build";
import { CardZipError, readCardZip, type ReadAt } from "./card-zip";

const reader = (bytes: Uint8Array): ReadAt => async (offset, length) => bytes.slice(offset, offset + length);

async function yazlZip(files: { path: string; data: Uint8Array; compress: boolean }[], forceZip64Format: boolean): Promise<Uint8Array> {
  const zip = new ZipFile();
  for (const f of files) zip.addBuffer(Buffer.from(f.data), f.path, { compress: f.compress, forceZip64Format });
  zip.addEmptyDirectory("fonts/empty/");
  zip.end({ forceZip64Format, comment: "" });
  const parts: Buffer[] = [];
  zip.outputStream.on("data", (d: Buffer) => parts.push(d));
  await once(zip.outputStream, "end");
  return new Uint8Array(Buffer.concat(parts));
}

const wav = new Uint8Array(70_001);
randomFillSync(wav);
const text = new TextEncoder().encode("// config\n".repeat(500));
const files = [
  { path: "config.h", data: text, compress: true },
  { path: "fonts/Ashfall/hum.wav", data: wav, compress: false },
  { path: "fonts/Café/swing1.wav", data: wav.subarray(0, 999), compress: false },
];

async function read(bytes: Uint8Array, maxEntries = 100) {
  const entries = await readCardZip(bytes.length, reader(bytes), { maxEntries });
  return Promise.all(entries.map(async (e) => ({ path: e.path, size: e.size, data: await e.bytes() })));
}

describe("Check a card's zip reader", () => {
  for (const z64 of [false, true])
    it(`reads what yazl writes${z64 ? " with Zip64 records forced" : ""}: names, sizes and bytes, folders left out`, async () => {
      const got = await read(await yazlZip(files, z64));
      expect(got.map((g) => g.path)).toEqual(files.map((f) => f.path));
      for (const [i, f] of files.entries()) {
        expect(got[i].size).toBe(f.data.length);
        expect(Buffer.from(got[i].data).equals(Buffer.from(f.data))).toBe(true);
      }
    });

  it("reads what JSZip writes, deflated throughout", async () => {
    const j = new JSZip();
    for (const f of files) j.file(f.path, f.data);
    const got = await read(await j.generateAsync({ type: "uint8array", compression: "DEFLATE" }));
    expect(got.map((g) => [g.path, g.size])).toEqual(files.map((f) => [f.path, f.data.length]));
    expect(Buffer.from(got[0].data).equals(Buffer.from(text))).toBe(true);
  });

  it("lists sizes from the table of contents without reading any file", async () => {
    const bytes = await yazlZip(files, false);
    const reads: [number, number][] = [];
    const entries = await readCardZip(bytes.length, async (o, l) => (reads.push([o, l]), bytes.slice(o, o + l)), { maxEntries: 100 });
    expect(entries.map((e) => e.size)).toEqual(files.map((f) => f.data.length));
    // The tail and the directory only: far fewer bytes than the WAVs hold.
    expect(reads.reduce((n, [, l]) => n + l, 0)).toBeLessThan(wav.length);
  });

  it("refuses what is not a zip, a cut-off zip, too many entries, and a file that inflates past its stated size", async () => {
    await expect(read(new TextEncoder().encode("PNG pretending to be a zip"))).rejects.toThrow(/not a zip archive/);
    const whole = await yazlZip(files, false);
    await expect(read(whole.subarray(0, whole.length - 30))).rejects.toThrow(CardZipError);
    await expect(read(whole, 2)).rejects.toThrow(/has 4 entries; .*at most 2/);
    // A header that claims 100 bytes for a file that inflates to 5,000: stopped at 100.
    const bomb = buildZip([{ name: "config.h", data: new Uint8Array(5000), deflate: true, claimSize: 100 }]);
    await expect(read(new Uint8Array(bomb))).rejects.toThrow(/inflates to more than the 100 bytes/);
  });
});
