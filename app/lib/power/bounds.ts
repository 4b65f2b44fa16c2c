// A conservative picture of a look without running the effect engine: an upper bound on each
// colour of each pixel (for peaks) or a rough time-average (for typical draw). Each layer is
// reduced to a few "states" (off, on, dimmed); every blend mode is monotone in the colour
// underneath, so keeping the brightest state at each step stays an upper bound. Pixels are
// grouped into runs that every layer treats alike, so a 264-pixel blade costs a dozen runs.
import type { Layer, Look } from "../config/schema";

export type Mode = "peak" | "typical";

/**
 * Piecewise-constant RGB (0–1): run j covers pixels [starts[j], starts[j+1]) and has colour
 * rgb[3j..3j+2]; starts ends with the pixel count.
 */
export type Bound = { starts: number[]; rgb: Float32Array };

/** `over` returns the colour component k averaged (typical) or maxed (peak) over [from, to). */
type State = { r: number; g: number; b: number; alpha: number; from: number; to: number; over?: (from: number, to: number, k: number) => number };

const hexCache = new Map<string, [number, number, number]>();

export function hexToUnit(hex: string): [number, number, number] {
  let c = hexCache.get(hex);
  if (!c) {
    const n = Number.parseInt(hex.slice(1), 16);
    c = [((n >> 16) & 255) / 255, ((n >> 8) & 255) / 255, (n & 255) / 255];
    hexCache.set(hex, c);
  }
  return c;
}

function blend(mode: Layer["blend"], under: number, over: number, a: number): number {
  switch (mode) {
    case "normal":
      return under * (1 - a) + over * a;
    case "add":
      return Math.min(1, under + over * a);
    case "multiply":
      return under * (1 - a + a * over);
    case "screen":
      return 1 - (1 - under) * (1 - over * a);
  }
}

function layerRange(layer: Layer, pixels: number): [number, number] {
  if (!layer.range) return [0, pixels];
  return [Math.max(0, layer.range.start), Math.min(pixels, layer.range.end)];
}

/** Pixels a spark or hold of `widthPixels` centred at `position` (0 base, 1 tip) covers. */
export function spotRange(position: number, widthPixels: number, pixels: number): [number, number] {
  const centre = position * (pixels - 1);
  const from = Math.round(centre - widthPixels / 2);
  return [Math.max(0, from), Math.min(pixels, from + widthPixels)];
}

function solid(hex: string, k: number, alpha: number, from: number, to: number): State {
  const [r, g, b] = hexToUnit(hex);
  return { r: r * k, g: g * k, b: b * k, alpha, from, to };
}

function gradientOver(layer: Extract<Layer, { kind: "gradient" }>, pixels: number, mode: Mode) {
  const stops = [...layer.stops].sort((a, b) => a.at - b.at);
  const at = (i: number, k: number) => {
    const t = pixels === 1 ? 0 : i / (pixels - 1);
    let s = 0;
    while (s < stops.length - 2 && t > stops[s + 1].at) s++;
    const a = stops[s];
    const b = stops[s + 1];
    const span = b.at - a.at;
    const f = span <= 0 ? (t >= b.at ? 1 : 0) : Math.min(1, Math.max(0, (t - a.at) / span));
    const ca = hexToUnit(a.color)[k];
    return ca + (hexToUnit(b.color)[k] - ca) * f;
  };
  return (from: number, to: number, k: number) => {
    let v = 0;
    for (let i = from; i < to; i++) v = mode === "peak" ? Math.max(v, at(i, k)) : v + at(i, k) / (to - from);
    return v;
  };
}

/** Colour of `target`'s pixels [lo, hi), maxed or length-weighted. */
function boundOver(target: Bound, lo: number, hi: number, k: number, mode: Mode): number {
  let v = 0;
  const { starts, rgb } = target;
  for (let j = 0; j < starts.length - 1; j++) {
    const a = Math.max(lo, starts[j]);
    const b = Math.min(hi, starts[j + 1]);
    if (b <= a) continue;
    const c = rgb[j * 3 + k];
    v = mode === "peak" ? Math.max(v, c) : v + (c * (b - a)) / (hi - lo);
  }
  return v;
}

function mirrorOver(target: Bound, pixels: number, fit: "stretch" | "crop", mode: Mode) {
  const tp = target.starts[target.starts.length - 1];
  return (from: number, to: number, k: number) => {
    if (fit === "crop") {
      // Pixels past the end of the source stay dark.
      const hi = Math.min(to, tp);
      if (hi <= from) return 0;
      const v = boundOver(target, from, hi, k, mode);
      return mode === "peak" ? v : (v * (hi - from)) / (to - from);
    }
    const lo = Math.floor((from * tp) / pixels);
    const hi = Math.max(lo + 1, Math.floor((to * tp) / pixels));
    return boundOver(target, lo, Math.min(hi, tp), k, mode);
  };
}

