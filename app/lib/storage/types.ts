// One small interface in front of where a file's bytes live: the local disk under the data
// folder, or S3-compatible object storage. Files are stored by content hash, so the same bytes
// uploaded twice are stored once and a key never changes meaning.
import type { Readable } from "node:stream";

export type Stored = { key: string; size: number; sha256: string };
/** Inclusive byte range, as HTTP Range gives it. */
export type ByteRange = { start: number; end: number };

export interface FileStorage {
  readonly kind: "disk" | "s3";
  /** Store the stream's bytes under their SHA-256; storing known bytes again writes nothing. */
  put(source: AsyncIterable<Uint8Array>): Promise<Stored>;
  /** The bytes of a key, or of part of it. */
  get(key: string, range?: ByteRange): Promise<Readable>;
  exists(key: string): Promise<boolean>;
  delete(key: string): Promise<void>;
}

export function keyFor(sha256: string): string {
  if (!/^[0-9a-f]{64}$/.test(sha256)) throw new Error("not a SHA-256");
  return `sha256/${sha256.slice(0, 2)}/${sha256}`;
}

export function isKey(key: string): boolean {
  return /^sha256\/[0-9a-f]{2}\/[0-9a-f]{64}$/.test(key);
}
