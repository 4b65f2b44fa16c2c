// A conservative picture of a look without running the effect engine: an upper bound on each
// colour of each pixel (for peaks) or a rough time-average (for typical draw). Every blend mode
// here is monotone in both the colour underneath and the layer's own colour, so a layer whose
// brightness varies (breathe, shimmer, hold flicker) is bounded by its brightest colour, and a
// layer that may be absent (an event, a flicker to nothing) by the larger of "on" and "off".
// Pixels are grouped into runs every layer treats alike: a 264-pixel blade costs a dozen runs.
import type { Layer, Look } from "../config/schema";

export type Mode = "peak" | "typical";

/**
 * Piecewise-constant RGB (0–1): run j covers pixels [starts[j], starts[j+1]) and has colour
 * rgb[3j..3j+2]; starts ends with the pixel count.
 */
export type Bound = { starts: number[]; rgb: number[] };

/**
 * One layer reduced to a colour over pixels [from, to). `over` gives a per-pixel colour's
 * component k maxed (peak) or averaged (typical) over a run; `optional` means the layer may
 * also be absent, so the colour underneath can show through unchanged.
 */
type Part = {
  blend: Layer["blend"];
  r: number;
  g: number;
  b: number;
  alpha: number;
  from: number;
  to: number;
  optional: boolean;
  over: ((from: number, to: number, k: number) => number) | null;
};

function hexDigit(c: number): number {
  // '0'–'9', 'A'–'F', 'a'–'f'; the schema has already checked the characters.
  return c <= 57 ? c - 48 : (c | 32) - 87;
}

/**
 * One channel of #rrggbb as 0–1, without allocating strings. Hot paths in this folder avoid
 * named inner closures: the TypeScript runner wraps each in a naming call that costs ~0.5 µs.
 */
function hexByte(hex: string, at: number): number {
  return (hexDigit(hex.charCodeAt(at)) * 16 + hexDigit(hex.charCodeAt(at + 1))) / 255;
}

