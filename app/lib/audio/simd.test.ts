// The WebAssembly SIMD kernels (16-bit, 24-bit, float peak) agree with a plain loop on random data at
// every offset and length (odd starts, lengths that leave samples outside a whole vector).
import { randomFillSync } from "node:crypto";
import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import path from "node:path";
import { assembleWat } from "../../../scripts/lib/assemble-wat";
import { KERNELS_WASM_BASE64 } from "./kernels.wasm";
import { simd16 } from "./simd";

describe("the kernels' bytes", () => {
  it("are what wabt assembles from kernels.wat today (run `npm run wasm` after editing the text)", async () => {
    const text = readFileSync(path.join(import.meta.dirname, "kernels.wat"), "utf8");
    const bytes = await assembleWat("kernels.wat", text);
    expect(Buffer.from(bytes).toString("base64")).toBe(KERNELS_WASM_BASE64);
  });
});

function plain(bytes: Uint8Array, from: number, to: number) {
  let lo = 0, hi = 0, clipped = 0;
  for (let k = from; k < to; k += 2) {
    const v = ((bytes[k] | (bytes[k + 1] << 8)) << 16) >> 16;
    lo = Math.min(lo, v);
    hi = Math.max(hi, v);
    if (v === 32767 || v === -32768) clipped++;
  }
  return { lo, hi, clipped };
}

describe("16-bit SIMD scan", () => {
  it("loads on this Node (WebAssembly SIMD)", () => expect(simd16).not.toBeNull());
  it("matches a plain loop: extremes and full-scale samples, any offset and length, across slices", () => {
    const bytes = new Uint8Array(1_200_011);
    randomFillSync(bytes);
    // Full-scale samples placed on purpose, including one past the first 512 KB slice.
    bytes.set([0xff, 0x7f], 1001);
    bytes.set([0x00, 0x80], 700_001);
    for (const [from, to] of [[0, 2], [1, 33], [3, 1_200_003], [1001, 1003], [10, 10], [0, 1_048_576], [5, 524_037]]) expect(simd16!(bytes, from, to)).toEqual(plain(bytes, from, to));
    const quiet = new Uint8Array(4096);
    expect(simd16!(quiet, 0, 4096)).toEqual({ lo: 0, hi: 0, clipped: 0 });
  });
});

describe("32-bit float SIMD peak", () => {
  it("matches a plain loop, and reports NaN so the careful pass runs", async () => {
    const { simdPeak32 } = await import("./simd");
    expect(simdPeak32).not.toBeNull();
    const f = new Float32Array(300_001);
    for (let i = 0; i < f.length; i++) f[i] = Math.sin(i * 0.001) * 0.7 * (i % 7 === 0 ? -1 : 1);
    f[299_999] = -0.93;
    const bytes = new Uint8Array(f.buffer);
    const plain = (from: number, to: number) => {
      let p = 0;
      for (let i = from / 4; i < to / 4; i++) p = Math.max(p, Math.abs(f[i]));
      return p;
    };
    for (const [from, to] of [[0, 4], [4, 28], [0, 1_200_004], [8, 1_199_996], [400, 400]]) expect(simdPeak32!(bytes, from, to)).toBe(plain(from, to));
    f[2000] = -Infinity;
    expect(simdPeak32!(bytes, 0, bytes.length)).toBe(Infinity);
    f[12345] = NaN;
    expect(simdPeak32!(bytes, 0, bytes.length)).toBeNaN();
  });
});

describe("24-bit SIMD scan", () => {
  it("matches a plain loop on packed 3-byte samples at any offset and length, across slices", async () => {
    const { simd24 } = await import("./simd");
    expect(simd24).not.toBeNull();
    const bytes = new Uint8Array(3 * 400_001);
    randomFillSync(bytes);
    bytes.set([0xff, 0xff, 0x7f], 3 * 1000);
    bytes.set([0x00, 0x00, 0x80], 3 * 300_000);
    const plain = (from: number, to: number) => {
      let lo = 0, hi = 0, clipped = 0;
      for (let k = from; k < to; k += 3) {
        const v = ((bytes[k] | (bytes[k + 1] << 8) | (bytes[k + 2] << 16)) << 8) >> 8;
        lo = Math.min(lo, v);
        hi = Math.max(hi, v);
        if (v === 8388607 || v === -8388608) clipped++;
      }
      return { lo, hi, clipped };
    };
    for (const [from, to] of [[0, 3], [1, 37], [0, 3 * 400_001], [2, 2 + 3 * 399_999], [0, 524_016], [0, 524_028], [9, 9]]) expect(simd24!(bytes, from, to)).toEqual(plain(from, to));
    expect(simd24!(bytes, 0, 3 * 400_001).clipped).toBe(2);
  });
});
