// The sample hot loops in WebAssembly SIMD: for 16-bit and 24-bit PCM the smallest and largest
// sample and the count at full scale; for 32-bit float the peak. 16-bit PCM is the usual font
// format; plain JavaScript tops out near 1 GB/s here, these kernels at several GB/s (bench:
// audio). The kernels are written as text in kernels.wat and assembled by wabt into
// kernels.wasm.ts (`npm run wasm`); where WebAssembly SIMD is missing, the exports are null and
// the JavaScript loops in samples.ts run instead.
import { KERNELS_WASM_BASE64 } from "./kernels.wasm";

/** Where sample bytes go in the module's memory: after the 64-byte answer block (kernels.wat). */
const DATA_AT = 64;
/** Bytes per 16-bit call: a multiple of 64 (minmax16's stride) and at most 32,752 vectors, so clip16's i16 counters cannot wrap. */
const SLICE = 32752 * 16;
/** Bytes per 24-bit call: whole 24-byte turns of minmax24 (and so whole 12-byte turns of clip24). */
const SLICE24 = 21834 * 24;

export type Scan16 = { lo: number; hi: number; clipped: number };

type Kernels = { scan16: (bytes: Uint8Array, from: number, to: number) => Scan16; scan24: (bytes: Uint8Array, from: number, to: number) => Scan16; peak32: (bytes: Uint8Array, from: number, to: number) => number };

type Kernel = (p: number, end: number) => void;

function decode(b64: string): Uint8Array<ArrayBuffer> {
  const s = atob(b64);
  const out = new Uint8Array(s.length);
  for (let i = 0; i < s.length; i++) out[i] = s.charCodeAt(i);
  return out;
}

function load(): Kernels | null {
  try {
    const instance = new WebAssembly.Instance(new WebAssembly.Module(decode(KERNELS_WASM_BASE64)));
    const ex = instance.exports as Record<string, Kernel> & { mem: WebAssembly.Memory };
    const heap = new Uint8Array(ex.mem.buffer);
    const lanes16 = new Int16Array(ex.mem.buffer, 0, 16);
    const counts16 = new Uint16Array(ex.mem.buffer, 32, 8);
    const words = new Int32Array(ex.mem.buffer, 0, 16);
    const bits = new Int32Array(1);
    const asFloat = new Float32Array(bits.buffer);

    /** Copy bytes[at, end) to the module, zero-padded to a multiple of `stride`; answers the end address. */
    const place = (bytes: Uint8Array, at: number, end: number, stride: number) => {
      const len = end - at;
      const padded = Math.ceil(len / stride) * stride;
      heap.set(bytes.subarray(at, end), DATA_AT);
      if (padded > len) heap.fill(0, DATA_AT + len, DATA_AT + padded + 16);
      return DATA_AT + padded;
    };

    /** Largest |sample| of whole 32-bit floats in bytes[from, to); Infinity or NaN if any sample is. */
    const peak32 = (bytes: Uint8Array, from: number, to: number) => {
      let top = 0;
      for (let at = from; at < to; at += SLICE) {
        ex.peak32(DATA_AT, place(bytes, at, Math.min(to, at + SLICE), 64));
        top = Math.max(top, words[12] >>> 0, words[13] >>> 0, words[14] >>> 0, words[15] >>> 0);
      }
      bits[0] = top | 0;
      return asFloat[0];
    };
    /** Whole 16-bit samples in bytes[from, to): (to - from) is even. */
    const scan16 = (bytes: Uint8Array, from: number, to: number): Scan16 => {
      let lo = 0;
      let hi = 0;
      let clipped = 0;
      for (let at = from; at < to; at += SLICE) {
        const end = place(bytes, at, Math.min(to, at + SLICE), 64);
        ex.minmax16(DATA_AT, end);
        let sliceLo = 0;
        let sliceHi = 0;
        for (let i = 0; i < 8; i++) {
          sliceLo = Math.min(sliceLo, lanes16[i]);
          sliceHi = Math.max(sliceHi, lanes16[i + 8]);
        }
        // Counting full-scale samples is a second pass, run only where a slice reaches full scale.
        if (sliceLo === -32768 || sliceHi === 32767) {
          ex.clip16(DATA_AT, end);
          for (let i = 0; i < 8; i++) clipped += counts16[i];
        }
        lo = Math.min(lo, sliceLo);
        hi = Math.max(hi, sliceHi);
      }
      return { lo, hi, clipped };
    };
    /** Whole 24-bit samples in bytes[from, to): (to - from) is a multiple of 3. */
    const scan24 = (bytes: Uint8Array, from: number, to: number): Scan16 => {
      let lo = 0;
      let hi = 0;
      let clipped = 0;
      for (let at = from; at < to; at += SLICE24) {
        const end = place(bytes, at, Math.min(to, at + SLICE24), 24);
        ex.minmax24(DATA_AT, end);
        let sliceLo = 0;
        let sliceHi = 0;
        for (let i = 0; i < 4; i++) {
          sliceLo = Math.min(sliceLo, words[i]);
          sliceHi = Math.max(sliceHi, words[i + 4]);
        }
        if (sliceLo === -8388608 || sliceHi === 8388607) {
          ex.clip24(DATA_AT, end);
          for (let i = 0; i < 4; i++) clipped += words[i + 8];
        }
        lo = Math.min(lo, sliceLo);
        hi = Math.max(hi, sliceHi);
      }
      return { lo, hi, clipped };
    };
    return { scan16, scan24, peak32 };
  } catch {
    return null;
  }
}

const kernels = load();
export const simd16 = kernels?.scan16 ?? null;
export const simdPeak32 = kernels?.peak32 ?? null;
export const simd24 = kernels?.scan24 ?? null;