/** Whether a look shows the same layers lit and unlit (then one bound serves both). */
export function litMatters(look: Look | undefined): boolean {
  return look?.layers.some((l) => l.enabled && l.when !== "always") ?? false;
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

function solid(layer: Layer, hex: string, k: number, alpha: number, from: number, to: number, optional = false): Part {
  return { blend: layer.blend, r: hexByte(hex, 1) * k, g: hexByte(hex, 3) * k, b: hexByte(hex, 5) * k, alpha, from, to, optional, over: null };
}

function perPixel(layer: Layer, alpha: number, from: number, to: number, over: Part["over"]): Part {
  return { blend: layer.blend, r: 0, g: 0, b: 0, alpha, from, to, optional: false, over };
}

type Stop = { at: number; color: string };

function gradientAt(stops: Stop[], pixels: number, i: number, k: number): number {
  const t = pixels === 1 ? 0 : i / (pixels - 1);
  let s = 0;
  while (s < stops.length - 2 && t > stops[s + 1].at) s++;
  const a = stops[s];
  const b = stops[s + 1];
  const span = b.at - a.at;
  const f = span <= 0 ? (t >= b.at ? 1 : 0) : Math.min(1, Math.max(0, (t - a.at) / span));
  const ca = hexByte(a.color, 1 + 2 * k);
  return ca + (hexByte(b.color, 1 + 2 * k) - ca) * f;
}

function gradientOver(layer: Extract<Layer, { kind: "gradient" }>, pixels: number, mode: Mode) {
  const stops = [...layer.stops].sort((a, b) => a.at - b.at);
  return (from: number, to: number, k: number) => {
    let v = 0;
    for (let i = from; i < to; i++) v = mode === "peak" ? Math.max(v, gradientAt(stops, pixels, i, k)) : v + gradientAt(stops, pixels, i, k) / (to - from);
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

function partOf(layer: Layer, pixels: number, mode: Mode, mirror: (id: string) => Bound | null): Part | null {
  const [from, to] = layerRange(layer, pixels);
  if (to <= from) return null;
  const op = layer.opacity;
  const peak = mode === "peak";
  switch (layer.kind) {
    case "fill":
      return solid(layer, layer.color, 1, op, from, to);
    case "gradient":
      return perPixel(layer, op, from, to, gradientOver(layer, pixels, mode));
    case "drift": {
      // Bands move past every pixel, so a pixel can show any of the colours.
      let r = 0;
      let g = 0;
      let b = 0;
      const n = layer.colors.length;
      for (const hex of layer.colors) {
        const cr = hexByte(hex, 1);
        const cg = hexByte(hex, 3);
        const cb = hexByte(hex, 5);
        if (peak) {
          r = Math.max(r, cr);
          g = Math.max(g, cg);
          b = Math.max(b, cb);
        } else {
          r += cr / n;
          g += cg / n;
          b += cb / n;
        }
      }
      return { blend: layer.blend, r, g, b, alpha: op, from, to, optional: false, over: null };
    }
    case "breathe": {
      const hi = Math.max(layer.floor, layer.ceiling);
      const lo = Math.min(layer.floor, layer.ceiling);
      return solid(layer, layer.color, peak ? hi : (hi + lo) / 2, op, from, to);
    }
    case "shimmer":
      // Read either as a flickering opacity (0 up to full) or as a dimming colour: at peak the
      // full-opacity colour and "no layer at all" bound both readings.
      return peak ? solid(layer, layer.color, 1, op, from, to, true) : solid(layer, layer.color, 1, (op * layer.amount) / 2, from, to);
    case "spark":
    case "hold": {
      // Events are off in the typical picture; at peak any of them may be firing at once.
      if (!peak) return null;
      const [a, b] = spotRange(layer.position, layer.widthPixels, pixels);
      const f = Math.max(from, a);
      const t = Math.min(to, b);
      return t <= f ? null : solid(layer, layer.color, 1, op, f, t, true);
    }
    case "wipe":
      // A wipe only hides pixels while it runs; the fully lit blade is the brighter case.
      return null;
    case "mirror": {
      const target = mirror(layer.channelId);
      return target ? perPixel(layer, op, from, to, mirrorOver(target, pixels, layer.fit, mode)) : null;
    }
  }
}

function insertCut(starts: number[], v: number): void {
  let i = starts.length;
  while (i > 0 && starts[i - 1] > v) i--;
  if (starts[i - 1] !== v) starts.splice(i, 0, v);
}

/**
 * Bound of one look on a channel of `pixels` pixels, for the lit or unlit blade.
 * `mirror` gives the bound of another channel in the same preset, mode and state.
 */
export function lookBound(look: Look | undefined, pixels: number, mode: Mode, lit: boolean, mirror: (id: string) => Bound | null): Bound {
  const state = lit ? "lit" : "unlit";
  const parts: Part[] = [];
  // Cut points, kept sorted and unique by insertion: a look has a few dozen at most.
  const starts: number[] = [0, pixels];
  for (const layer of look?.layers ?? []) {
    if (!layer.enabled || (layer.when !== "always" && layer.when !== state)) continue;
    const part = partOf(layer, pixels, mode, mirror);
    if (!part) continue;
    parts.push(part);
    insertCut(starts, part.from);
    insertCut(starts, part.to);
  }
  const runs = starts.length - 1;
  const rgb: number[] = new Array(runs * 3).fill(0);
  for (const p of parts) {
    for (let j = 0; j < runs; j++) {
      const a = starts[j];
      if (a < p.from || a >= p.to) continue;
      for (let k = 0; k < 3; k++) {
        const under = rgb[j * 3 + k];
        const over = p.over ? p.over(a, starts[j + 1], k) : k === 0 ? p.r : k === 1 ? p.g : p.b;
        const v = blend(p.blend, under, over, p.alpha);
        rgb[j * 3 + k] = p.optional && under > v ? under : v;
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
