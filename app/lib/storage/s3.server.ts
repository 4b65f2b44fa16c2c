// Files in S3-compatible object storage through @aws-sdk/client-s3. The bytes are spooled to a
// local temporary file first (hashing them on the way), so the object's key is its SHA-256 and
// its length is known before the PutObject starts. Checksums are computed only when the service
// requires them: local fakes (s3rver) store the SDK's default streamed-checksum framing as the
// object's bytes otherwise (decision 014).
import { DeleteObjectCommand, GetObjectCommand, HeadObjectCommand, PutObjectCommand, S3Client, type S3ClientConfig } from "@aws-sdk/client-s3";
import { createReadStream } from "node:fs";
import { rm } from "node:fs/promises";
import type { Readable } from "node:stream";
import { spool } from "./spool.server";
import { isKey, keyFor, type ByteRange, type FileStorage, type Stored } from "./types";

export type S3Settings = { endpoint?: string; region: string; bucket: string; accessKeyId: string; secretAccessKey: string; forcePathStyle: boolean };

export class S3Storage implements FileStorage {
  readonly kind = "s3" as const;
  readonly client: S3Client;
  constructor(
    readonly settings: S3Settings,
    readonly tmpDir: string,
  ) {
    const config: S3ClientConfig = {
      region: settings.region,
      endpoint: settings.endpoint,
      forcePathStyle: settings.forcePathStyle,
      credentials: { accessKeyId: settings.accessKeyId, secretAccessKey: settings.secretAccessKey },
      requestChecksumCalculation: "WHEN_REQUIRED",
      responseChecksumValidation: "WHEN_REQUIRED",
    };
    this.client = new S3Client(config);
  }

  private check(key: string) {
    if (!isKey(key)) throw new Error(`not a storage key: ${key}`);
    return key;
  }

  async put(source: AsyncIterable<Uint8Array>): Promise<Stored> {
    const tmp = await spool(source, this.tmpDir);
    const key = keyFor(tmp.sha256);
    try {
      if (!(await this.exists(key)))
        await this.client.send(new PutObjectCommand({ Bucket: this.settings.bucket, Key: key, Body: createReadStream(tmp.path), ContentLength: tmp.size, ContentType: "application/octet-stream" }));
    } finally {
      await rm(tmp.path, { force: true });
    }
    return { key, size: tmp.size, sha256: tmp.sha256 };
  }

  async get(key: string, range?: ByteRange): Promise<Readable> {
    const r = await this.client.send(new GetObjectCommand({ Bucket: this.settings.bucket, Key: this.check(key), Range: range ? `bytes=${range.start}-${range.end}` : undefined }));
    return r.Body as Readable;
  }

  async exists(key: string): Promise<boolean> {
    try {
      await this.client.send(new HeadObjectCommand({ Bucket: this.settings.bucket, Key: this.check(key) }));
      return true;
    } catch (e) {
      const status = (e as { $metadata?: { httpStatusCode?: number } }).$metadata?.httpStatusCode;
      if (status === 404 || (e as Error).name === "NotFound") return false;
      throw e;
    }
  }

  async delete(key: string): Promise<void> {
    await this.client.send(new DeleteObjectCommand({ Bucket: this.settings.bucket, Key: this.check(key) }));
  }
}
