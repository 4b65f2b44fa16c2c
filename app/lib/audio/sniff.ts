// What a file really is, from its first bytes rather than its name: a client's "hum.wav" can be
// a PNG, an MP3 or a zip. file-type knows the magic numbers of a few hundred formats.
import { fileTypeFromBuffer } from "file-type";
import type { AudioFinding } from "./riff";

/** Bytes file-type needs at most to recognise a format. */
export const SNIFF_BYTES = 4100;

export function looksLikeWav(head: Uint8Array): boolean {
  return head.length >= 12 && head[0] === 0x52 && head[1] === 0x49 && head[2] === 0x46 && head[3] === 0x46 && head[8] === 0x57 && head[9] === 0x41 && head[10] === 0x56 && head[11] === 0x45;
}

/** A finding when the head is not a WAV file (naming what it is, when known), else null. */
export async function sniffNotWav(head: Uint8Array): Promise<AudioFinding | null> {
  if (looksLikeWav(head)) return null;
  const type = await fileTypeFromBuffer(head).catch(() => undefined);
  if (type?.ext === "wav") return null;
  const what = type ? `a ${type.ext.toUpperCase()} file (${type.mime})` : head.length === 0 ? "empty" : "not a format we recognise";
  return { severity: "error", code: "not-wav", message: `The file is ${what}, not a WAV file, whatever its name says.` };
}