function statesOf(layer: Layer, pixels: number, mode: Mode, mirror: (id: string) => Bound | null): State[] {
  const [from, to] = layerRange(layer, pixels);
  if (to <= from) return [];
  const op = layer.opacity;
  const peak = mode === "peak";
  switch (layer.kind) {
    case "fill":
      return [solid(layer.color, 1, op, from, to)];
    case "gradient":
      return [{ r: 0, g: 0, b: 0, alpha: op, from, to, over: gradientOver(layer, pixels, mode) }];
    case "drift": {
      // Bands move past every pixel, so a pixel can show any of the colours.
      const cs = layer.colors.map(hexToUnit);
      const pick = (k: number) => (peak ? Math.max(...cs.map((c) => c[k])) : cs.reduce((s, c) => s + c[k], 0) / cs.length);
      return [{ r: pick(0), g: pick(1), b: pick(2), alpha: op, from, to }];
    }
    case "breathe": {
      const hi = Math.max(layer.floor, layer.ceiling);
      const lo = Math.min(layer.floor, layer.ceiling);
      return peak
        ? [solid(layer.color, hi, op, from, to), solid(layer.color, lo, op, from, to)]
        : [solid(layer.color, (hi + lo) / 2, op, from, to)];
    }
    case "shimmer":
      // Read either as a flickering opacity or as a dimming colour: bound both readings.
      return peak
        ? [solid(layer.color, 1, 0, from, to), solid(layer.color, 1, op, from, to), solid(layer.color, 1 - layer.amount, op, from, to)]
        : [solid(layer.color, 1, (op * layer.amount) / 2, from, to)];
    case "spark":
    case "hold": {
      // Events are off in the typical picture; at peak any of them may be firing at once.
      if (!peak) return [];
      const [a, b] = spotRange(layer.position, layer.widthPixels, pixels);
      const f = Math.max(from, a);
      const t = Math.min(to, b);
      if (t <= f) return [];
      const dim = layer.kind === "hold" ? 1 - layer.flicker : 0;
      return [solid(layer.color, 1, 0, f, t), solid(layer.color, 1, op, f, t), solid(layer.color, dim, op, f, t)];
    }
    case "wipe":
      // A wipe only hides pixels while it runs; the fully lit blade is the brighter case.
      return [];
    case "mirror": {
      const target = mirror(layer.channelId);
      if (!target) return [];
      return [{ r: 0, g: 0, b: 0, alpha: op, from, to, over: mirrorOver(target, pixels, layer.fit, mode) }];
    }
  }
}

/**
 * Bound of one look on a channel of `pixels` pixels, for the lit or unlit blade.
 * `mirror` gives the bound of another channel in the same preset, mode and state.
 */
export function lookBound(look: Look | undefined, pixels: number, mode: Mode, lit: boolean, mirror: (id: string) => Bound | null): Bound {
  const state = lit ? "lit" : "unlit";
  const layers: { blend: Layer["blend"]; states: State[] }[] = [];
  const cuts = new Set<number>([0, pixels]);
  for (const layer of look?.layers ?? []) {
    if (!layer.enabled || (layer.when !== "always" && layer.when !== state)) continue;
    const states = statesOf(layer, pixels, mode, mirror);
    if (states.length === 0) continue;
    layers.push({ blend: layer.blend, states });
    for (const s of states) cuts.add(s.from).add(s.to);
  }
  const starts = [...cuts].sort((a, b) => a - b);
  const runs = starts.length - 1;
  const rgb = new Float32Array(runs * 3);
  for (const { blend: mode, states } of layers) {
    for (let j = 0; j < runs; j++) {
      const a = starts[j];
      const b = starts[j + 1];
      for (let k = 0; k < 3; k++) {
        const under = rgb[j * 3 + k];
        let best = -1;
        for (const s of states) {
          if (a < s.from || a >= s.to) {
            best = Math.max(best, under);
            continue;
          }
          const over = s.over ? s.over(a, b, k) : k === 0 ? s.r : k === 1 ? s.g : s.b;
          best = Math.max(best, blend(mode, under, over, s.alpha));
        }
        rgb[j * 3 + k] = best;
      }
    }
  }
  return { starts, rgb };
}

/** Expands a bound to one 0–1 float triple per pixel. */
export function boundPixels(bound: Bound): Float32Array {
  const pixels = bound.starts[bound.starts.length - 1];
  const out = new Float32Array(pixels * 3);
  for (let j = 0; j < bound.starts.length - 1; j++) {
    for (let i = bound.starts[j]; i < bound.starts[j + 1]; i++) {
      out[i * 3] = bound.rgb[j * 3];
      out[i * 3 + 1] = bound.rgb[j * 3 + 1];
      out[i * 3 + 2] = bound.rgb[j * 3 + 2];
    }
  }
  return out;
}
