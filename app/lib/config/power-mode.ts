// Which power figures a request can afford. The engine renders every frame of the demonstration
// sequence for every channel of every preset, so its cost grows with presets × pixels × layers;
// past a budget a request would take many seconds, and the colour bound ("estimate") is used.
import type { ValidateOptions } from "./validate";

/**
 * Pixel-layers the engine may render for one request. The demo config is 6,491; on the
 * development machine (2 cores) the engine took ~75 ms for it, ~255 ms at 24,000 and ~490 ms at
 * 48,760 (the demo's first preset repeated), so this budget keeps an answer near half a second.
 */
export const ENGINE_BUDGET = 50_000;

const obj = (v: unknown): Record<string, unknown> | null => (typeof v === "object" && v !== null && !Array.isArray(v) ? (v as Record<string, unknown>) : null);

/** Σ over presets and rig channels of pixels × (layers + 1), read defensively from raw input. */
export function engineWork(input: unknown): number {
  const config = obj(input);
  const rig = obj(config?.rig);
  const channels = Array.isArray(rig?.channels) ? rig.channels : [];
  const presets = Array.isArray(config?.presets) ? config.presets : [];
  let work = 0;
  for (const p of presets) {
    const looks = obj(obj(p)?.looks);
    for (const c of channels) {
      const ch = obj(c);
      const pixels = typeof ch?.pixels === "number" && Number.isFinite(ch.pixels) ? Math.max(1, ch.pixels) : 1;
      const look = obj(looks?.[typeof ch?.id === "string" ? ch.id : ""]);
      const layers = Array.isArray(look?.layers) ? look.layers.length : 0;
      work += pixels * (layers + 1);
    }
  }
  return work;
}

/** "engine" while the config is within the budget, else "estimate". */
export function powerModeFor(input: unknown, budget = ENGINE_BUDGET): NonNullable<ValidateOptions["power"]> {
  return engineWork(input) <= budget ? "engine" : "estimate";
}
