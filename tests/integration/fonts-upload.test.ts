// The font upload from multipart body to stored rows, on a real PostgreSQL database and a disk
// store in a temporary folder. Every hostile input is built here, refused with its own message,
// and leaves the build, the rows and the stored files exactly as they were.
import { mkdtempSync, readdirSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import type { Kysely } from "kysely";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { simpleWav, riff, chunk, fmtBody, pcmBytes } from "~/lib/audio/wav-build";
import type { Database } from "~/lib/db/types";
import { acceptUpload } from "~/lib/fonts/accept.server";
import { DEFAULT_LAYOUT } from "~/lib/fonts/layout";
import { receiveUpload, type UploadLimits } from "~/lib/fonts/receive.server";
import { buildZip, type ZipInput } from "~/lib/fonts/zip-build";
import { UploadRefused } from "~/lib/fonts/zip.server";
import { DiskStorage } from "~/lib/storage/disk.server";
import { seed } from "../../db/seed";
import { freshDb, hasDatabase } from "./db";

const work = mkdtempSync(path.join(tmpdir(), "hb-fonts-"));
afterAll(() => rmSync(work, { recursive: true, force: true }));
const MB = 1024 * 1024;
const LIMITS: UploadLimits = { maxFileBytes: 2 * MB, maxTotalBytes: 8 * MB, maxFiles: 2000 };

const tone = (frames: number, f = 220) => Array.from({ length: frames }, (_, i) => 0.4 * Math.sin((2 * Math.PI * f * i) / 44100));
const wav = (frames: number, f?: number) => simpleWav(tone(frames, f));

function formRequest(files: { name: string; bytes: Uint8Array }[], fields: Record<string, string> = {}) {
  const form = new FormData();
  for (const [k, v] of Object.entries(fields)) form.append(k, v);
  for (const f of files) form.append("files", new Blob([Buffer.from(f.bytes)]), f.name);
  return new Request("http://127.0.0.1/upload", { method: "POST", body: form });
}

describe.runIf(hasDatabase)("font uploads (PostgreSQL, disk storage)", () => {
  let db: Kysely<Database>;
  let ws: string;
  let buildId: string;
  const store = new DiskStorage(path.join(work, "files"));
  const tmpRoot = path.join(work, "staging");

  async function upload(req: Request, fontId = "northlight", limits = LIMITS) {
    const got = await receiveUpload(req, limits, tmpRoot);
    try {
      return await acceptUpload(db, store, { workshopId: ws, buildId, fontId, userId: null, layout: DEFAULT_LAYOUT, files: got.files, ignored: got.ignored });
    } finally {
      rmSync(got.dir, { recursive: true, force: true });
    }
  }

  async function snapshot() {
    const build = await db.selectFrom("builds").select(["config", "config_version"]).where("id", "=", buildId).executeTakeFirstOrThrow();
    const uploads = await db.selectFrom("font_uploads").select((eb) => eb.fn.countAll<number>().as("n")).executeTakeFirstOrThrow();
    const files = await db.selectFrom("stored_files").select("sha256").orderBy("sha256").execute();
    const onDisk = (() => {
      try {
        return readdirSync(path.join(work, "files", "sha256"), { recursive: true }).map(String).sort();
      } catch {
        return [];
      }
    })();
    return { build, uploads: Number(uploads.n), files, onDisk };
  }

  async function expectRefused(make: () => Request, message: RegExp, limits = LIMITS) {
    const before = await snapshot();
    const err = await upload(make(), "northlight", limits).then(
      () => null,
      (e) => e,
    );
    expect(err).toBeInstanceOf(UploadRefused);
    expect((err as UploadRefused).message).toMatch(message);
    expect((err as UploadRefused).status).toBeGreaterThanOrEqual(400);
    expect((err as UploadRefused).status).toBeLessThan(500);
    expect(await snapshot()).toEqual(before);
    expect(readdirSync(tmpRoot)).toEqual([]);
  }

  beforeAll(async () => {
    db = await freshDb();
    ws = (await seed(db)).workshopId;
    buildId = (await db.selectFrom("builds").select("id").where("name", "=", "Kestrel").executeTakeFirstOrThrow()).id;
  });

  it("accepts a zip of WAVs in a top folder: stores each distinct file once, records rows, and marks the font received with its cues", async () => {
    const hum = wav(44100);
    const zip = buildZip([
      { name: "Northlight/", data: new Uint8Array(0) },
      { name: "Northlight/hum.wav", data: hum, deflate: true },
      { name: "Northlight/hum-2.wav", data: hum, deflate: true },
      { name: "Northlight/ignite.wav", data: wav(22050, 330), deflate: true },
      { name: "Northlight/clash/1.wav", data: wav(4410, 880) },
      { name: "Northlight/readme.txt", data: new TextEncoder().encode("thanks") },
      { name: "__MACOSX/Northlight/._hum.wav", data: new Uint8Array(10) },
    ]);
    const r = await upload(formRequest([{ name: "northlight.zip", bytes: zip }]));
    expect(r.report.status).toBe("received");
    expect(r.report.present).toEqual(["hum", "clash", "ignite"]);
    expect(r.report.cues.hum.variants).toBe(2);
    expect(r.report.ignored).toEqual(["readme.txt"]);
    const { build, files } = await snapshot();
    const font = build.config.fonts.find((f) => f.id === "northlight")!;
    expect(font).toMatchObject({ status: "received", cues: ["hum", "clash", "ignite"], igniteMs: 500 });
    expect(files).toHaveLength(3);
    const rows = await db.selectFrom("font_files").select(["path", "cue", "size"]).where("upload_id", "=", r.uploadId).orderBy("path").execute();
    expect(rows.map((x) => [x.path, x.cue])).toEqual([["clash/1.wav", "clash"], ["hum-2.wav", "hum"], ["hum.wav", "hum"], ["ignite.wav", "ignite"]]);
  });

  it("accepts many WAVs at once; the same bytes uploaded again are not stored twice", async () => {
    const before = await snapshot();
    const r = await upload(formRequest([{ name: "hum.wav", bytes: wav(44100) }, { name: "swing1.wav", bytes: wav(8820, 440) }], { layout: DEFAULT_LAYOUT.name }));
    expect(r.report.present).toEqual(["hum", "swing"]);
    const after = await snapshot();
    expect(after.files.length).toBe(before.files.length + 1);
    expect(after.build.config_version).toBe(before.build.config_version + 1);
  });

  it("a font without a hum arrives broken: stored, marked invalid, and the build says so", async () => {
    const r = await upload(formRequest([{ name: "clash.wav", bytes: wav(4410, 990) }]), "tidebreak");
    expect(r.report.status).toBe("invalid");
    const { build } = await snapshot();
    expect(build.config.fonts.find((f) => f.id === "tidebreak")).toMatchObject({ status: "invalid", cues: ["clash"] });
  });

  const zipReq = (entries: ZipInput[], opts?: Parameters<typeof buildZip>[1]) => () => formRequest([{ name: "font.zip", bytes: buildZip(entries, opts) }]);
  const ok = wav(100);

  it.each([
    ["../ climbing out", [{ name: "../evil.wav", data: ok }], /climbs out of its folder/],
    ["an absolute path", [{ name: "/etc/hum.wav", data: ok }], /absolute path/],
    ["a backslash climb", [{ name: "..\\evil.wav", data: ok }], /backslash/],
    ["a drive letter", [{ name: "C:/hum.wav", data: ok }], /drive letter/],
    ["a symlink", [{ name: "hum.wav", data: new TextEncoder().encode("/etc/passwd"), unixMode: 0o120777 }], /symbolic link/],
    ["names differing only in case", [{ name: "Hum.wav", data: ok }, { name: "hum.WAV", data: ok }], /differ only in case/],
    ["the same name twice", [{ name: "hum.wav", data: ok }, { name: "hum.wav", data: ok }], /twice/],
    ["a non-UTF-8 name", [{ name: Uint8Array.from([0x68, 0x75, 0x6d, 0xe9, 0x2e, 0x77, 0x61, 0x76]), data: ok, utf8Flag: false }], /not UTF-8/],
  ] as [string, ZipInput[], RegExp][])("refuses a zip with %s", async (_what, entries, message) => {
    await expectRefused(zipReq(entries), message);
  });

  it("refuses 10,000 tiny entries", async () => {
    const entries = Array.from({ length: 10000 }, (_, i) => ({ name: `f${i}.wav`, data: new Uint8Array(1) }));
    await expectRefused(zipReq(entries), /has 10,000 entries; at most 2,000/);
  });

  it("refuses a tiny zip whose header claims about 4 GB, and one that inflates past what its header says", async () => {
    await expectRefused(zipReq([{ name: "hum.wav", data: ok, claimSize: 0xfffffffe }]), /would unpack to 4,096 MB/);
    // 3 MB of silence deflates to about 3 KB; the header claims 1 KB, the real bytes are counted.
    const bomb = [{ name: "hum.wav", data: new Uint8Array(3 * MB), deflate: true, claimSize: 1024 }];
    expect(buildZip(bomb).length).toBeLessThan(8 * 1024);
    await expectRefused(zipReq(bomb), /inflates to more than its header says/);
    // Honest header, but more than a file may have once inflated.
    await expectRefused(zipReq([{ name: "hum.wav", data: new Uint8Array(3 * MB), deflate: true }]), /would unpack to 3 MB; a file may have at most 2 MB/);
  });

  it("refuses a small zip whose entries claim 10 GB in all, at the real caps, before inflating a byte", async () => {
    // 200 entries that each claim 52 MB (under the 60 MB a file may have): 10.4 GB in all, in a
    // zip of a few kilobytes. The claimed total is refused from the table of contents alone.
    const DEFAULTS: UploadLimits = { maxFileBytes: 60 * MB, maxTotalBytes: 1024 * MB, maxFiles: 2000 };
    const entries = Array.from({ length: 200 }, (_, i) => ({ name: `h${i}.wav`, data: ok.subarray(0, 1), deflate: true, claimSize: 52 * MB }));
    expect(buildZip(entries).length).toBeLessThan(24 * 1024);
    await expectRefused(zipReq(entries), /would unpack to more than 1,024 MB; that is more than an upload may hold/, DEFAULTS);
  });

  it("never opens a zip inside a zip (the nested zip-of-zips bomb): inner archives are left out", async () => {
    // Each level holds the next one stored; the innermost is 3 MB of silence, about 3 KB deflated.
    const inner = buildZip([{ name: "hum.wav", data: new Uint8Array(3 * MB), deflate: true }]);
    const middle = buildZip(Array.from({ length: 8 }, (_, i) => ({ name: `level2-${i}.zip`, data: inner })));
    const outer = buildZip([{ name: "level1.zip", data: middle, deflate: true }]);
    expect(outer.length).toBeLessThan(8 * 1024);
    await expectRefused(() => formRequest([{ name: "font.zip", bytes: outer }]), /holds no WAV files \(only level1\.zip\)/);
  });

  it("refuses overlapping entries (the zip-bomb trick of sharing compressed bytes)", async () => {
    await expectRefused(zipReq([{ name: "a.wav", data: ok }, { name: "b.wav", data: ok }], { overlapSecondOntoFirst: true }), /entries overlap/);
  });

  it("refuses a WAV whose data chunk claims 4 GB, and a PNG named .wav", async () => {
    const liar = riff([chunk("fmt ", fmtBody({ channels: 1, rate: 44100, bits: 16 })), chunk("data", pcmBytes(tone(100), 16), { claim: 0xfffffff0 })]);
    await expectRefused(() => formRequest([{ name: "hum.wav", bytes: wav(1000) }, { name: "swing.wav", bytes: liar }]), /swing\.wav: The data chunk claims 4,294,967,280 bytes/);
    const png = Uint8Array.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13, 0x49, 0x48, 0x44, 0x52, 0, 0, 0, 1, 0, 0, 0, 1, 8, 6, 0, 0, 0, 0x1f, 0x15, 0xc4, 0x89]);
    await expectRefused(() => formRequest([{ name: "hum.wav", bytes: png }]), /hum\.wav: The file is a PNG file \(image\/png\), not a WAV file/);
  });

  it("refuses an upload cut off halfway", async () => {
    const bytes = wav(20000);
    const boundary = "----hbcut";
    const head = `--${boundary}\r\nContent-Disposition: form-data; name="files"; filename="hum.wav"\r\nContent-Type: audio/wav\r\n\r\n`;
    const body = Buffer.concat([Buffer.from(head), Buffer.from(bytes.subarray(0, bytes.length / 2))]);
    await expectRefused(() => new Request("http://127.0.0.1/upload", { method: "POST", body, headers: { "content-type": `multipart/form-data; boundary=${boundary}` } }), /cut off/);
  });

  it("refuses files over the per-file and per-upload caps, and bodies that are not multipart", async () => {
    await expectRefused(() => formRequest([{ name: "hum.wav", bytes: wav(1_100_000) }]), /larger than 2 MB/);
    await expectRefused(() => formRequest([{ name: "hum.wav", bytes: wav(800_000) }, { name: "hum2.wav", bytes: wav(800_000, 300) }, { name: "hum3.wav", bytes: wav(800_000, 500) }]), /more than 4 MB/, { ...LIMITS, maxTotalBytes: 4 * MB });
    await expectRefused(() => new Request("http://127.0.0.1/upload", { method: "POST", body: "hum", headers: { "content-type": "text/plain" } }), /multipart\/form-data/);
    await expectRefused(() => formRequest([{ name: "notes.txt", bytes: new Uint8Array(3) }]), /no WAV files/);
  });
});
