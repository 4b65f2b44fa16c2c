// Layers that answer the timeline: spark (a flash after a moment event), hold (light while a
// lasting event is held) and wipe (the ignition and retraction masks).
import type { EASINGS, LayerOf } from "~/lib/config/schema";
import type { Planes } from "./composite";
import { clamp01, finiteOr, linearOf, type LayerEnv } from "./paint";
import { noiseAt, noiseKey } from "./random";
import { heldSince, latestEventAt, type BladeState, type Timeline } from "./timeline";

export interface EventEnv extends LayerEnv {
  timeline: Timeline;
  state: BladeState;
}

/** How many times a second a hold's flicker picks new values. */
export const HOLD_FLICKER_HZ = 30;

export function ease(easing: (typeof EASINGS)[number], s: number): number {
  const x = clamp01(s);
  switch (easing) {
    case "ease-in":
      return x * x;
    case "ease-out":
      return 1 - (1 - x) * (1 - x);
    case "ease-in-out":
      return x < 0.5 ? 2 * x * x : 1 - 2 * (1 - x) * (1 - x);
    default:
      return x;
  }
}

/** Overlap of pixel [j, j+1) with the span [c − h, c + h), 0–1: anti-aliased edges. */
function boxCoverage(j: number, c: number, h: number): number {
  return clamp01(Math.min(j + 1, c + h) - Math.max(j, c - h));
}

/**
 * Flat across `widthPixels` centred at `position`, at full strength at the event and fading as
 * (1 − Δt/decay)² — a fast drop with a soft tail. Only the latest such event counts. A decay under
 * 1 ms is taken as 1 ms.
 */
export function paintSpark(layer: LayerOf<"spark">, src: Planes, alpha: Float32Array, from: number, to: number, opacity: number, env: EventEnv): boolean {
  const at = latestEventAt(env.timeline, layer.event, env.t);
  if (Number.isNaN(at)) return false;
  const decay = Math.max(1, finiteOr(layer.decayMs, 1));
  const dt = env.t - at;
  if (!(dt < decay)) return false;
  const fade = 1 - dt / decay;
  const k = opacity * fade * fade;
  const n = to - from;
  const c = clamp01(finiteOr(layer.position, 0.5)) * n;
  const h = Math.max(0.5, finiteOr(layer.widthPixels, 1) / 2);
  const col = linearOf(layer.color);
  for (let i = from; i < to; i++) {
    src.r[i] = col[0];
    src.g[i] = col[1];
    src.b[i] = col[2];
    alpha[i] = k * boxCoverage(i - from, c, h);
  }
  return true;
}

/**
 * While the event is held: brightest at `position`, fading to nothing at ± widthPixels/2
 * (parabolic), and each pixel's strength dips randomly by up to `flicker` HOLD_FLICKER_HZ times a
 * second (half shared across the hold, half per pixel) — the crackle of a lockup or a drag.
 */
export function paintHold(layer: LayerOf<"hold">, src: Planes, alpha: Float32Array, from: number, to: number, opacity: number, env: EventEnv): boolean {
  const since = heldSince(env.timeline, layer.event, env.t);
  if (Number.isNaN(since)) return false;
  const n = to - from;
  const c = clamp01(finiteOr(layer.position, 0.5)) * n;
  const h = Math.max(0.5, finiteOr(layer.widthPixels, 1) / 2);
  const flicker = clamp01(layer.flicker);
  const bucket = Math.floor((env.t * HOLD_FLICKER_HZ) / 1000) | 0;
  const key = noiseKey(env.seed, env.stream, bucket);
  const shared = noiseAt(key, -1);
  const col = linearOf(layer.color);
  for (let i = from; i < to; i++) {
    const d = (i - from + 0.5 - c) / (h + 0.5);
    const shape = d > -1 && d < 1 ? 1 - d * d : 0;
    src.r[i] = col[0];
    src.g[i] = col[1];
    src.b[i] = col[2];
    alpha[i] = shape === 0 ? 0 : opacity * shape * (1 - flicker * (0.5 * shared + 0.5 * noiseAt(key, i)));
  }
  return true;
}

/**
 * How much of the range a wipe leaves lit, 0–1 of its length, or -1 when the wipe has nothing to
 * say at this instant and everything beneath passes unchanged:
 * - ignition wipe, blade lit: grows from base to tip over durationMs after the ignition;
 * - retraction wipe, blade unlit after a retraction: shrinks from tip to base over durationMs;
 * - retraction wipe before any ignition: 0 (nothing has been lit yet);
 * - otherwise: -1.
 * A duration that is not a positive number completes at once.
 */
export function wipeExtent(layer: LayerOf<"wipe">, env: EventEnv): number {
  const { lit, sinceMs } = env.state;
  const d = layer.durationMs;
  const s = d > 0 && Number.isFinite(d) ? (env.t - sinceMs) / d : 1;
  if (layer.event === "ignition") return lit ? ease(layer.easing, s) : -1;
  if (lit) return -1;
  if (Number.isNaN(sinceMs)) return 0;
  return 1 - ease(layer.easing, s);
}

/** Masks the channel built so far: pixel j keeps clamp(extent·n − j) of its light, blended by opacity. */
export function applyWipe(layer: LayerOf<"wipe">, dst: Planes, from: number, to: number, opacity: number, env: EventEnv): void {
  const extent = wipeExtent(layer, env);
  if (extent < 0) return;
  const edge = extent * (to - from);
  for (let i = from; i < to; i++) {
    const m = 1 - opacity * (1 - clamp01(edge - (i - from)));
    if (m === 1) continue;
    dst.r[i] *= m;
    dst.g[i] *= m;
    dst.b[i] *= m;
  }
}
