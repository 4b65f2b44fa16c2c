// One incoming file, written to the upload's staging folder while it is hashed and read by the
// WAV reader in the same pass: nothing is held in memory but the piece in flight, and nothing
// reaches storage until the whole upload has been checked.
import { createHash, randomUUID } from "node:crypto";
import { createWriteStream } from "node:fs";
import path from "node:path";
import { once } from "node:events";
import { WavAnalysis } from "../audio/analyze";
import type { WavReport } from "../audio/riff";
import { UploadRefused } from "./zip.server";

export type StagedFile = { path: string; tmp: string; size: number; sha256: string; wav: WavReport };

const mb = (n: number) => `${Math.round(n / 1048576).toLocaleString("en")} MB`;

export async function stageWav(source: AsyncIterable<Uint8Array>, filePath: string, dir: string, maxBytes: number, onBytes: (n: number) => void = () => {}): Promise<StagedFile> {
  const tmp = path.join(dir, `${randomUUID()}.wav`);
  const out = createWriteStream(tmp);
  const hash = createHash("sha256");
  const analysis = new WavAnalysis();
  let size = 0;
  try {
    for await (const piece of source) {
      size += piece.length;
      if (size > maxBytes) throw new UploadRefused(`${JSON.stringify(filePath)} is larger than ${mb(maxBytes)}, the most one file may have.`, 413);
      onBytes(piece.length);
      hash.update(piece);
      if (!out.write(piece)) await once(out, "drain");
      await analysis.push(piece);
    }
    out.end();
    await once(out, "close");
  } catch (e) {
    out.destroy();
    throw e;
  }
  const wav = await analysis.finish();
  return { path: filePath, tmp, size, sha256: hash.digest("hex"), wav };
}
