// Both stores behind the same interface: content addressing, ranges, exists and delete. The S3
// store runs against s3rver on 127.0.0.1 (scripts/fakes/s3.ts) through the real AWS SDK.
import { createHash, randomBytes } from "node:crypto";
import { mkdtempSync, readdirSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startFakeS3 } from "../../../scripts/fakes/s3";
import { DiskStorage } from "./disk.server";
import { S3Storage } from "./s3.server";
import type { FileStorage } from "./types";

async function* pieces(bytes: Uint8Array, size = 64 * 1024) {
  for (let i = 0; i < bytes.length; i += size) yield bytes.subarray(i, i + size);
}
async function readAll(s: AsyncIterable<Buffer | Uint8Array>) {
  const parts: Buffer[] = [];
  for await (const p of s) parts.push(Buffer.from(p));
  return Buffer.concat(parts);
}

const work = mkdtempSync(path.join(tmpdir(), "hb-storage-"));
let fake: Awaited<ReturnType<typeof startFakeS3>>;
const stores: Record<string, () => FileStorage> = {};

beforeAll(async () => {
  fake = await startFakeS3({ directory: path.join(work, "s3") });
  const s3 = new S3Storage({ endpoint: fake.url, region: "us-east-1", bucket: fake.bucket, accessKeyId: "S3RVER", secretAccessKey: "S3RVER", forcePathStyle: true }, path.join(work, "s3-tmp"));
  const disk = new DiskStorage(path.join(work, "disk"));
  stores.disk = () => disk;
  stores.s3 = () => s3;
});
afterAll(async () => {
  await fake?.close();
  rmSync(work, { recursive: true, force: true });
});

describe.each(["disk", "s3"])("%s storage", (kind) => {
  const bytes = randomBytes(3 * 1024 * 1024 + 17);
  const sha = createHash("sha256").update(bytes).digest("hex");

  it("stores a stream under its SHA-256 with its size, byte for byte", async () => {
    const s = stores[kind]();
    const r = await s.put(pieces(bytes));
    expect(r).toEqual({ key: `sha256/${sha.slice(0, 2)}/${sha}`, size: bytes.length, sha256: sha });
    const back = await readAll(await s.get(r.key));
    expect(back.length).toBe(bytes.length);
    expect(createHash("sha256").update(back).digest("hex")).toBe(sha);
  });

  it("stores the same bytes once and serves a range", async () => {
    const s = stores[kind]();
    const a = await s.put(pieces(bytes, 1000));
    const b = await s.put(pieces(bytes, 77777));
    expect(a.key).toBe(b.key);
    const part = await readAll(await s.get(a.key, { start: 100, end: 1099 }));
    expect(part.equals(bytes.subarray(100, 1100))).toBe(true);
    expect(await s.exists(a.key)).toBe(true);
    await s.delete(a.key);
    expect(await s.exists(a.key)).toBe(false);
  });

  it("leaves no temporary files behind and refuses keys that are not hashes", async () => {
    const s = stores[kind]();
    await s.put(pieces(new Uint8Array([1, 2, 3])));
    const tmp = kind === "disk" ? path.join(work, "disk", "tmp") : path.join(work, "s3-tmp");
    expect(readdirSync(tmp)).toEqual([]);
    await expect(s.get("../../etc/passwd")).rejects.toThrow(/not a storage key/);
  });
});
