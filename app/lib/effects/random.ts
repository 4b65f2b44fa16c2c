// Deterministic noise for shimmer and hold flicker: the same (seed, stream, pixel, time bucket)
// always gives the same value, on the server and in the browser, with no state between frames.

/** Turns any number (NaN and fractions included) into a 32-bit integer seed. */
export function seedInt(seed: number): number {
  if (!Number.isFinite(seed)) return 0;
  return (Math.trunc(seed) ^ Math.trunc((seed % 1) * 0x7fffffff)) | 0;
}

/** 32-bit finaliser of MurmurHash3: cheap, and every input bit reaches every output bit. */
function fmix(h: number): number {
  h ^= h >>> 16;
  h = Math.imul(h, 0x85ebca6b);
  h ^= h >>> 13;
  h = Math.imul(h, 0xc2b2ae35);
  h ^= h >>> 16;
  return h >>> 0;
}

/**
 * The part of a noise value shared by every pixel of one layer in one time bucket. Split out so
 * the pixel loop pays for one mixing round per value instead of four.
 */
export function noiseKey(seed: number, stream: number, bucket: number): number {
  let h = fmix(seed ^ 0x9e3779b9);
  h = fmix(h ^ Math.imul(stream | 0, 0x27d4eb2f));
  return fmix(h ^ Math.imul(bucket | 0, 0x61c88647));
}

/** A value in [0, 1) for one pixel under a key from noiseKey. */
export function noiseAt(key: number, pixel: number): number {
  return fmix(key ^ Math.imul((pixel | 0) + 1, 0x165667b1)) / 4294967296;
}
