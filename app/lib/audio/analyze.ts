// One WAV file, read as a stream: the first bytes are sniffed for what the file really is, then
// every byte goes through the RIFF reader. Memory stays at one piece of the stream.
import { WavReader, type WavReport } from "./riff";
import { SNIFF_BYTES, sniffNotWav } from "./sniff";

export async function analyzeWavStream(source: AsyncIterable<Uint8Array>): Promise<WavReport> {
  const reader = new WavReader();
  let head: Uint8Array | null = new Uint8Array(0);
  let notWav = null;
  for await (const piece of source) {
    if (head) {
      const joined: Uint8Array = new Uint8Array(head.length + piece.length);
      joined.set(head, 0);
      joined.set(piece, head.length);
      if (joined.length < SNIFF_BYTES) {
        head = joined;
        continue;
      }
      head = null;
      notWav = await sniffNotWav(joined);
      if (notWav) return { ...reader.finish(), ok: false, findings: [notWav] };
      reader.push(joined);
      continue;
    }
    reader.push(piece);
  }
  if (head) {
    notWav = await sniffNotWav(head);
    if (notWav) return { ...reader.finish(), ok: false, findings: [notWav] };
    reader.push(head);
  }
  return reader.finish();
}
