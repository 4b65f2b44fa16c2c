// Sensible starting values for each layer kind: what the look editor adds, what the demo
// seed is built from. Keeping them here means the editor, the seed and the tests agree.
import { freshLayerId } from "./layer-ids";
import type { Layer, LayerKind, LayerOf } from "./schema";

const common = { enabled: true, opacity: 1, blend: "normal", when: "always" } as const;

type Draft = { [K in LayerKind]: Omit<LayerOf<K>, "id"> };

/** A new layer of `kind` with a fresh id (unless `overrides` carries one). */
export function newLayer<K extends LayerKind>(kind: K, overrides: Partial<LayerOf<K>> = {}): LayerOf<K> {
  const base: Draft = {
    fill: { kind: "fill", ...common, color: "#3a7bff" },
    gradient: {
      kind: "gradient",
      ...common,
      stops: [
        { at: 0, color: "#3a7bff" },
        { at: 1, color: "#ffffff" },
      ],
    },
    drift: {
      kind: "drift",
      ...common,
      colors: ["#3a7bff", "#0a1f66"],
      bandPixels: 12,
      speedPixelsPerSecond: 40,
      direction: "to-tip",
    },
    breathe: { kind: "breathe", ...common, color: "#3a7bff", periodMs: 2400, floor: 0.35, ceiling: 1 },
    shimmer: { kind: "shimmer", ...common, color: "#000000", amount: 0.15, rateHz: 18, blend: "multiply" },
    spark: {
      kind: "spark",
      ...common,
      event: "clash",
      color: "#ffffff",
      position: 0.5,
      widthPixels: 264,
      decayMs: 180,
    },
    hold: {
      kind: "hold",
      ...common,
      event: "lockup",
      color: "#fff2a8",
      position: 0.55,
      widthPixels: 18,
      flicker: 0.6,
    },
    wipe: { kind: "wipe", ...common, event: "ignition", durationMs: 320, easing: "ease-out" },
    mirror: { kind: "mirror", ...common, channelId: "blade", fit: "stretch" },
  };
  return { id: freshLayerId(), ...base[kind], ...overrides } as unknown as LayerOf<K>;
}
