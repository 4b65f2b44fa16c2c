// Pixel-valued fields of a look scale with the channel, so a look keeps its proportions on a
// longer or shorter strip: ranges, drift band widths and speeds, spark and hold widths. Fields
// given as fractions of the channel (positions, gradient stops) and times need nothing.
// Whole-pixel fields are rounded (never below 1), which is where a scaled look departs from an
// exact resampling; the library's test states the tolerance.
import type { Layer, Look } from "../config/schema";

const whole = (v: number, f: number, min: number) => Math.max(min, Math.round(v * f));

/** One layer scaled by from → to pixels (a copy; the id is kept). */
export function scaleLayer(layer: Layer, fromPixels: number, toPixels: number): Layer {
  if (fromPixels === toPixels) return layer;
  const f = toPixels / fromPixels;
  const out = { ...layer } as Layer;
  if (layer.range) {
    const start = Math.min(toPixels - 1, Math.round(layer.range.start * f));
    out.range = { start, end: Math.max(start + 1, Math.min(toPixels, Math.round(layer.range.end * f))) };
  }
  if (out.kind === "drift" && layer.kind === "drift") {
    out.bandPixels = whole(layer.bandPixels, f, 1);
    // The speed follows the rounded band, so a band still takes the same time to pass.
    out.speedPixelsPerSecond = Math.round(layer.speedPixelsPerSecond * (out.bandPixels / layer.bandPixels) * 1000) / 1000;
  }
  if ((out.kind === "spark" && layer.kind === "spark") || (out.kind === "hold" && layer.kind === "hold")) out.widthPixels = whole(layer.widthPixels, f, 1);
  return out;
}

/** A look made on `fromPixels` pixels, for a channel of `toPixels`. */
export function scaleLook(look: Look, fromPixels: number, toPixels: number): Look {
  if (fromPixels === toPixels) return structuredClone(look);
  return { layers: look.layers.map((l) => structuredClone(scaleLayer(l, fromPixels, toPixels))) };
}
