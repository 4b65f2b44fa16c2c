// What the generic header's tables hold: for each C field, the model field it reads into and
// how its value is written. Fields whose model key starts with '$' are derived (counts and
// indices for the firmware) and are checked rather than read.
import { BLEND_MODES, CHANNEL_ROLES, COLOR_ORDERS, CONTROL_EVENTS, CUES, EASINGS, GESTURES, LAYER_KINDS, MOTIONS } from "../config/schema";

export type Kind = "num" | "str" | "bool" | "color" | "numlist" | { group: string; values: readonly string[] } | { listOf: { group: string; values: readonly string[] } };
export type Spec = Record<string, { key: string; kind: Kind } | null>;

const enumOf = (group: string, values: readonly string[]) => ({ group, values });
export const snakeUpper = (v: string) => v.replace(/[^A-Za-z0-9]+/g, "_").toUpperCase();
const f = (key: string, kind: Kind) => ({ key, kind });

export const BOARD: Spec = { profile: f("profile", "str"), data_pins: f("dataPins", "numlist"), data_pin_count: f("$dataPinCount", "num"), input_pins: f("inputPins", "numlist"), input_pin_count: f("$inputPinCount", "num"), max_pixels_per_pin: f("maxPixelsPerPin", "num"), idle_milliamps: f("idleMilliamps", "num") };
export const POWER: Spec = Object.fromEntries(
  ["cellCapacityMah", "cellNominalVolts", "cellMaxContinuousAmps", "wireGaugeAwg", "wireLengthMm", "brightnessCap", "ledMilliampsPerColor", "pixelIdleMilliamps"].map((k) => [snake(k), f(k, "num")]),
);
export const SPEAKER: Spec = Object.fromEntries(["impedanceOhms", "ratedPowerWatts", "amplifierEfficiency"].map((k) => [snake(k), f(k, "num")]));
export const CHANNEL: Spec = { id: f("id", "str"), name: f("name", "str"), role: f("role", enumOf("ROLE", CHANNEL_ROLES)), pixels: f("pixels", "num"), parallel_strips: f("parallelStrips", "num"), pin: f("pin", "num"), color_order: f("colorOrder", enumOf("ORDER", COLOR_ORDERS)) };
export const BUTTON: Spec = { id: f("id", "str"), name: f("name", "str"), kind: f("kind", enumOf("BUTTON", ["activation", "auxiliary"])), pin: f("pin", "num") };
export const FONT: Spec = { id: f("id", "str"), name: f("name", "str"), folder: f("folder", "str"), status: f("status", enumOf("FONT", ["promised", "received", "invalid"])), cues: f("cues", { listOf: enumOf("CUE", CUES) }), cue_count: f("$cueCount", "num") };
export const PRESET: Spec = { id: f("id", "str"), name: f("name", "str"), font_id: f("fontId", "str"), font: f("$font", "num"), first_look: f("$first", "num"), look_count: f("$count", "num") };
export const LOOK: Spec = { preset: f("preset", "num"), channel_id: f("channelId", "str"), channel: f("$channel", "num"), first_layer: f("$first", "num"), layer_count: f("$count", "num") };
const EVENT = enumOf("EVENT", CONTROL_EVENTS);
export const LAYER: Spec = {
  look: f("look", "num"), kind: f("kind", enumOf("LAYER", LAYER_KINDS)), enabled: f("enabled", "bool"), opacity: f("opacity", "num"),
  blend: f("blend", enumOf("BLEND", BLEND_MODES)), when: f("when", enumOf("WHEN", ["always", "lit", "unlit"])),
  has_range: f("hasRange", "bool"), range_start: f("rangeStart", "num"), range_end: f("rangeEnd", "num"), color: f("color", "color"),
  first_stop: f("$first", "num"), stop_count: f("$count", "num"), band_pixels: f("bandPixels", "num"), speed_pixels_per_second: f("speedPixelsPerSecond", "num"),
  direction: f("direction", enumOf("DIRECTION", ["to-tip", "to-base"])), period_ms: f("periodMs", "num"), floor: f("floor", "num"),
  ceiling: f("ceiling", "num"), amount: f("amount", "num"), rate_hz: f("rateHz", "num"), event: f("event", EVENT), position: f("position", "num"),
  width_pixels: f("widthPixels", "num"), decay_ms: f("decayMs", "num"), flicker: f("flicker", "num"), duration_ms: f("durationMs", "num"),
  easing: f("easing", enumOf("EASING", EASINGS)), channel_id: f("channelId", "str"), fit: f("fit", enumOf("FIT", ["stretch", "crop"])),
};
export const STOP: Spec = { layer: f("layer", "num"), at: f("at", "num"), color: f("color", "color") };
export const CONTROL: Spec = {
  event: f("event", EVENT), input: f("input", enumOf("INPUT", ["button", "motion"])), button_id: f("buttonId", "str"), button: f("$button", "num"),
  gesture: f("gesture", enumOf("GESTURE", GESTURES)), motion: f("motion", enumOf("MOTION", MOTIONS)), state: f("state", enumOf("STATE", ["lit", "unlit", "any"])),
};
/** Fields each layer kind carries besides the common ones, in model order. */
export const KIND_FIELDS: Record<string, string[]> = {
  fill: ["color"], gradient: [], drift: ["bandPixels", "speedPixelsPerSecond", "direction"], breathe: ["color", "periodMs", "floor", "ceiling"],
  shimmer: ["color", "amount", "rateHz"], spark: ["event", "color", "position", "widthPixels", "decayMs"], hold: ["event", "color", "position", "widthPixels", "flicker"],
  wipe: ["event", "durationMs", "easing"], mirror: ["channelId", "fit"],
};

export function snake(k: string): string {
  return k.replace(/([a-z0-9])([A-Z])/g, "$1_$2").toLowerCase();
}
