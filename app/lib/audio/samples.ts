// Peak and clipping over a data chunk that arrives in pieces of any size. Samples are read
// through typed arrays where the bytes are aligned (the fast path) and byte by byte otherwise;
// a sample split between two pieces is carried over. 8-bit samples are unsigned (silence 128),
// wider ones signed, floats are full scale at ±1 (RIFF/WAVE specification).
import { simd16, simd24, simdPeak32 } from "./simd";
import type { WavFormat } from "./types";

export type SampleScanner = {
  scan(bytes: Uint8Array, at: number, length: number): void;
  /** Largest absolute sample as a fraction of full scale. */
  peak(): number;
  clipped: number;
  nonFinite: number;
};

type Kind = "u8" | "i16" | "i24" | "i32" | "f32" | "f64";

function kindOf(f: WavFormat): Kind | null {
  if (f.encoding === "float") return f.bitsPerSample === 32 ? "f32" : f.bitsPerSample === 64 ? "f64" : null;
  if (f.encoding === "pcm") return ({ 8: "u8", 16: "i16", 24: "i24", 32: "i32" } as const)[f.bitsPerSample as 8] ?? null;
  return null;
}

const WIDTH: Record<Kind, number> = { u8: 1, i16: 2, i24: 3, i32: 4, f32: 4, f64: 8 };

/** Smallest and largest value, in two lanes so the loop has no branches to mispredict. */
function minMax(a: Uint8Array | Int16Array | Int32Array): [number, number] {
  let lo0 = a[0] ?? 0, hi0 = lo0, lo1 = lo0, hi1 = lo0;
  const n = a.length;
  let k = 0;
  for (; k + 2 <= n; k += 2) {
    const v = a[k];
    const w = a[k + 1];
    lo0 = Math.min(lo0, v);
    hi0 = Math.max(hi0, v);
    lo1 = Math.min(lo1, w);
    hi1 = Math.max(hi1, w);
  }
  if (k < n) {
    lo0 = Math.min(lo0, a[k]);
    hi0 = Math.max(hi0, a[k]);
  }
  return [Math.min(lo0, lo1), Math.max(hi0, hi1)];
}

