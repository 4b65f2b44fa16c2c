// The sample hot loops in WebAssembly SIMD: for 16-bit and 24-bit PCM the smallest and largest
// sample and the count at full scale (eight, resp. four, samples per instruction); for 32-bit
// float the peak. 16-bit PCM is the usual font format; plain JavaScript tops out near 1 GB/s
// here, these kernels at several GB/s (bench: audio). The module is a few hundred bytes written
// out below (the text form of two functions beside it; scan24 is described above its bytes);
// where WebAssembly SIMD is missing, the exports are null and the JavaScript loops run instead.
//
// (module
//   (memory (export "mem") 9)
//   (func (export "scan") (param $p i32) (param $end i32) (result i32)
//     (local $lo v128) (local $hi v128) (local $v v128) (local $n v128) (local $top v128) (local $bot v128)
//     (local.set $top (i16x8.splat (i32.const 32767)))
//     (local.set $bot (i16x8.splat (i32.const -32768)))
//     (block (loop
//       (br_if 1 (i32.ge_u (local.get $p) (local.get $end)))
//       (local.set $v (v128.load align=4 (local.get $p)))
//       (local.set $lo (i16x8.min_s (local.get $lo) (local.get $v)))
//       (local.set $hi (i16x8.max_s (local.get $hi) (local.get $v)))
//       ;; a lane equal to either extreme is all ones (-1): subtracting it counts one
//       (local.set $n (i16x8.sub (local.get $n) (v128.or (i16x8.eq (local.get $v) (local.get $top)) (i16x8.eq (local.get $v) (local.get $bot)))))
//       (local.set $p (i32.add (local.get $p) (i32.const 16)))
//       (br 0)))
//     (v128.store (i32.const 0) (local.get $lo))
//     (v128.store (i32.const 16) (local.get $hi))
//     (v128.store (i32.const 32) (local.get $n))
//     (i32.const 0))
//   (func (export "peak32") (param $p i32) (param $end i32) (result i32)
//     (local $peak v128) (local $v v128)
//     (block (loop
//       (br_if 1 (i32.ge_u (local.get $p) (local.get $end)))
//       (local.set $v (v128.load align=4 (local.get $p)))
//       ;; f32x4.max keeps a NaN once it meets one: the caller then takes the careful path
//       (local.set $peak (f32x4.max (local.get $peak) (f32x4.abs (local.get $v))))
//       (local.set $p (i32.add (local.get $p) (i32.const 16)))
//       (br 0)))
//     (v128.store (i32.const 48) (local.get $peak))
//     (i32.const 0)))

const hex = (s: string) => s.trim().split(/\s+/).map((x) => parseInt(x, 16));
/** Unsigned LEB128, as WebAssembly writes sizes. */
function leb(n: number): number[] {
  const out: number[] = [];
  do {
    const b = n & 0x7f;
    n >>>= 7;
    out.push(n ? b | 0x80 : b);
  } while (n);
  return out;
}
const BODY = hex(`
  01 06 7b
  41 ff ff 01 fd 10 21 06
  41 80 80 7e fd 10 21 07
  02 40 03 40
    20 00 20 01 4f 0d 01
    20 00 fd 00 04 00 21 04
    20 02 20 04 fd 96 01 21 02
    20 03 20 04 fd 98 01 21 03
    20 05 20 04 20 06 fd 2d 20 04 20 07 fd 2d fd 50 fd 91 01 21 05
    20 00 41 10 6a 21 00
    0c 00
  0b 0b
  41 00 20 02 fd 0b 04 00
  41 10 20 03 fd 0b 04 00
  41 20 20 05 fd 0b 04 00
  41 00 0b`);
const BODY_F32 = hex(`
  01 02 7b
  02 40 03 40
    20 00 20 01 4f 0d 01
    20 00 fd 00 04 00 21 03
    20 02 20 03 fd e0 01 fd e9 01 21 02
    20 00 41 10 6a 21 00
    0c 00
  0b 0b
  41 30 20 02 fd 0b 04 00
  41 00 0b`);
// scan24: four packed 24-bit samples per 12 bytes, spread into 32-bit lanes by a byte shuffle
// (i8x16.swizzle; index 0x80 gives a zero byte) and sign-extended by an arithmetic shift of 8.
const BODY_24 = hex(`
  01 07 7b
  41 ff ff ff 03 fd 11 21 06
  41 80 80 80 7c fd 11 21 07
  fd 0c 80 00 01 02 80 03 04 05 80 06 07 08 80 09 0a 0b 21 08
  02 40 03 40
    20 00 20 01 4f 0d 01
    20 00 fd 00 00 00 20 08 fd 0e 41 08 fd ac 01 21 04
    20 02 20 04 fd b6 01 21 02
    20 03 20 04 fd b8 01 21 03
    20 05 20 04 20 06 fd 37 20 04 20 07 fd 37 fd 50 fd b1 01 21 05
    20 00 41 0c 6a 21 00
    0c 00
  0b 0b
  41 00 20 02 fd 0b 04 00
  41 10 20 03 fd 0b 04 00
  41 20 20 05 fd 0b 04 00
  41 00 0b`);
