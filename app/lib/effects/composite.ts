// Porter & Duff "over" with the separable blend modes of W3C Compositing Level 1, on colour
// values 0–1. The engine calls compositeSpan on linear light; the per-pixel functions are the
// general (straight-alpha) statement of the same formulas, kept for tests and for callers that
// composite a single colour (swatches, the text alternative of the preview).
import type { BLEND_MODES } from "~/lib/config/schema";

export type BlendMode = (typeof BLEND_MODES)[number];

/** Colour planes of one channel, one float per pixel each. */
export interface Planes {
  r: Float32Array;
  g: Float32Array;
  b: Float32Array;
}

export function createPlanes(n: number): Planes {
  return { r: new Float32Array(n), g: new Float32Array(n), b: new Float32Array(n) };
}

/** B(Cb, Cs) of W3C Compositing §10; "add" is clamped at full because a LED cannot exceed full duty. */
export function blendValue(mode: BlendMode, cb: number, cs: number): number {
  switch (mode) {
    case "add":
      return Math.min(1, cb + cs);
    case "multiply":
      return cb * cs;
    case "screen":
      return cb + cs - cb * cs;
    default:
      return cs;
  }
}

export interface StraightColor {
  rgb: [number, number, number];
  alpha: number;
}

/**
 * Source over backdrop with a blend mode, straight alpha in and out (W3C Compositing §5.8 with
 * Porter & Duff's "over"): co = αs(1−αb)Cs + αsαb·B(Cb,Cs) + (1−αs)αbCb; αo = αs + αb(1−αs).
 */
export function compositeOver(
  source: readonly [number, number, number],
  alphaS: number,
  backdrop: readonly [number, number, number],
  alphaB: number,
  mode: BlendMode = "normal",
): StraightColor {
  const as = clamp01(alphaS);
  const ab = clamp01(alphaB);
  const ao = as + ab * (1 - as);
  const rgb: [number, number, number] = [0, 0, 0];
  if (ao > 0) {
    for (let i = 0; i < 3; i++) {
      const co = as * (1 - ab) * source[i] + as * ab * blendValue(mode, backdrop[i], source[i]) + (1 - as) * ab * backdrop[i];
      rgb[i] = co / ao;
    }
  }
  return { rgb, alpha: ao };
}

/** Porter & Duff "over" on premultiplied colour: co = cs + cb(1 − αs), αo = αs + αb(1 − αs). */
export function overPremultiplied(
  cs: readonly [number, number, number],
  alphaS: number,
  cb: readonly [number, number, number],
  alphaB: number,
): { rgb: [number, number, number]; alpha: number } {
  const k = 1 - alphaS;
  return { rgb: [cs[0] + cb[0] * k, cs[1] + cb[1] * k, cs[2] + cb[2] * k], alpha: alphaS + alphaB * k };
}

function clamp01(v: number): number {
  return v > 0 ? (v < 1 ? v : 1) : 0;
}

/**
 * Composites src (with per-pixel alpha) into dst over pixels [from, to). A channel's backdrop is
 * always opaque (a dark LED is black, not transparent), so with αb = 1 the general formula above
 * reduces to co = αs·B(Cb, Cs) + (1 − αs)·Cb. One loop per mode keeps the branch out of the pixel loop.
 */
export function compositeSpan(dst: Planes, src: Planes, alpha: Float32Array, mode: BlendMode, from: number, to: number): void {
  const { r: dr, g: dg, b: db } = dst;
  const { r: sr, g: sg, b: sb } = src;
  switch (mode) {
    case "add":
      for (let i = from; i < to; i++) {
        const a = alpha[i];
        if (!(a > 0)) continue; // also skips NaN
        dr[i] += a * (Math.min(1, dr[i] + sr[i]) - dr[i]);
        dg[i] += a * (Math.min(1, dg[i] + sg[i]) - dg[i]);
        db[i] += a * (Math.min(1, db[i] + sb[i]) - db[i]);
      }
      return;
    case "multiply":
      for (let i = from; i < to; i++) {
        const a = alpha[i];
        if (!(a > 0)) continue; // also skips NaN
        dr[i] += a * (dr[i] * sr[i] - dr[i]);
        dg[i] += a * (dg[i] * sg[i] - dg[i]);
        db[i] += a * (db[i] * sb[i] - db[i]);
      }
      return;
    case "screen":
      for (let i = from; i < to; i++) {
        const a = alpha[i];
        if (!(a > 0)) continue; // also skips NaN
        dr[i] += a * (sr[i] - dr[i] * sr[i]);
        dg[i] += a * (sg[i] - dg[i] * sg[i]);
        db[i] += a * (sb[i] - db[i] * sb[i]);
      }
      return;
    default:
      for (let i = from; i < to; i++) {
        const a = alpha[i];
        if (!(a > 0)) continue; // also skips NaN
        dr[i] += a * (sr[i] - dr[i]);
        dg[i] += a * (sg[i] - dg[i]);
        db[i] += a * (sb[i] - db[i]);
      }
  }
}
