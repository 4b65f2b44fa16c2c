// Times and rates an installer would accept. The ranges are common workshop practice, not a
// standard: outside them an effect still runs but looks broken (a wipe too fast to see, a
// breathe so slow it reads as a steady colour), so they are warnings. Zero or less is an error.
import type { Layer } from "../../config/schema";
import type { RuleCode } from "./codes";
import { pathOf, type LayerCheck } from "./context";

type Range = { min: number; max: number; unit: string; code: RuleCode; what: string };

export const TIMING_RANGES = {
  ignition: { min: 100, max: 5000, unit: "ms", code: "wipe-duration-out-of-range", what: "An ignition wipe" },
  retraction: { min: 100, max: 5000, unit: "ms", code: "wipe-duration-out-of-range", what: "A retraction wipe" },
  breathe: { min: 500, max: 20000, unit: "ms", code: "breathe-period-out-of-range", what: "A breathe period" },
  spark: { min: 20, max: 3000, unit: "ms", code: "spark-decay-out-of-range", what: "A spark decay" },
  shimmer: { min: 0.5, max: 60, unit: "Hz", code: "shimmer-rate-out-of-range", what: "A shimmer rate" },
} satisfies Record<string, Range>;

function timingOf(layer: Layer): { value: number; field: string; range: Range } | null {
  switch (layer.kind) {
    case "wipe":
      return { value: layer.durationMs, field: "durationMs", range: TIMING_RANGES[layer.event] };
    case "breathe":
      return { value: layer.periodMs, field: "periodMs", range: TIMING_RANGES.breathe };
    case "spark":
      return { value: layer.decayMs, field: "decayMs", range: TIMING_RANGES.spark };
    case "shimmer":
      return { value: layer.rateHz, field: "rateHz", range: TIMING_RANGES.shimmer };
    default:
      return null;
  }
}

export const timingLayerCheck: LayerCheck = (ctx, layer, at) => {
  const t = timingOf(layer);
  if (!t) return;
  const { value, field, range } = t;
  if (value > 0 && value >= range.min && value <= range.max) return;
  const span = `${range.min}–${range.max} ${range.unit}`;
  if (value <= 0) ctx.sink.error("timing-not-positive", pathOf(at, field), `${range.what} of ${value} ${range.unit} cannot run; it must be above zero.`, `Use a value in the usual range, ${span}.`);
  else
    ctx.sink.warning(range.code, pathOf(at, field), `${range.what} of ${value} ${range.unit} is outside the usual ${span}.`, value < range.min ? `Raise it to at least ${range.min} ${range.unit} so it can be seen.` : `Lower it to ${range.max} ${range.unit} or less.`);
};