const bodies = [BODY, BODY_F32, BODY_24].flatMap((b) => [...leb(b.length), ...b]);
const MODULE = Uint8Array.from([
  ...hex("00 61 73 6d 01 00 00 00"), // magic, version 1
  ...hex("01 07 01 60 02 7f 7f 01 7f"), // types: (i32, i32) -> i32
  ...hex("03 04 03 00 00 00"), // three functions of type 0
  ...hex("05 03 01 00 09"), // memory: 9 pages (576 KiB)
  ...hex("07 20 04 03 6d 65 6d 02 00 04 73 63 61 6e 00 00 06 70 65 61 6b 33 32 00 01 06 73 63 61 6e 32 34 00 02"), // exports "mem", "scan", "peak32", "scan24"
  ...[0x0a, ...leb(bodies.length + 1), 0x03, ...bodies], // code
]);

/** Data starts after the three result vectors. */
const DATA_AT = 64;
/** Vectors per call: each lane's i16 counter sees at most one per vector, so at most 32,767 vectors. */
const SLICE = 32752 * 16;

export type Scan16 = { lo: number; hi: number; clipped: number };

type Kernels = { scan16: (bytes: Uint8Array, from: number, to: number) => Scan16; scan24: (bytes: Uint8Array, from: number, to: number) => Scan16; peak32: (bytes: Uint8Array, from: number, to: number) => number };
/** Bytes per scan24 call: whole 12-byte groups, leaving room for its last 16-byte load. */
const SLICE24 = 43668 * 12;

function load(): Kernels | null {
  try {
    const instance = new WebAssembly.Instance(new WebAssembly.Module(MODULE));
    const mem = instance.exports.mem as WebAssembly.Memory;
    const scan = instance.exports.scan as (p: number, end: number) => number;
    const peak = instance.exports.peak32 as (p: number, end: number) => number;
    const scan3 = instance.exports.scan24 as (p: number, end: number) => number;
    const words = new Int32Array(mem.buffer, 0, 12);
    const heap = new Uint8Array(mem.buffer);
    const lanes = new Int16Array(mem.buffer, 0, 16);
    const counts = new Uint16Array(mem.buffer, 32, 8);
    const peaks = new Float32Array(mem.buffer, 48, 4);
    /** Largest |sample| of whole 32-bit floats in bytes[from, to); NaN if any sample is NaN. */
    const peak32 = (bytes: Uint8Array, from: number, to: number) => {
      let p = 0;
      for (let at = from; at < to; at += SLICE) {
        const end = Math.min(to, at + SLICE);
        const len = end - at;
        const vec = len & ~15;
        // The tail (fewer than four samples) is padded with zeros: |0| changes no peak.
        heap.set(bytes.subarray(at, end), DATA_AT);
        heap.fill(0, DATA_AT + len, DATA_AT + vec + 16);
        peak(DATA_AT, DATA_AT + (len === vec ? vec : vec + 16));
        p = Math.max(p, peaks[0], peaks[1], peaks[2], peaks[3]);
      }
      return p;
    };
    /** Whole 16-bit samples in bytes[from, to): (to - from) is even. */
    const scan16 = (bytes: Uint8Array, from: number, to: number): Scan16 => {
      let lo = 0;
      let hi = 0;
      let clipped = 0;
      for (let at = from; at < to; at += SLICE) {
        const end = Math.min(to, at + SLICE);
        const vec = (end - at) & ~15;
        heap.set(bytes.subarray(at, at + vec), DATA_AT);
        scan(DATA_AT, DATA_AT + vec);
        for (let i = 0; i < 8; i++) {
          lo = Math.min(lo, lanes[i]);
          hi = Math.max(hi, lanes[i + 8]);
          clipped += counts[i];
        }
        // The last few samples that do not fill a vector.
        for (let k = at + vec; k < end; k += 2) {
          const v = ((bytes[k] | (bytes[k + 1] << 8)) << 16) >> 16;
          lo = Math.min(lo, v);
          hi = Math.max(hi, v);
          if (v === 32767 || v === -32768) clipped++;
        }
      }
      return { lo, hi, clipped };
    };
    /** Whole 24-bit samples in bytes[from, to): (to - from) is a multiple of 3. */
    const scan24 = (bytes: Uint8Array, from: number, to: number): Scan16 => {
      let lo = 0;
      let hi = 0;
      let clipped = 0;
      for (let at = from; at < to; at += SLICE24) {
        const end = Math.min(to, at + SLICE24);
        const vec = end - at - ((end - at) % 12);
        heap.set(bytes.subarray(at, at + vec), DATA_AT);
        scan3(DATA_AT, DATA_AT + vec);
        for (let i = 0; i < 4; i++) {
          lo = Math.min(lo, words[i]);
          hi = Math.max(hi, words[i + 4]);
          clipped += words[i + 8];
        }
        for (let k = at + vec; k < end; k += 3) {
          const v = ((bytes[k] | (bytes[k + 1] << 8) | (bytes[k + 2] << 16)) << 8) >> 8;
          lo = Math.min(lo, v);
          hi = Math.max(hi, v);
          if (v === 8388607 || v === -8388608) clipped++;
        }
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
