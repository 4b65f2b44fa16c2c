// Layers that paint colour regardless of events: fill, gradient, drift, breathe, shimmer. Each
// writes linear colour into `src` and coverage into `alpha` over pixels [from, to) — the layer's
// range — and lays itself out along that range (0 = the range's first pixel, 1 = one past its last).
import type { LayerOf } from "~/lib/config/schema";
import { hexToLinear } from "./color";
import type { Planes } from "./composite";
import { noiseAt, noiseKey } from "./random";

export interface LayerEnv {
  t: number;
  seed: number;
  /** Distinguishes the noise of one layer on one channel from every other. */
  stream: number;
}

// Colours are parsed once per distinct string; looks reuse a handful of colours, so the map stays
// small, and the bound only guards against an editor streaming thousands of picker values.
const linearCache = new Map<string, Float32Array>();
export function linearOf(hex: string): Float32Array {
  let c = linearCache.get(hex);
  if (c === undefined) {
    if (linearCache.size > 4096) linearCache.clear();
    c = Float32Array.from(hexToLinear(hex));
    linearCache.set(hex, c);
  }
  return c;
}

export function finiteOr(v: number, fallback: number): number {
  return Number.isFinite(v) ? v : fallback;
}

export function clamp01(v: number): number {
  return v > 0 ? (v < 1 ? v : 1) : 0;
}

function solid(src: Planes, alpha: Float32Array, from: number, to: number, c: Float32Array, scale: number, a: number): void {
  const r = c[0] * scale, g = c[1] * scale, b = c[2] * scale;
  src.r.fill(r, from, to);
  src.g.fill(g, from, to);
  src.b.fill(b, from, to);
  alpha.fill(a, from, to);
}

export function paintFill(layer: LayerOf<"fill">, src: Planes, alpha: Float32Array, from: number, to: number, opacity: number): boolean {
  solid(src, alpha, from, to, linearOf(layer.color), 1, opacity);
  return true;
}

/** Stops need not be sorted; between two stops colour runs linearly in light, outside them it holds. */
export function paintGradient(layer: LayerOf<"gradient">, src: Planes, alpha: Float32Array, from: number, to: number, opacity: number): boolean {
  const stops = layer.stops;
  if (stops.length === 0) return false;
  const n = to - from;
  for (let i = from; i < to; i++) {
    const x = (i - from + 0.5) / n;
    let lo = -1, hi = -1;
    let loAt = -Infinity, hiAt = Infinity;
    for (let s = 0; s < stops.length; s++) {
      const at = finiteOr(stops[s].at, 0);
      if (at <= x && at >= loAt) { lo = s; loAt = at; }
      if (at >= x && at < hiAt) { hi = s; hiAt = at; }
    }
    let c0: Float32Array, c1: Float32Array, f = 0;
    if (lo < 0) c0 = c1 = linearOf(stops[hi].color);
    else if (hi < 0) c0 = c1 = linearOf(stops[lo].color);
    else {
      c0 = linearOf(stops[lo].color);
      c1 = linearOf(stops[hi].color);
      f = hiAt > loAt ? (x - loAt) / (hiAt - loAt) : 0;
    }
    src.r[i] = c0[0] + (c1[0] - c0[0]) * f;
    src.g[i] = c0[1] + (c1[1] - c0[1]) * f;
    src.b[i] = c0[2] + (c1[2] - c0[2]) * f;
    alpha[i] = opacity;
  }
  return true;
}

/**
 * Bands of `bandPixels` each, in colour order, moving at `speedPixelsPerSecond`. "to-tip" moves
 * the pattern away from the base. Half a pixel either side of a band edge is mixed, so slow
 * drifts glide instead of stepping a whole pixel at a time.
 */
// Colours of the bands being drawn (the schema allows up to 8), shared by every drift layer.
const driftTable = new Float32Array(8 * 3);

