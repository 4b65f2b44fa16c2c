// Which power figures a request can afford. The engine renders every frame of the demonstration
// sequence for every channel of every preset, so its cost grows with presets × pixels × layers;
// past a budget a request would take many seconds, and the colour bound ("estimate") is used.
import type { ValidateOptions } from "./validate";

/**
 * Pixel-layers the engine may render for one request (engineWork). The demo config is 13,307;
 * on the development machine (2 cores, busy, `npx tsx` timing validateConfig with power
 * "engine") it took 70–120 ms, ~440 ms at 50,060 and ~860 ms at 100,120 (the demo's first preset
 * repeated), so this budget keeps an answer under about a second.
 */
export const ENGINE_BUDGET = 100_000;

/**
 * Fixed cost of one look's render over the sequence, in pixel-layers: measured ~130 µs per look
 * (500 presets × 16 one-pixel channels with no layers took ~1.1 s more than the estimate).
 */
export const LOOK_OVERHEAD = 24;

const obj = (v: unknown): Record<string, unknown> | null => (typeof v === "object" && v !== null && !Array.isArray(v) ? (v as Record<string, unknown>) : null);

/**
 * Σ over presets and rig channels of what rendering each look costs, read defensively from raw
 * input: a fixed overhead plus pixels × (layers + 1), where a mirror layer costs its own pixels plus a whole render of
 * the look it repeats (the engine renders the source again for every mirror layer), so a look
 * of 256 mirrors of a 256-layer look counts as what it is. A mirror cycle counts once (the
 * validator reports it).
 */
export function engineWork(input: unknown): number {
  const config = obj(input);
  const rig = obj(config?.rig);
  const channels = (Array.isArray(rig?.channels) ? rig.channels : []).map(obj);
  const presets = Array.isArray(config?.presets) ? config.presets : [];
  const pixelsOf = new Map<string, number>();
  for (const ch of channels) {
    const id = typeof ch?.id === "string" ? ch.id : "";
    if (!pixelsOf.has(id)) pixelsOf.set(id, typeof ch?.pixels === "number" && Number.isFinite(ch.pixels) ? Math.max(1, ch.pixels) : 1);
  }
  let work = 0;
  for (const p of presets) {
    const looks = obj(obj(p)?.looks);
    const memo = new Map<string, number>();
    const lookCost = (id: string, visiting: Set<string>): number => {
      const known = memo.get(id);
      if (known !== undefined) return known;
      if (visiting.has(id)) return 0;
      visiting.add(id);
      const pixels = pixelsOf.get(id) ?? 1;
      const look = obj(looks?.[id]);
      const layers = Array.isArray(look?.layers) ? look.layers : [];
      let cost = LOOK_OVERHEAD + pixels;
      for (const l of layers) {
        cost += pixels;
        const layer = obj(l);
        if (layer?.kind === "mirror" && typeof layer.channelId === "string") cost += lookCost(layer.channelId, visiting);
      }
      visiting.delete(id);
      memo.set(id, cost);
      return cost;
    };
    for (const ch of channels) work += lookCost(typeof ch?.id === "string" ? ch.id : "", new Set());
  }
  return work;
}

/** "engine" while the config is within the budget, else "estimate". */
export function powerModeFor(input: unknown, budget = ENGINE_BUDGET): NonNullable<ValidateOptions["power"]> {
  return engineWork(input) <= budget ? "engine" : "estimate";
}
