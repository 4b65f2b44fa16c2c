// Builds WAV files byte by byte for tests, the seed and the bench: any chunk order, odd chunks,
// extensible headers and lying sizes. Writing by hand keeps the layout under our control (the
// RIFF/WAVE specification's little-endian chunks, each padded to an even size).

export type Chunk = { id: string; body: Uint8Array; /** Size to write instead of the body's length (lying headers). */ claim?: number; noPad?: boolean };

export function chunk(id: string, body: Uint8Array, extra: Partial<Chunk> = {}): Chunk {
  return { id, body, ...extra };
}

export function riff(chunks: Chunk[], opts: { riffSize?: number } = {}): Uint8Array {
  const parts: Uint8Array[] = [];
  let total = 4;
  for (const c of chunks) {
    const pad = c.body.length & 1 && !c.noPad ? 1 : 0;
    const head = new Uint8Array(8);
    writeAscii(head, 0, c.id);
    new DataView(head.buffer).setUint32(4, c.claim ?? c.body.length, true);
    parts.push(head, c.body);
    if (pad) parts.push(new Uint8Array(1));
    total += 8 + c.body.length + pad;
  }
  const out = new Uint8Array(8 + total);
  writeAscii(out, 0, "RIFF");
  new DataView(out.buffer).setUint32(4, opts.riffSize ?? total, true);
  writeAscii(out, 8, "WAVE");
  let at = 12;
  for (const p of parts) {
    out.set(p, at);
    at += p.length;
  }
  return out;
}

export type FmtOptions = { tag?: number; channels: number; rate: number; bits: number; extensible?: { validBits?: number; mask?: number; subTag?: number } };

/** A fmt chunk body: 16 bytes, or 40 with the extensible extension (cbSize 22). */
export function fmtBody(o: FmtOptions): Uint8Array {
  const ext = o.extensible;
  const b = new Uint8Array(ext ? 40 : 16);
  const v = new DataView(b.buffer);
  const align = o.channels * Math.ceil(o.bits / 8);
  v.setUint16(0, ext ? 0xfffe : (o.tag ?? 1), true);
  v.setUint16(2, o.channels, true);
  v.setUint32(4, o.rate, true);
  v.setUint32(8, o.rate * align, true);
  v.setUint16(12, align, true);
  v.setUint16(14, o.bits, true);
  if (ext) {
    v.setUint16(16, 22, true);
    v.setUint16(18, ext.validBits ?? o.bits, true);
    v.setUint32(20, ext.mask ?? 0, true);
    // SubFormat GUID xxxxxxxx-0000-0010-8000-00AA00389B71 with the format tag in front.
    v.setUint32(24, ext.subTag ?? 1, true);
    b.set([0x00, 0x00, 0x10, 0x00, 0x80, 0x00, 0x00, 0xaa, 0x00, 0x38, 0x9b, 0x71], 28);
  }
  return b;
}

/** Interleaved float samples (−1…1) as little-endian PCM of the given width (or float when float=true). */
export function pcmBytes(samples: ArrayLike<number>, bits: number, float = false): Uint8Array {
  const w = bits / 8;
  const out = new Uint8Array(samples.length * w);
  const v = new DataView(out.buffer);
  for (let i = 0; i < samples.length; i++) {
    const x = Math.max(-1, Math.min(1, samples[i]));
    const at = i * w;
    if (float) {
      if (bits === 32) v.setFloat32(at, samples[i], true);
      else v.setFloat64(at, samples[i], true);
    } else if (bits === 8) v.setUint8(at, Math.round(x * 127) + 128);
    else if (bits === 16) v.setInt16(at, Math.round(x < 0 ? x * 32768 : x * 32767), true);
    else if (bits === 24) {
      const s = Math.round(x < 0 ? x * 8388608 : x * 8388607);
      v.setUint8(at, s & 0xff);
      v.setUint8(at + 1, (s >> 8) & 0xff);
      v.setUint8(at + 2, (s >> 16) & 0xff);
    } else v.setInt32(at, Math.round(x < 0 ? x * 2147483648 : x * 2147483647), true);
  }
  return out;
}

/** A plain PCM WAV of interleaved samples. */
export function simpleWav(samples: ArrayLike<number>, o: { channels?: number; rate?: number; bits?: number; float?: boolean } = {}): Uint8Array {
  const channels = o.channels ?? 1;
  const rate = o.rate ?? 44100;
  const bits = o.bits ?? 16;
  return riff([chunk("fmt ", fmtBody({ tag: o.float ? 3 : 1, channels, rate, bits })), chunk("data", pcmBytes(samples, bits, o.float))]);
}

function writeAscii(b: Uint8Array, at: number, s: string) {
  for (let i = 0; i < s.length; i++) b[at + i] = s.charCodeAt(i);
}
