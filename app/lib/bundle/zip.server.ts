// The card's zip as a stream (yazl): entries in the plan's order, a fixed time and mode, WAVs
// stored, text deflated, and no extended timestamps, so the same plan gives the same bytes. Font
// files are opened one at a time as yazl reaches them, so memory stays bounded whatever the
// fonts' size (decision 014).
import { Readable } from "node:stream";
import { ZipFile } from "yazl";
import type { FileStorage } from "../storage/types";
import type { BundlePlan } from "./plan";

/** Local midnight, 1 January 2000: DOS times are local, so this is the same fields everywhere. */
export const FIXED_TIME = new Date(2000, 0, 1, 0, 0, 0);

export function zipBundle(plan: BundlePlan, storage: FileStorage): Readable {
  const zip = new ZipFile();
  const common = { mtime: FIXED_TIME, mode: 0o100644, forceDosTimestamp: true };
  for (const e of plan.entries) {
    if (e.kind === "text") zip.addBuffer(e.bytes, e.path, { ...common, compress: true, compressionLevel: 9 });
    else
      zip.addReadStreamLazy(e.path, { ...common, compress: false, size: e.size }, (cb) => {
        storage.get(e.key).then(
          (s) => cb(null, s),
          (err) => cb(err, undefined as never),
        );
      });
  }
  zip.end();
  return zip.outputStream as Readable;
}

/** The zip as a download answer: streamed, never cached, under `fileName`, with the route's own headers. */
export function zipResponse(plan: BundlePlan, storage: FileStorage, fileName: string, headers: Record<string, string>): Response {
  return new Response(Readable.toWeb(zipBundle(plan, storage)) as ReadableStream, {
    headers: { "Content-Type": "application/zip", "Content-Disposition": `attachment; filename="${fileName}"`, "Cache-Control": "no-store", ...headers },
  });
}
