// One WAV file, read as it arrives: the first bytes are sniffed for what the file really is, then
// every byte goes through the RIFF reader. Memory stays at one piece of the input. An upload
// (fonts/stage.server.ts) feeds a WavAnalysis piece by piece while it hashes and stores the
// same bytes; a stream or a file on disk can be analysed on its own.
import { open } from "node:fs/promises";
import { WavReader, type WavReport } from "./riff";
import { SNIFF_BYTES, sniffNotWav } from "./sniff";
import type { AudioFinding } from "./types";

export class WavAnalysis {
  private reader = new WavReader();
  private head: Uint8Array | null = new Uint8Array(0);
  private notWav: AudioFinding | null = null;

  /** True once the content is known not to be a WAV file: later bytes change nothing. */
  get refused(): boolean {
    return this.notWav !== null;
  }

  /** The next bytes. The piece may be reused by the caller once this returns. */
  async push(piece: Uint8Array): Promise<void> {
    if (this.notWav) return;
    if (!this.head) return this.reader.push(piece);
    const joined = new Uint8Array(this.head.length + piece.length);
    joined.set(this.head, 0);
    joined.set(piece, this.head.length);
    if (joined.length < SNIFF_BYTES) {
      this.head = joined;
      return;
    }
    this.head = null;
    await this.sniff(joined);
  }

  private async sniff(head: Uint8Array) {
    this.notWav = await sniffNotWav(head);
    if (!this.notWav) this.reader.push(head);
  }

  async finish(): Promise<WavReport> {
    if (this.head) {
      const head = this.head;
      this.head = null;
      await this.sniff(head);
    }
    const report = this.reader.finish();
    return this.notWav ? { ...report, ok: false, findings: [this.notWav] } : report;
  }
}

export async function analyzeWavStream(source: AsyncIterable<Uint8Array>): Promise<WavReport> {
  const analysis = new WavAnalysis();
  for await (const piece of source) {
    await analysis.push(piece);
    if (analysis.refused) break;
  }
  return analysis.finish();
}

/**
 * A WAV file on disk, read the way `cat` reads: into the same two buffers over and over (no
 * fresh memory per piece), the next read already running on libuv's thread while this one is
 * scanned.
 */
export async function analyzeWavFile(file: string, pieceBytes = 1 << 20): Promise<WavReport> {
  const fh = await open(file, "r");
  try {
    const analysis = new WavAnalysis();
    const buffers = [new Uint8Array(pieceBytes), new Uint8Array(pieceBytes)];
    let turn = 0;
    let next = fh.read(buffers[0], 0, pieceBytes, null);
    for (;;) {
      const { bytesRead } = await next;
      if (bytesRead === 0) break;
      const piece = buffers[turn].subarray(0, bytesRead);
      turn ^= 1;
      next = fh.read(buffers[turn], 0, pieceBytes, null);
      await analysis.push(piece);
      if (analysis.refused) {
        await next;
        break;
      }
    }
    return await analysis.finish();
  } finally {
    await fh.close();
  }
}
