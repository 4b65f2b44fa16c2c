// Receives a font upload: a multipart body with WAV files and/or zips, streamed through busboy
// into a staging folder with caps on every file, the whole upload and the number of files. Zips
// are spooled to disk first and then unpacked entry by entry (zip.server.ts). Any refusal
// removes the staging folder; nothing here touches storage or the database.
import busboy from "busboy";
import { randomUUID } from "node:crypto";
import { createWriteStream } from "node:fs";
import { mkdir, rm } from "node:fs/promises";
import path from "node:path";
import { Readable } from "node:stream";
import { pipeline } from "node:stream/promises";
import { Transform } from "node:stream";
import { checkEntryName, findCaseClash, isJunk, stripCommonFolder } from "./names";
import { stageWav, type StagedFile } from "./stage.server";
import { openEntry, readZipDirectory, UploadRefused } from "./zip.server";

export type UploadLimits = { maxFileBytes: number; maxTotalBytes: number; maxFiles: number };
export type Received = { dir: string; files: StagedFile[]; ignored: string[]; fields: Record<string, string> };

const mb = (n: number) => `${Math.round(n / 1048576).toLocaleString("en")} MB`;
const CUT_OFF = "The upload was cut off before it finished; nothing was stored. Try again.";

export async function receiveUpload(request: Request, limits: UploadLimits, tmpRoot: string): Promise<Received> {
  const type = request.headers.get("content-type") ?? "";
  if (!/^multipart\/form-data;/i.test(type)) throw new UploadRefused("Send the files as multipart/form-data.", 415);
  const declared = Number(request.headers.get("content-length") ?? "0");
  if (declared > limits.maxTotalBytes + 1024 * 1024) throw new UploadRefused(`The upload is ${mb(declared)}; at most ${mb(limits.maxTotalBytes)} are accepted at once.`, 413);
  if (!request.body) throw new UploadRefused("The upload is empty.");
  const dir = path.join(tmpRoot, `upload-${randomUUID()}`);
  await mkdir(dir, { recursive: true });
  try {
    const got = await parseParts(request, limits, dir);
    return { dir, ...(await unpack(got, limits, dir)) };
  } catch (e) {
    await rm(dir, { recursive: true, force: true });
    throw e;
  }
}

type Parts = { files: StagedFile[]; zips: { name: string; tmp: string }[]; ignored: string[]; fields: Record<string, string>; total: number };

function parseParts(request: Request, limits: UploadLimits, dir: string): Promise<Parts> {
  return new Promise((resolve, reject) => {
    const parts: Parts = { files: [], zips: [], ignored: [], fields: {}, total: 0 };
    let failed: Error | null = null;
    let finished = false;
    const work: Promise<unknown>[] = [];
    const open = new Set<Readable>();
    const body = Readable.fromWeb(request.body as import("node:stream/web").ReadableStream<Uint8Array>);
    const count = (n: number) => {
      parts.total += n;
      if (parts.total > limits.maxTotalBytes) throw new UploadRefused(`The upload holds more than ${mb(limits.maxTotalBytes)}; that is the most one upload may hold.`, 413);
    };
    const finish = () => {
      if (finished) return;
      finished = true;
      void Promise.allSettled(work).then(() => (failed ? reject(failed) : resolve(parts)));
    };
    // The first refusal stops the parse: the rest of the body is not read, open parts are closed.
    const stop = (e: unknown) => {
      if (failed) return;
      failed = e instanceof Error ? e : new Error(String(e));
      body.unpipe();
      body.destroy();
      bb.destroy();
      for (const s of open) s.destroy();
      finish();
    };
    let bb: busboy.Busboy;
    try {
      bb = busboy({ headers: { "content-type": request.headers.get("content-type")! }, limits: { files: limits.maxFiles, fields: 20, fieldSize: 2000, parts: limits.maxFiles + 20 } });
    } catch {
      return reject(new UploadRefused("The upload's multipart header is malformed."));
    }
    bb.on("field", (name, value) => void (parts.fields[name] = value));
    bb.on("filesLimit", () => stop(new UploadRefused(`The upload holds more than ${limits.maxFiles.toLocaleString("en")} files; that is the most one upload may hold.`, 413)));
    bb.on("file", (_field, stream, info) => {
      if (failed) return void stream.resume();
      const name = info.filename ?? "";
      const checked = checkEntryName(name);
      if (!checked.ok) return void stop(new UploadRefused(`A file was refused: ${checked.message}`));
      const lower = checked.path.toLowerCase();
      open.add(stream);
      const done = () => open.delete(stream);
      if (lower.endsWith(".zip")) {
        const tmp = path.join(dir, `${randomUUID()}.zip`);
        const counter = new Transform({
          transform(chunk: Buffer, _e, cb) {
            try {
              count(chunk.length);
              cb(null, chunk);
            } catch (err) {
              cb(err as Error);
            }
          },
        });
        work.push(pipeline(stream, counter, createWriteStream(tmp)).then(() => void parts.zips.push({ name: checked.path, tmp }), stop).finally(done));
      } else if (lower.endsWith(".wav")) {
        work.push(stageWav(stream, checked.path, dir, limits.maxFileBytes, count).then((f) => void parts.files.push(f), stop).finally(done));
      } else {
        if (!isJunk(checked.path)) parts.ignored.push(checked.path);
        stream.on("end", done);
        stream.resume();
      }
    });
    bb.on("error", (e) => stop(new UploadRefused(`${CUT_OFF} (${(e as Error).message})`)));
    bb.on("close", finish);
    body.on("error", () => stop(new UploadRefused(CUT_OFF)));
    body.pipe(bb);
  });
}

async function unpack(parts: Parts, limits: UploadLimits, dir: string): Promise<Omit<Received, "dir">> {
  const files = [...parts.files];
  const ignored = [...parts.ignored];
  const budget = { total: 0, maxTotalBytes: limits.maxTotalBytes, maxEntryBytes: limits.maxFileBytes };
  for (const zip of parts.zips) {
    const label = `The zip ${JSON.stringify(zip.name)}`;
    const entries = await readZipDirectory(zip.tmp, { maxEntries: limits.maxFiles, maxEntryBytes: limits.maxFileBytes, maxTotalBytes: limits.maxTotalBytes }, label);
    const { strip } = stripCommonFolder(entries.map((e) => e.path));
    for (const e of entries) {
      const inner = strip(e.path);
      if (!inner.toLowerCase().endsWith(".wav")) {
        ignored.push(inner);
        continue;
      }
      if (files.length >= limits.maxFiles) throw new UploadRefused(`The upload holds more than ${limits.maxFiles.toLocaleString("en")} files.`, 413);
      files.push(await stageWav(openEntry(zip.tmp, e, budget, label), inner, dir, limits.maxFileBytes));
    }
    await rm(zip.tmp, { force: true });
  }
  const clash = findCaseClash(files.map((f) => f.path));
  if (clash) {
    const [a, b] = clash;
    throw new UploadRefused(a === b ? `The upload holds ${JSON.stringify(a)} twice.` : `The upload holds ${JSON.stringify(a)} and ${JSON.stringify(b)}, which differ only in case; an SD card cannot keep both.`);
  }
  if (files.length === 0) throw new UploadRefused(ignored.length ? `The upload holds no WAV files (only ${ignored.slice(0, 5).join(", ")}${ignored.length > 5 ? ", …" : ""}).` : "The upload holds no files.");
  return { files, ignored, fields: parts.fields };
}