export function paintDrift(layer: LayerOf<"drift">, src: Planes, alpha: Float32Array, from: number, to: number, opacity: number, env: LayerEnv): boolean {
  const colors = layer.colors;
  const count = colors.length;
  if (count === 0) return false;
  const band = Math.max(1, finiteOr(layer.bandPixels, 1));
  const period = band * count;
  const speed = Math.max(0, finiteOr(layer.speedPixelsPerSecond, 0));
  let offset = ((speed * env.t) / 1000) % period;
  if (!Number.isFinite(offset)) offset = 0;
  const sign = layer.direction === "to-base" ? -1 : 1;
  const table = count * 3 <= driftTable.length ? driftTable : new Float32Array(count * 3);
  for (let k = 0; k < count; k++) table.set(linearOf(colors[k]), k * 3);
  for (let i = from; i < to; i++) {
    let u = (i - from + 0.5 - sign * offset) % period;
    if (u < 0) u += period;
    const k = Math.floor(u / band) % count;
    const w = u - k * band;
    let o = k, mix = 0;
    if (w < 0.5) { o = (k + count - 1) % count; mix = 0.5 - w; }
    else if (w > band - 0.5) { o = (k + 1) % count; mix = w - (band - 0.5); }
    const c = k * 3, d = o * 3;
    src.r[i] = table[c] + (table[d] - table[c]) * mix;
    src.g[i] = table[c + 1] + (table[d + 1] - table[c + 1]) * mix;
    src.b[i] = table[c + 2] + (table[d + 2] - table[c + 2]) * mix;
    alpha[i] = opacity;
  }
  return true;
}

/**
 * Light rises from `floor` to `ceiling` and back once per `periodMs` (a raised cosine starting at
 * the floor at t = 0); levels are fractions of the colour's light. A period that is not a positive
 * number holds the ceiling.
 */
export function breatheLevel(layer: LayerOf<"breathe">, t: number): number {
  const lo = clamp01(layer.floor);
  const hi = clamp01(layer.ceiling);
  const p = layer.periodMs;
  if (!(p > 0) || !Number.isFinite(p)) return hi;
  const phase = (t % p) / p;
  return lo + (hi - lo) * (0.5 - 0.5 * Math.cos(2 * Math.PI * phase));
}

export function paintBreathe(layer: LayerOf<"breathe">, src: Planes, alpha: Float32Array, from: number, to: number, opacity: number, env: LayerEnv): boolean {
  solid(src, alpha, from, to, linearOf(layer.color), breatheLevel(layer, env.t), opacity);
  return true;
}

/**
 * The colour laid over the pixels with a coverage that wanders randomly between 0 and `amount`:
 * black with "multiply" or "normal" dims the light beneath by up to `amount`. New random targets
 * come `rateHz` times a second and are eased between, 60 % shared by the whole range and 40 % per
 * pixel, so the range flickers together with a little grain.
 */
export function paintShimmer(layer: LayerOf<"shimmer">, src: Planes, alpha: Float32Array, from: number, to: number, opacity: number, env: LayerEnv): boolean {
  const amount = clamp01(layer.amount);
  if (amount === 0) return false;
  const rate = finiteOr(layer.rateHz, 0);
  const u = rate > 0 ? (env.t * rate) / 1000 : 0;
  const b0 = Math.floor(u);
  const f0 = u - b0;
  const f = f0 * f0 * (3 - 2 * f0);
  const bucket = b0 | 0;
  const k0 = noiseKey(env.seed, env.stream, bucket);
  const k1 = noiseKey(env.seed, env.stream, bucket + 1);
  const shared = lerp(noiseAt(k0, -1), noiseAt(k1, -1), f);
  const c = linearOf(layer.color);
  const k = opacity * amount;
  for (let i = from; i < to; i++) {
    const own = lerp(noiseAt(k0, i), noiseAt(k1, i), f);
    src.r[i] = c[0];
    src.g[i] = c[1];
    src.b[i] = c[2];
    alpha[i] = k * (0.6 * shared + 0.4 * own);
  }
  return true;
}

function lerp(a: number, b: number, f: number): number {
  return a + (b - a) * f;
}