export function createSampleScanner(format: WavFormat): SampleScanner | null {
  const kind = kindOf(format);
  if (!kind || format.channels === 0) return null;
  const width = WIDTH[kind];
  const carry = new Uint8Array(8);
  let carried = 0;
  // Integer kinds track min and max raw values; full scale is the container's range.
  let min = kind === "u8" ? 128 : 0;
  let max = kind === "u8" ? 128 : 0;
  let fpeak = 0;
  const scanner: SampleScanner = {
    clipped: 0,
    nonFinite: 0,
    scan(bytes, at, length) {
      let i = at;
      const end = at + length;
      if (carried > 0) {
        const take = Math.min(width - carried, length);
        carry.set(bytes.subarray(i, i + take), carried);
        carried += take;
        i += take;
        if (carried < width) return;
        run(carry, 0, width);
        carried = 0;
      }
      const whole = end - ((end - i) % width);
      if (whole > i) run(bytes, i, whole);
      if (end > whole) {
        carry.set(bytes.subarray(whole, end), 0);
        carried = end - whole;
      }
    },
    peak() {
      switch (kind) {
        case "u8":
          return Math.max(128 - min, max - 128) / 128;
        case "i16":
          return Math.max(-min, max) / 32768;
        case "i24":
          return Math.max(-min, max) / 8388608;
        case "i32":
          return Math.max(-min, max) / 2147483648;
        default:
          return fpeak;
      }
    },
  };

  /**
   * Scan whole samples in bytes[from, to). The hot loops only track min and max (Math.min/max
   * in two lanes, which V8 compiles without branches); clipped samples are counted in a second
   * pass only over a piece whose extremes reach full scale, which clean audio never does.
   */
  function run(bytes: Uint8Array, from: number, to: number) {
    const n = (to - from) / width;
    if (kind === "u8") {
      const [lo, hi] = minMax(bytes.subarray(from, to));
      if (lo < min) min = lo;
      if (hi > max) max = hi;
      if (lo === 0 || hi === 255) for (let k = from; k < to; k++) if (bytes[k] === 0 || bytes[k] === 255) scanner.clipped++;
      return;
    }
    if (kind === "i24" && simd24) {
      const r = simd24(bytes, from, to);
      if (r.lo < min) min = r.lo;
      if (r.hi > max) max = r.hi;
      scanner.clipped += r.clipped;
      return;
    }
    if (kind === "i24") {
      let lo0 = 0, hi0 = 0, lo1 = 0, hi1 = 0;
      let k = from;
      for (; k + 6 <= to; k += 6) {
        const v = ((bytes[k] | (bytes[k + 1] << 8) | (bytes[k + 2] << 16)) << 8) >> 8;
        const w = ((bytes[k + 3] | (bytes[k + 4] << 8) | (bytes[k + 5] << 16)) << 8) >> 8;
        lo0 = Math.min(lo0, v);
        hi0 = Math.max(hi0, v);
        lo1 = Math.min(lo1, w);
        hi1 = Math.max(hi1, w);
      }
      for (; k < to; k += 3) {
        const v = ((bytes[k] | (bytes[k + 1] << 8) | (bytes[k + 2] << 16)) << 8) >> 8;
        lo0 = Math.min(lo0, v);
        hi0 = Math.max(hi0, v);
      }
      const lo = Math.min(lo0, lo1);
      const hi = Math.max(hi0, hi1);
      if (lo < min) min = lo;
      if (hi > max) max = hi;
      if (lo === -8388608 || hi === 8388607)
        for (let j = from; j < to; j += 3) {
          const v = ((bytes[j] | (bytes[j + 1] << 8) | (bytes[j + 2] << 16)) << 8) >> 8;
          if (v === 8388607 || v === -8388608) scanner.clipped++;
        }
      return;
    }
    if (kind === "i16" && simd16) {
      // WebAssembly SIMD: extremes and full-scale count in one pass (simd.ts).
      const r = simd16(bytes, from, to);
      if (r.lo < min) min = r.lo;
      if (r.hi > max) max = r.hi;
      scanner.clipped += r.clipped;
      return;
    }
    if (kind === "f32" && simdPeak32) {
      // Clean pieces (peak below full scale, no NaN) need nothing more; the rest take the careful pass below.
      const p = simdPeak32(bytes, from, to);
      if (p < 1) {
        if (p > fpeak) fpeak = p;
        return;
      }
    }
    // Typed arrays need the byte offset aligned to the sample width; copy when it is not
    // (new Uint8Array(view) copies; a Node Buffer's slice would not).
    let buf = bytes.buffer;
    let start = bytes.byteOffset + from;
    if (start % width !== 0) {
      const copy = new Uint8Array(bytes.subarray(from, to));
      buf = copy.buffer;
      start = 0;
    }
    if (kind === "i16" || kind === "i32") {
      const a = kind === "i16" ? new Int16Array(buf, start, n) : new Int32Array(buf, start, n);
      const [lo, hi] = minMax(a);
      if (lo < min) min = lo;
      if (hi > max) max = hi;
      const top = kind === "i16" ? 32767 : 2147483647;
      if (lo === -top - 1 || hi === top) for (let k = 0; k < n; k++) if (a[k] === top || a[k] === -top - 1) scanner.clipped++;
      return;
    }
    const a = kind === "f32" ? new Float32Array(buf, start, n) : new Float64Array(buf, start, n);
    let p0 = 0, p1 = 0;
    let k = 0;
    for (; k + 2 <= n; k += 2) {
      p0 = Math.max(p0, Math.abs(a[k]));
      p1 = Math.max(p1, Math.abs(a[k + 1]));
    }
    if (k < n) p0 = Math.max(p0, Math.abs(a[k]));
    const p = Math.max(p0, p1);
    // NaN poisons Math.max, so a NaN or a full-scale peak sends the piece through the careful pass.
    if (p >= 1 || p !== p) {
      let q = fpeak;
      for (let j = 0; j < n; j++) {
        const m = Math.abs(a[j]);
        if (m !== m || m === Infinity) scanner.nonFinite++;
        else if (m > q) q = m;
        if (m >= 1) scanner.clipped++;
      }
      fpeak = q;
    } else if (p > fpeak) fpeak = p;
  }
  return scanner;
}
