// The hand-written JavaScript renderer of generic-header and the helpers every comparison
// renderer shares (counters, cident scopes, enum names). Plain code with no Node imports, so the
// browser bench can bundle it too.
import type { Config } from "../../app/lib/config/schema";
import { toCComment, toCDouble, toCIdentifier, toCString } from "../../app/lib/template/cfilters";
import type { RenderMeta } from "../../app/lib/template/compile";

// ---------------------------------------------------------------- shared helpers

/** Per-render state of the other engines: counters and cident scopes, reset before each render. */
export let counters = new Map<string, number>();
export let idents = new Map<string, Map<string, string>>();
export function reset() {
  counters = new Map();
  idents = new Map();
}
// Enum names repeat: every renderer gets the same memo that generic-header's `snake` filter has.
const suMemo = new Map<string, string>();
export const su = (s: string) => {
  let r = suMemo.get(s);
  if (r === undefined) suMemo.set(s, (r = s.replace(/([a-z0-9])([A-Z])/g, "$1_$2").replace(/[^A-Za-z0-9]+/g, "_").toUpperCase()));
  return r;
};
export const hex = (c: string) => "0x" + c.slice(1);
export function cident(s: string, scope: string): string {
  let t = idents.get(scope);
  if (!t) idents.set(scope, (t = new Map()));
  const known = t.get(s);
  if (known !== undefined) return known;
  const base = toCIdentifier(s);
  const taken = new Set(t.values());
  let name = base;
  for (let i = 2; taken.has(name); i++) name = `${base}_${i}`;
  t.set(s, name);
  return name;
}
export const indexOf = (list: Record<string, unknown>[], key: string, value: unknown) => list.findIndex((x) => x[key] === value);
export const count = (x: unknown) => (Array.isArray(x) ? x.length : x && typeof x === "object" ? Object.keys(x).length : 0);

// ---------------------------------------------------------------- hand-written JavaScript

/** The fixed C of generic-header (its type declarations and accessors), which every renderer copies. */
export function headerParts(source: string): { types: string; accessors: string } {
  return {
    types: "typedef enum { HB_ROLE_MAIN_BLADE" + source.split("typedef enum { HB_ROLE_MAIN_BLADE")[1].split("@[ let board")[0],
    accessors: source.split("/* Accessors:")[1],
  };
}

