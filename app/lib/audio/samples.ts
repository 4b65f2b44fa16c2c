// Peak and clipping over a data chunk that arrives in pieces of any size. Samples are read
// through typed arrays where the bytes are aligned (the fast path) and byte by byte otherwise;
// a sample split between two pieces is carried over. 8-bit samples are unsigned (silence 128),
// wider ones signed, floats are full scale at ±1 (RIFF/WAVE specification).
import type { WavFormat } from "./riff";

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

  /** Scan whole samples in bytes[from, to). */
  function run(bytes: Uint8Array, from: number, to: number) {
    const off = bytes.byteOffset + from;
    const n = (to - from) / width;
    if (kind === "u8") {
      let lo = min;
      let hi = max;
      let c = 0;
      for (let k = from; k < to; k++) {
        const v = bytes[k];
        if (v < lo) lo = v;
        if (v > hi) hi = v;
        if (v === 0 || v === 255) c++;
      }
      min = lo;
      max = hi;
      scanner.clipped += c;
      return;
    }
    if (kind === "i24") {
      let lo = min;
      let hi = max;
      let c = 0;
      for (let k = from; k < to; k += 3) {
        const v = ((bytes[k] | (bytes[k + 1] << 8) | (bytes[k + 2] << 16)) << 8) >> 8;
        if (v < lo) lo = v;
        if (v > hi) hi = v;
        if (v === 8388607 || v === -8388608) c++;
      }
      min = lo;
      max = hi;
      scanner.clipped += c;
      return;
    }
    // Typed arrays need the byte offset aligned to the sample width; copy when it is not.
    let buf = bytes.buffer;
    let start = off;
    if (off % width !== 0) {
      const copy = bytes.slice(from, to);
      buf = copy.buffer;
      start = 0;
    }
    if (kind === "i16") {
      const a = new Int16Array(buf, start, n);
      let lo = min;
      let hi = max;
      let c = 0;
      for (let k = 0; k < n; k++) {
        const v = a[k];
        if (v < lo) lo = v;
        else if (v > hi) hi = v;
        if (v === 32767 || v === -32768) c++;
      }
      min = lo;
      max = hi;
      scanner.clipped += c;
    } else if (kind === "i32") {
      const a = new Int32Array(buf, start, n);
      let lo = min;
      let hi = max;
      let c = 0;
      for (let k = 0; k < n; k++) {
        const v = a[k];
        if (v < lo) lo = v;
        else if (v > hi) hi = v;
        if (v === 2147483647 || v === -2147483648) c++;
      }
      min = lo;
      max = hi;
      scanner.clipped += c;
    } else {
      const a = kind === "f32" ? new Float32Array(buf, start, n) : new Float64Array(buf, start, n);
      let p = fpeak;
      let c = 0;
      let bad = 0;
      for (let k = 0; k < n; k++) {
        const v = a[k];
        const m = v < 0 ? -v : v;
        if (m > p) p = m;
        if (m >= 1) c++;
        else if (m !== m) bad++;
      }
      // Infinity counts as clipped above; count it as non-finite as well.
      if (p === Infinity) {
        for (let k = 0; k < n; k++) if (a[k] === Infinity || a[k] === -Infinity) bad++;
        p = fpeak;
        for (let k = 0; k < n; k++) {
          const m = Math.abs(a[k]);
          if (m > p && m !== Infinity) p = m;
        }
      }
      fpeak = p;
      scanner.clipped += c;
      scanner.nonFinite += bad;
    }
  }
  return scanner;
}
