// Writes a stream to a temporary file while hashing it, so a store can decide where the bytes
// go once their SHA-256 is known. Memory stays at one piece of the stream.
import { createHash, randomUUID } from "node:crypto";
import { createWriteStream } from "node:fs";
import { mkdir, rm } from "node:fs/promises";
import path from "node:path";
import { pipeline } from "node:stream/promises";
import { Readable, Transform } from "node:stream";

export type Spooled = { path: string; size: number; sha256: string };

export async function spool(source: AsyncIterable<Uint8Array>, dir: string, limit = Infinity): Promise<Spooled> {
  await mkdir(dir, { recursive: true });
  const file = path.join(dir, `${randomUUID()}.part`);
  const hash = createHash("sha256");
  let size = 0;
  const counter = new Transform({
    transform(chunk: Buffer, _enc, done) {
      size += chunk.length;
      if (size > limit) return done(new SpoolLimitError(limit));
      hash.update(chunk);
      done(null, chunk);
    },
  });
  try {
    await pipeline(Readable.from(source), counter, createWriteStream(file));
  } catch (e) {
    await rm(file, { force: true });
    throw e;
  }
  return { path: file, size, sha256: hash.digest("hex") };
}

export class SpoolLimitError extends Error {
  constructor(readonly limit: number) {
    super(`more than ${limit} bytes`);
  }
}