export function handWritten(config: Config, meta: RenderMeta, { types: TYPES, accessors: ACCESSORS }: { types: string; accessors: string }): string {
  reset();
  const o: string[] = [];
  o.push(`/*\n * Hiltbench configuration header\n * build:    ${toCComment(meta.buildName)}\n`);
  if (meta.clientName) o.push(` * client:   ${toCComment(meta.clientName)}\n`);
  o.push(` * saved:    ${toCComment(meta.savedAt)}\n`);
  if (meta.revision !== undefined) o.push(` * revision: ${meta.revision}\n`);
  o.push(` * template: ${toCComment(meta.templateName)} v${meta.templateVersion}\n *\n * Generated from the build's config. Edit it in Hiltbench, or edit this file and read it\n * back in: every table entry is one line of designated initializers.\n */\n#ifndef HB_CONFIG_H\n#define HB_CONFIG_H\n\n#include <stdbool.h>\n#include <stdint.h>\n\n#define HB_FORMAT ${toCString(config.format)}\n\n`);
  let looks = 0, layers = 0, stops = 0;
  for (const p of config.presets)
    for (const key of Object.keys(p.looks)) {
      looks++;
      layers += p.looks[key].layers.length;
      for (const l of p.looks[key].layers) stops += l.kind === "gradient" ? l.stops.length : l.kind === "drift" ? l.colors.length : 0;
    }
  const { rig } = config;
  o.push(`#define HB_CHANNEL_COUNT  ${rig.channels.length}\n#define HB_BUTTON_COUNT   ${rig.buttons.length}\n#define HB_FONT_COUNT     ${config.fonts.length}\n#define HB_PRESET_COUNT   ${config.presets.length}\n#define HB_LOOK_COUNT     ${looks}\n#define HB_LAYER_COUNT    ${layers}\n#define HB_STOP_COUNT     ${stops}\n#define HB_CONTROL_COUNT  ${config.controls.length}\n\n`);
  rig.channels.forEach((c, i) => o.push(`#define HB_CH_${cident(c.id, "channel").toUpperCase().padEnd(18)} ${i}\n`));
  rig.buttons.forEach((b, i) => o.push(`#define HB_BTN_${cident(b.id, "button").toUpperCase().padEnd(17)} ${i}\n`));
  config.presets.forEach((p, i) => o.push(`#define HB_PRESET_${cident(p.id, "preset").toUpperCase().padEnd(14)} ${i}\n`));
  o.push("\n" + TYPES);
  const b = rig.board;
  o.push(`static const hb_board_t hb_board = {\n  .profile = ${toCString(b.profile)},\n  .data_pins = { ${b.dataPins.join(", ")} }, .data_pin_count = ${b.dataPins.length},\n`);
  if (b.inputPins.length) o.push(`  .input_pins = { ${b.inputPins.join(", ")} }, .input_pin_count = ${b.inputPins.length},\n`);
  o.push(`  .max_pixels_per_pin = ${b.maxPixelsPerPin},\n  .idle_milliamps = ${toCDouble(b.idleMilliamps)},\n};\n\n`);
  const pw = rig.power;
  o.push(`static const hb_power_t hb_power = {\n  .cell_capacity_mah        = ${toCDouble(pw.cellCapacityMah)},\n  .cell_nominal_volts       = ${toCDouble(pw.cellNominalVolts)},\n  .cell_max_continuous_amps = ${toCDouble(pw.cellMaxContinuousAmps)},\n  .wire_gauge_awg           = ${pw.wireGaugeAwg},\n  .wire_length_mm           = ${toCDouble(pw.wireLengthMm)},\n  .brightness_cap           = ${toCDouble(pw.brightnessCap)},\n  .led_milliamps_per_color  = ${toCDouble(pw.ledMilliampsPerColor)},\n  .pixel_idle_milliamps     = ${toCDouble(pw.pixelIdleMilliamps)},\n};\n\n`);
  const sp = rig.speaker;
  o.push(`static const hb_speaker_t hb_speaker = {\n  .impedance_ohms       = ${toCDouble(sp.impedanceOhms)},\n  .rated_power_watts    = ${toCDouble(sp.ratedPowerWatts)},\n  .amplifier_efficiency = ${toCDouble(sp.amplifierEfficiency)},\n};\n\n`);
  o.push("/* Every table has one zeroed entry past the end, so even an empty table is valid C. */\nstatic const hb_channel_t hb_channels[HB_CHANNEL_COUNT + 1] = {\n");
  rig.channels.forEach((c, i) => o.push(`  [${i}] = { .id = ${toCString(c.id)}, .name = ${toCString(c.name)}, .role = HB_ROLE_${su(c.role)}, .pixels = ${c.pixels}, .parallel_strips = ${c.parallelStrips}, .pin = ${c.pin}, .color_order = HB_ORDER_${c.colorOrder} },\n`));
  o.push("};\n\nstatic const hb_button_t hb_buttons[HB_BUTTON_COUNT + 1] = {\n");
  rig.buttons.forEach((x, i) => o.push(`  [${i}] = { .id = ${toCString(x.id)}, .name = ${toCString(x.name)}, .kind = HB_BUTTON_${x.kind.toUpperCase()}, .pin = ${x.pin} },\n`));
  if (!rig.buttons.length) o.push("  { 0 },\n");
  o.push("};\n\nstatic const hb_font_t hb_fonts[HB_FONT_COUNT + 1] = {\n");
  config.fonts.forEach((f, i) => {
    o.push(`  [${i}] = { .id = ${toCString(f.id)}, .name = ${toCString(f.name)}, .folder = ${toCString(f.folder)}, .status = HB_FONT_${f.status.toUpperCase()}`);
    if (f.cues.length) o.push(`, .cues = { ${f.cues.map((c) => "HB_CUE_" + c.toUpperCase()).join(", ")} }`);
    o.push(`, .cue_count = ${f.cues.length} },\n`);
  });
  if (!config.fonts.length) o.push("  { 0 },\n");
  o.push("};\n\nstatic const hb_preset_t hb_presets[HB_PRESET_COUNT + 1] = {\n");
  let look = 0;
  config.presets.forEach((p, i) => {
    const n = Object.keys(p.looks).length;
    o.push(`  [${i}] = { .id = ${toCString(p.id)}, .name = ${toCString(p.name)}, .font_id = ${toCString(p.fontId)}, .font = ${indexOf(config.fonts, "id", p.fontId)}, .first_look = ${look}, .look_count = ${n} },\n`);
    look += n;
  });
  if (!config.presets.length) o.push("  { 0 },\n");
  o.push("};\n\nstatic const hb_look_t hb_looks[HB_LOOK_COUNT + 1] = {\n");
  look = 0;
  let layer = 0;
  config.presets.forEach((p, pi) => {
    for (const key of Object.keys(p.looks)) {
      const ls = p.looks[key].layers;
      o.push(`  [${look}] = { .preset = ${pi}, .channel_id = ${toCString(key)}, .channel = ${indexOf(rig.channels, "id", key)}, .first_layer = ${layer}, .layer_count = ${ls.length} },\n`);
      look++;
      layer += ls.length;
    }
  });
  if (look === 0) o.push("  { 0 },\n");
  o.push("};\n\nstatic const hb_layer_t hb_layers[HB_LAYER_COUNT + 1] = {\n");
  look = 0;
  layer = 0;
  let stop = 0;
  for (const p of config.presets) {
    for (const key of Object.keys(p.looks)) {
      for (const l of p.looks[key].layers) {
        o.push(`  [${layer}] = { .look = ${look}, .kind = HB_LAYER_${l.kind.toUpperCase()}, .enabled = ${l.enabled}, .opacity = ${toCDouble(l.opacity)}, .blend = HB_BLEND_${su(l.blend)}, .when = HB_WHEN_${su(l.when)}`);
        if (l.range) o.push(`, .has_range = true, .range_start = ${l.range.start}, .range_end = ${l.range.end}`);
        switch (l.kind) {
          case "fill": o.push(`, .color = ${hex(l.color)}`); break;
          case "gradient": o.push(`, .first_stop = ${stop}, .stop_count = ${l.stops.length}`); stop += l.stops.length; break;
          case "drift": o.push(`, .first_stop = ${stop}, .stop_count = ${l.colors.length}, .band_pixels = ${l.bandPixels}, .speed_pixels_per_second = ${toCDouble(l.speedPixelsPerSecond)}, .direction = HB_DIRECTION_${su(l.direction)}`); stop += l.colors.length; break;
          case "breathe": o.push(`, .color = ${hex(l.color)}, .period_ms = ${toCDouble(l.periodMs)}, .floor = ${toCDouble(l.floor)}, .ceiling = ${toCDouble(l.ceiling)}`); break;
          case "shimmer": o.push(`, .color = ${hex(l.color)}, .amount = ${toCDouble(l.amount)}, .rate_hz = ${toCDouble(l.rateHz)}`); break;
          case "spark": o.push(`, .event = HB_EVENT_${l.event.toUpperCase()}, .color = ${hex(l.color)}, .position = ${toCDouble(l.position)}, .width_pixels = ${l.widthPixels}, .decay_ms = ${toCDouble(l.decayMs)}`); break;
          case "hold": o.push(`, .event = HB_EVENT_${l.event.toUpperCase()}, .color = ${hex(l.color)}, .position = ${toCDouble(l.position)}, .width_pixels = ${l.widthPixels}, .flicker = ${toCDouble(l.flicker)}`); break;
          case "wipe": o.push(`, .event = HB_EVENT_${l.event.toUpperCase()}, .duration_ms = ${toCDouble(l.durationMs)}, .easing = HB_EASING_${su(l.easing)}`); break;
          case "mirror": o.push(`, .channel_id = ${toCString(l.channelId)}, .fit = HB_FIT_${l.fit.toUpperCase()}`); break;
        }
        o.push(" },\n");
        layer++;
      }
      look++;
    }
  }
  if (layer === 0) o.push("  { 0 },\n");
  o.push("};\n\nstatic const hb_stop_t hb_stops[HB_STOP_COUNT + 1] = {\n");
  layer = 0;
  stop = 0;
  for (const p of config.presets)
    for (const key of Object.keys(p.looks))
      for (const l of p.looks[key].layers) {
        if (l.kind === "gradient") for (const s of l.stops) o.push(`  [${stop++}] = { .layer = ${layer}, .at = ${toCDouble(s.at)}, .color = ${hex(s.color)} },\n`);
        else if (l.kind === "drift") for (const c of l.colors) o.push(`  [${stop++}] = { .layer = ${layer}, .color = ${hex(c)} },\n`);
        layer++;
      }
  if (stop === 0) o.push("  { 0 },\n");
  o.push("};\n\nstatic const hb_control_t hb_controls[HB_CONTROL_COUNT + 1] = {\n");
  config.controls.forEach((k, i) => {
    const t = k.trigger;
    o.push(`  [${i}] = { .event = HB_EVENT_${su(k.event)}, .input = HB_INPUT_${t.input.toUpperCase()}`);
    if (t.input === "button") o.push(`, .button_id = ${toCString(t.buttonId)}, .button = ${indexOf(rig.buttons, "id", t.buttonId)}, .gesture = HB_GESTURE_${su(t.gesture)}`);
    else o.push(`, .motion = HB_MOTION_${t.motion.toUpperCase()}`);
    o.push(`, .state = HB_STATE_${t.state.toUpperCase()} },\n`);
  });
  if (!config.controls.length) o.push("  { 0 },\n");
  o.push("};\n\n/* Accessors:" + ACCESSORS);
  return o.join("");
}

