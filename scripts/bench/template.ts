// Template rendering speed: the demo config through generic-header, measured against the same
// header written for Handlebars and for liquidjs (pre-compiled, same data, same helpers for the
// C escaping) and against a hand-written JavaScript renderer. All four must produce the same
// bytes; the figures are ratios measured in the same run.
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import Handlebars from "handlebars";
import { Liquid } from "liquidjs";
import { demoConfig } from "../../app/lib/config/demo";
import type { Config } from "../../app/lib/config/schema";
import { templateCache } from "../../app/lib/template/cache";
import { toCComment, toCDouble, toCString } from "../../app/lib/template/cfilters";
import { collect } from "./gc";
import { count, counters, cident, handWritten, headerParts, hex, indexOf, reset, su } from "./handwritten";
import { compileTemplate, renderTemplate, type RenderMeta } from "../../app/lib/template/compile";

const META: RenderMeta = {
  buildName: "Kestrel",
  clientName: "client-one@example.test",
  savedAt: "2026-03-14T09:30:00Z",
  revision: 7,
  templateName: "generic-header",
  templateVersion: 1,
};

const { types: TYPES, accessors: ACCESSORS } = headerParts(readFileSync(fileURLToPath(new URL("../../templates/generic-header.hbt", import.meta.url)), "utf8"));

// ---------------------------------------------------------------- Handlebars

const HBS_LAYER =
  '  [{{get "layer"}}] = { .look = {{get "look"}}, .kind = HB_LAYER_{{upper kind}}, .enabled = {{enabled}}, .opacity = {{cdouble opacity}}, .blend = HB_BLEND_{{su blend}}, .when = HB_WHEN_{{su when}}' +
  "{{#if range}}, .has_range = true, .range_start = {{range.start}}, .range_end = {{range.end}}{{/if}}" +
  '{{#if (eq kind "fill")}}, .color = {{hex color}}' +
  '{{else if (eq kind "gradient")}}, .first_stop = {{get "stop"}}, .stop_count = {{count stops}}{{add "stop" (count stops)}}' +
  '{{else if (eq kind "drift")}}, .first_stop = {{get "stop"}}, .stop_count = {{count colors}}, .band_pixels = {{bandPixels}}, .speed_pixels_per_second = {{cdouble speedPixelsPerSecond}}, .direction = HB_DIRECTION_{{su direction}}{{add "stop" (count colors)}}' +
  '{{else if (eq kind "breathe")}}, .color = {{hex color}}, .period_ms = {{cdouble periodMs}}, .floor = {{cdouble floor}}, .ceiling = {{cdouble ceiling}}' +
  '{{else if (eq kind "shimmer")}}, .color = {{hex color}}, .amount = {{cdouble amount}}, .rate_hz = {{cdouble rateHz}}' +
  '{{else if (eq kind "spark")}}, .event = HB_EVENT_{{upper event}}, .color = {{hex color}}, .position = {{cdouble position}}, .width_pixels = {{widthPixels}}, .decay_ms = {{cdouble decayMs}}' +
  '{{else if (eq kind "hold")}}, .event = HB_EVENT_{{upper event}}, .color = {{hex color}}, .position = {{cdouble position}}, .width_pixels = {{widthPixels}}, .flicker = {{cdouble flicker}}' +
  '{{else if (eq kind "wipe")}}, .event = HB_EVENT_{{upper event}}, .duration_ms = {{cdouble durationMs}}, .easing = HB_EASING_{{su easing}}' +
  '{{else if (eq kind "mirror")}}, .channel_id = {{cstr channelId}}, .fit = HB_FIT_{{upper fit}}{{/if}} },{{add "layer" 1}}\n';

const HBS = `/*
 * Hiltbench configuration header
 * build:    {{ccomment meta.buildName}}
{{#if meta.clientName}}
 * client:   {{ccomment meta.clientName}}
{{/if}}
 * saved:    {{ccomment meta.savedAt}}
{{#if (isset meta.revision)}}
 * revision: {{meta.revision}}
{{/if}}
 * template: {{ccomment meta.templateName}} v{{meta.templateVersion}}
 *
 * Generated from the build's config. Edit it in Hiltbench, or edit this file and read it
 * back in: every table entry is one line of designated initializers.
 */
#ifndef HB_CONFIG_H
#define HB_CONFIG_H

#include <stdbool.h>
#include <stdint.h>

#define HB_FORMAT {{cstr config.format}}{{set "looks" 0}}{{set "layers" 0}}{{set "stops" 0}}{{#each config.presets}}{{#each looks}}{{add "looks" 1}}{{add "layers" (count layers)}}{{#each layers}}{{#if (eq kind "gradient")}}{{add "stops" (count stops)}}{{else if (eq kind "drift")}}{{add "stops" (count colors)}}{{/if}}{{/each}}{{/each}}{{/each}}

#define HB_CHANNEL_COUNT  {{count config.rig.channels}}
#define HB_BUTTON_COUNT   {{count config.rig.buttons}}
#define HB_FONT_COUNT     {{count config.fonts}}
#define HB_PRESET_COUNT   {{count config.presets}}
#define HB_LOOK_COUNT     {{get "looks"}}
#define HB_LAYER_COUNT    {{get "layers"}}
#define HB_STOP_COUNT     {{get "stops"}}
#define HB_CONTROL_COUNT  {{count config.controls}}

{{#each config.rig.channels}}
#define HB_CH_{{pad (upper (cident id "channel")) 18}} {{@index}}
{{/each}}
{{#each config.rig.buttons}}
#define HB_BTN_{{pad (upper (cident id "button")) 17}} {{@index}}
{{/each}}
{{#each config.presets}}
#define HB_PRESET_{{pad (upper (cident id "preset")) 14}} {{@index}}
{{/each}}

{{{types}}}static const hb_board_t hb_board = {
  .profile = {{cstr config.rig.board.profile}},
  .data_pins = { {{join config.rig.board.dataPins ", "}} }, .data_pin_count = {{count config.rig.board.dataPins}},
{{#if (count config.rig.board.inputPins)}}
  .input_pins = { {{join config.rig.board.inputPins ", "}} }, .input_pin_count = {{count config.rig.board.inputPins}},
{{/if}}
  .max_pixels_per_pin = {{config.rig.board.maxPixelsPerPin}},
  .idle_milliamps = {{cdouble config.rig.board.idleMilliamps}},
};

{{#with config.rig.power}}
static const hb_power_t hb_power = {
  .cell_capacity_mah        = {{cdouble cellCapacityMah}},
  .cell_nominal_volts       = {{cdouble cellNominalVolts}},
  .cell_max_continuous_amps = {{cdouble cellMaxContinuousAmps}},
  .wire_gauge_awg           = {{wireGaugeAwg}},
  .wire_length_mm           = {{cdouble wireLengthMm}},
  .brightness_cap           = {{cdouble brightnessCap}},
  .led_milliamps_per_color  = {{cdouble ledMilliampsPerColor}},
  .pixel_idle_milliamps     = {{cdouble pixelIdleMilliamps}},
};
{{/with}}

{{#with config.rig.speaker}}
static const hb_speaker_t hb_speaker = {
  .impedance_ohms       = {{cdouble impedanceOhms}},
  .rated_power_watts    = {{cdouble ratedPowerWatts}},
  .amplifier_efficiency = {{cdouble amplifierEfficiency}},
};
{{/with}}

/* Every table has one zeroed entry past the end, so even an empty table is valid C. */
static const hb_channel_t hb_channels[HB_CHANNEL_COUNT + 1] = {
{{#each config.rig.channels}}
  [{{@index}}] = { .id = {{cstr id}}, .name = {{cstr name}}, .role = HB_ROLE_{{su role}}, .pixels = {{pixels}}, .parallel_strips = {{parallelStrips}}, .pin = {{pin}}, .color_order = HB_ORDER_{{colorOrder}} },
{{/each}}
};

static const hb_button_t hb_buttons[HB_BUTTON_COUNT + 1] = {
{{#each config.rig.buttons}}
  [{{@index}}] = { .id = {{cstr id}}, .name = {{cstr name}}, .kind = HB_BUTTON_{{upper kind}}, .pin = {{pin}} },
{{else}}
  { 0 },
{{/each}}
};

static const hb_font_t hb_fonts[HB_FONT_COUNT + 1] = {
{{#each config.fonts}}
  [{{@index}}] = { .id = {{cstr id}}, .name = {{cstr name}}, .folder = {{cstr folder}}, .status = HB_FONT_{{upper status}}{{#if (count cues)}}, .cues = { {{#each cues}}HB_CUE_{{upper this}}{{#unless @last}}, {{/unless}}{{/each}} }{{/if}}, .cue_count = {{count cues}} },
{{else}}
  { 0 },
{{/each}}
};

static const hb_preset_t hb_presets[HB_PRESET_COUNT + 1] = {
{{set "look" 0~}}
{{#each config.presets}}
  [{{@index}}] = { .id = {{cstr id}}, .name = {{cstr name}}, .font_id = {{cstr fontId}}, .font = {{indexof @root.config.fonts "id" fontId}}, .first_look = {{get "look"}}, .look_count = {{count looks}} },{{add "look" (count looks)}}
{{else}}
  { 0 },
{{/each}}
};

static const hb_look_t hb_looks[HB_LOOK_COUNT + 1] = {
{{set "look" 0}}{{set "layer" 0~}}
{{#each config.presets}}
{{#each looks}}
  [{{get "look"}}] = { .preset = {{@../index}}, .channel_id = {{cstr @key}}, .channel = {{indexof @root.config.rig.channels "id" @key}}, .first_layer = {{get "layer"}}, .layer_count = {{count layers}} },{{add "look" 1}}{{add "layer" (count layers)}}
{{/each}}
{{/each}}
{{#if (iszero "look")}}
  { 0 },
{{/if}}
};

static const hb_layer_t hb_layers[HB_LAYER_COUNT + 1] = {
{{set "look" 0}}{{set "layer" 0}}{{set "stop" 0~}}
{{#each config.presets}}
{{#each looks}}
{{#each layers}}
${HBS_LAYER}{{/each}}
{{add "look" 1~}}
{{/each}}
{{/each}}
{{#if (iszero "layer")}}
  { 0 },
{{/if}}
};

static const hb_stop_t hb_stops[HB_STOP_COUNT + 1] = {
{{set "layer" 0}}{{set "stop" 0~}}
{{#each config.presets}}
{{#each looks}}
{{#each layers}}
{{#if (eq kind "gradient")}}
{{#each stops}}
  [{{get "stop"}}] = { .layer = {{get "layer"}}, .at = {{cdouble at}}, .color = {{hex color}} },{{add "stop" 1}}
{{/each}}
{{else if (eq kind "drift")}}
{{#each colors}}
  [{{get "stop"}}] = { .layer = {{get "layer"}}, .color = {{hex this}} },{{add "stop" 1}}
{{/each}}
{{/if}}
{{add "layer" 1~}}
{{/each}}
{{/each}}
{{/each}}
{{#if (iszero "stop")}}
  { 0 },
{{/if}}
};

static const hb_control_t hb_controls[HB_CONTROL_COUNT + 1] = {
{{#each config.controls}}
  [{{@index}}] = { .event = HB_EVENT_{{su event}}, .input = HB_INPUT_{{upper trigger.input}}{{#if (eq trigger.input "button")}}, .button_id = {{cstr trigger.buttonId}}, .button = {{indexof @root.config.rig.buttons "id" trigger.buttonId}}, .gesture = HB_GESTURE_{{su trigger.gesture}}{{else}}, .motion = HB_MOTION_{{upper trigger.motion}}{{/if}}, .state = HB_STATE_{{upper trigger.state}} },
{{else}}
  { 0 },
{{/each}}
};

{{{accessors}}}`;

function handlebarsRenderer(): (config: Config, meta: RenderMeta) => string {
  const hb = Handlebars.create();
  const helpers: Record<string, (...args: never[]) => unknown> = {
    cstr: (s: string) => toCString(s),
    ccomment: (s: string) => toCComment(s),
    cdouble: (n: number) => toCDouble(n),
    hex: (c: string) => hex(c),
    su: (s: string) => su(s),
    upper: (s: string) => s.toUpperCase(),
    pad: (s: string, n: number) => s.padEnd(n),
    count: (x: unknown) => count(x),
    eq: (a: unknown, b: unknown) => a === b,
    isset: (x: unknown) => x !== undefined && x !== null,
    join: (l: unknown[], sep: string) => l.join(sep),
    indexof: (l: Record<string, unknown>[], k: string, v: unknown) => indexOf(l, k, v),
    cident: (s: string, scope: string) => cident(s, scope),
    set: (k: string, v: number) => (counters.set(k, v), ""),
    add: (k: string, v: number) => (counters.set(k, (counters.get(k) ?? 0) + v), ""),
    get: (k: string) => counters.get(k) ?? 0,
    iszero: (k: string) => (counters.get(k) ?? 0) === 0,
  };
  for (const [name, fn] of Object.entries(helpers)) hb.registerHelper(name, fn as Handlebars.HelperDelegate);
  const tpl = hb.compile(HBS, { noEscape: true, strict: false });
  return (config, meta) => {
    reset();
    return tpl({ config, meta, types: TYPES, accessors: "/* Accessors:" + ACCESSORS });
  };
}

// ---------------------------------------------------------------- liquidjs

const LIQ_LAYER =
  "  [{{ layer }}] = { .look = {{ look }}, .kind = HB_LAYER_{{ l.kind | upcase }}, .enabled = {{ l.enabled }}, .opacity = {{ l.opacity | cdouble }}, .blend = HB_BLEND_{{ l.blend | su }}, .when = HB_WHEN_{{ l.when | su }}" +
  "{% if l.range %}, .has_range = true, .range_start = {{ l.range.start }}, .range_end = {{ l.range.end }}{% endif %}" +
  '{% if l.kind == "fill" %}, .color = {{ l.color | hex }}' +
  '{% elsif l.kind == "gradient" %}, .first_stop = {{ stop }}, .stop_count = {{ l.stops.size }}{% assign stop = stop | plus: l.stops.size %}' +
  '{% elsif l.kind == "drift" %}, .first_stop = {{ stop }}, .stop_count = {{ l.colors.size }}, .band_pixels = {{ l.bandPixels }}, .speed_pixels_per_second = {{ l.speedPixelsPerSecond | cdouble }}, .direction = HB_DIRECTION_{{ l.direction | su }}{% assign stop = stop | plus: l.colors.size %}' +
  '{% elsif l.kind == "breathe" %}, .color = {{ l.color | hex }}, .period_ms = {{ l.periodMs | cdouble }}, .floor = {{ l.floor | cdouble }}, .ceiling = {{ l.ceiling | cdouble }}' +
  '{% elsif l.kind == "shimmer" %}, .color = {{ l.color | hex }}, .amount = {{ l.amount | cdouble }}, .rate_hz = {{ l.rateHz | cdouble }}' +
  '{% elsif l.kind == "spark" %}, .event = HB_EVENT_{{ l.event | upcase }}, .color = {{ l.color | hex }}, .position = {{ l.position | cdouble }}, .width_pixels = {{ l.widthPixels }}, .decay_ms = {{ l.decayMs | cdouble }}' +
  '{% elsif l.kind == "hold" %}, .event = HB_EVENT_{{ l.event | upcase }}, .color = {{ l.color | hex }}, .position = {{ l.position | cdouble }}, .width_pixels = {{ l.widthPixels }}, .flicker = {{ l.flicker | cdouble }}' +
  '{% elsif l.kind == "wipe" %}, .event = HB_EVENT_{{ l.event | upcase }}, .duration_ms = {{ l.durationMs | cdouble }}, .easing = HB_EASING_{{ l.easing | su }}' +
  '{% elsif l.kind == "mirror" %}, .channel_id = {{ l.channelId | cstr }}, .fit = HB_FIT_{{ l.fit | upcase }}{% endif %} },{% assign layer = layer | plus: 1 %}';

const LIQUID = `/*
 * Hiltbench configuration header
 * build:    {{ meta.buildName | ccomment }}
{%- if meta.clientName %}
 * client:   {{ meta.clientName | ccomment }}
{%- endif %}
 * saved:    {{ meta.savedAt | ccomment }}
{%- if meta.revision != nil %}
 * revision: {{ meta.revision }}
{%- endif %}
 * template: {{ meta.templateName | ccomment }} v{{ meta.templateVersion }}
 *
 * Generated from the build's config. Edit it in Hiltbench, or edit this file and read it
 * back in: every table entry is one line of designated initializers.
 */
#ifndef HB_CONFIG_H
#define HB_CONFIG_H

#include <stdbool.h>
#include <stdint.h>

#define HB_FORMAT {{ config.format | cstr }}
{%- assign looks = 0 %}{% assign layers = 0 %}{% assign stops = 0 %}{% for p in config.presets %}{% for e in p.looks %}{% assign looks = looks | plus: 1 %}{% assign layers = layers | plus: e[1].layers.size %}{% for l in e[1].layers %}{% if l.kind == "gradient" %}{% assign stops = stops | plus: l.stops.size %}{% elsif l.kind == "drift" %}{% assign stops = stops | plus: l.colors.size %}{% endif %}{% endfor %}{% endfor %}{% endfor %}

#define HB_CHANNEL_COUNT  {{ config.rig.channels.size }}
#define HB_BUTTON_COUNT   {{ config.rig.buttons.size }}
#define HB_FONT_COUNT     {{ config.fonts.size }}
#define HB_PRESET_COUNT   {{ config.presets.size }}
#define HB_LOOK_COUNT     {{ looks }}
#define HB_LAYER_COUNT    {{ layers }}
#define HB_STOP_COUNT     {{ stops }}
#define HB_CONTROL_COUNT  {{ config.controls.size }}
{% for ch in config.rig.channels %}
#define HB_CH_{{ ch.id | cident: "channel" | upcase | pad: 18 }} {{ forloop.index0 }}
{%- endfor %}
{%- for b in config.rig.buttons %}
#define HB_BTN_{{ b.id | cident: "button" | upcase | pad: 17 }} {{ forloop.index0 }}
{%- endfor %}
{%- for p in config.presets %}
#define HB_PRESET_{{ p.id | cident: "preset" | upcase | pad: 14 }} {{ forloop.index0 }}
{%- endfor %}

{{ types }}static const hb_board_t hb_board = {
  .profile = {{ config.rig.board.profile | cstr }},
  .data_pins = { {{ config.rig.board.dataPins | join: ", " }} }, .data_pin_count = {{ config.rig.board.dataPins.size }},
{%- if config.rig.board.inputPins.size > 0 %}
  .input_pins = { {{ config.rig.board.inputPins | join: ", " }} }, .input_pin_count = {{ config.rig.board.inputPins.size }},
{%- endif %}
  .max_pixels_per_pin = {{ config.rig.board.maxPixelsPerPin }},
  .idle_milliamps = {{ config.rig.board.idleMilliamps | cdouble }},
};
{% assign power = config.rig.power %}
static const hb_power_t hb_power = {
  .cell_capacity_mah        = {{ power.cellCapacityMah | cdouble }},
  .cell_nominal_volts       = {{ power.cellNominalVolts | cdouble }},
  .cell_max_continuous_amps = {{ power.cellMaxContinuousAmps | cdouble }},
  .wire_gauge_awg           = {{ power.wireGaugeAwg }},
  .wire_length_mm           = {{ power.wireLengthMm | cdouble }},
  .brightness_cap           = {{ power.brightnessCap | cdouble }},
  .led_milliamps_per_color  = {{ power.ledMilliampsPerColor | cdouble }},
  .pixel_idle_milliamps     = {{ power.pixelIdleMilliamps | cdouble }},
};
{% assign speaker = config.rig.speaker %}
static const hb_speaker_t hb_speaker = {
  .impedance_ohms       = {{ speaker.impedanceOhms | cdouble }},
  .rated_power_watts    = {{ speaker.ratedPowerWatts | cdouble }},
  .amplifier_efficiency = {{ speaker.amplifierEfficiency | cdouble }},
};

/* Every table has one zeroed entry past the end, so even an empty table is valid C. */
static const hb_channel_t hb_channels[HB_CHANNEL_COUNT + 1] = {
{%- for ch in config.rig.channels %}
  [{{ forloop.index0 }}] = { .id = {{ ch.id | cstr }}, .name = {{ ch.name | cstr }}, .role = HB_ROLE_{{ ch.role | su }}, .pixels = {{ ch.pixels }}, .parallel_strips = {{ ch.parallelStrips }}, .pin = {{ ch.pin }}, .color_order = HB_ORDER_{{ ch.colorOrder }} },
{%- endfor %}
};

static const hb_button_t hb_buttons[HB_BUTTON_COUNT + 1] = {
{%- for b in config.rig.buttons %}
  [{{ forloop.index0 }}] = { .id = {{ b.id | cstr }}, .name = {{ b.name | cstr }}, .kind = HB_BUTTON_{{ b.kind | upcase }}, .pin = {{ b.pin }} },
{%- else %}
  { 0 },
{%- endfor %}
};

static const hb_font_t hb_fonts[HB_FONT_COUNT + 1] = {
{%- for f in config.fonts %}
  [{{ forloop.index0 }}] = { .id = {{ f.id | cstr }}, .name = {{ f.name | cstr }}, .folder = {{ f.folder | cstr }}, .status = HB_FONT_{{ f.status | upcase }}{% if f.cues.size > 0 %}, .cues = { {% for c in f.cues %}HB_CUE_{{ c | upcase }}{% unless forloop.last %}, {% endunless %}{% endfor %} }{% endif %}, .cue_count = {{ f.cues.size }} },
{%- else %}
  { 0 },
{%- endfor %}
};

static const hb_preset_t hb_presets[HB_PRESET_COUNT + 1] = {
{%- assign look = 0 %}
{%- for p in config.presets %}{% assign n = p.looks | count %}
  [{{ forloop.index0 }}] = { .id = {{ p.id | cstr }}, .name = {{ p.name | cstr }}, .font_id = {{ p.fontId | cstr }}, .font = {{ config.fonts | indexof: "id", p.fontId }}, .first_look = {{ look }}, .look_count = {{ n }} },{% assign look = look | plus: n %}
{%- else %}
  { 0 },
{%- endfor %}
};

static const hb_look_t hb_looks[HB_LOOK_COUNT + 1] = {
{%- assign look = 0 %}{% assign layer = 0 %}
{%- for p in config.presets %}{% assign pi = forloop.index0 %}{% for e in p.looks %}
  [{{ look }}] = { .preset = {{ pi }}, .channel_id = {{ e[0] | cstr }}, .channel = {{ config.rig.channels | indexof: "id", e[0] }}, .first_layer = {{ layer }}, .layer_count = {{ e[1].layers.size }} },{% assign look = look | plus: 1 %}{% assign layer = layer | plus: e[1].layers.size %}
{%- endfor %}{% endfor %}
{%- if look == 0 %}
  { 0 },
{%- endif %}
};

static const hb_layer_t hb_layers[HB_LAYER_COUNT + 1] = {
{%- assign look = 0 %}{% assign layer = 0 %}{% assign stop = 0 %}
{%- for p in config.presets %}{% for e in p.looks %}{% for l in e[1].layers %}
${LIQ_LAYER}
{%- endfor %}{% assign look = look | plus: 1 %}{% endfor %}{% endfor %}
{%- if layer == 0 %}
  { 0 },
{%- endif %}
};

static const hb_stop_t hb_stops[HB_STOP_COUNT + 1] = {
{%- assign layer = 0 %}{% assign stop = 0 %}
{%- for p in config.presets %}{% for e in p.looks %}{% for l in e[1].layers %}{% if l.kind == "gradient" %}{% for s in l.stops %}
  [{{ stop }}] = { .layer = {{ layer }}, .at = {{ s.at | cdouble }}, .color = {{ s.color | hex }} },{% assign stop = stop | plus: 1 %}
{%- endfor %}{% elsif l.kind == "drift" %}{% for c in l.colors %}
  [{{ stop }}] = { .layer = {{ layer }}, .color = {{ c | hex }} },{% assign stop = stop | plus: 1 %}
{%- endfor %}{% endif %}{% assign layer = layer | plus: 1 %}{% endfor %}{% endfor %}{% endfor %}
{%- if stop == 0 %}
  { 0 },
{%- endif %}
};

static const hb_control_t hb_controls[HB_CONTROL_COUNT + 1] = {
{%- for k in config.controls %}{% assign t = k.trigger %}
  [{{ forloop.index0 }}] = { .event = HB_EVENT_{{ k.event | su }}, .input = HB_INPUT_{{ t.input | upcase }}{% if t.input == "button" %}, .button_id = {{ t.buttonId | cstr }}, .button = {{ config.rig.buttons | indexof: "id", t.buttonId }}, .gesture = HB_GESTURE_{{ t.gesture | su }}{% else %}, .motion = HB_MOTION_{{ t.motion | upcase }}{% endif %}, .state = HB_STATE_{{ t.state | upcase }} },
{%- else %}
  { 0 },
{%- endfor %}
};

{{ accessors }}`;

function liquidRenderer(): (config: Config, meta: RenderMeta) => string {
  const engine = new Liquid({ strictFilters: true, greedy: true });
  engine.registerFilter("cstr", (s: string) => toCString(s));
  engine.registerFilter("ccomment", (s: string) => toCComment(s));
  engine.registerFilter("cdouble", (n: number) => toCDouble(n));
  engine.registerFilter("hex", (c: string) => hex(c));
  engine.registerFilter("su", (s: string) => su(s));
  engine.registerFilter("pad", (s: string, n: number) => s.padEnd(n));
  engine.registerFilter("count", (x: unknown) => count(x));
  engine.registerFilter("indexof", (l: Record<string, unknown>[], k: string, v: unknown) => indexOf(l, k, v));
  engine.registerFilter("cident", (s: string, scope: string) => cident(s, scope));
  const tpl = engine.parse(LIQUID);
  return (config, meta) => {
    reset();
    return engine.renderSync(tpl, { config, meta, types: TYPES, accessors: "/* Accessors:" + ACCESSORS }) as string;
  };
}

// ---------------------------------------------------------------- timing

function time(fn: () => void, minMs: number): number {
  // From a collected heap, then a warm-up long enough for V8 to grow the young generation back
  // to what this function's allocation rate wants (a collection shrinks it).
  collect();
  for (let w = performance.now(), i = 0; i < 20 || performance.now() - w < 100; i++) fn();
  let n = 0;
  const start = performance.now();
  let now = start;
  while (now - start < minMs) {
    for (let i = 0; i < 10; i++) fn();
    n += 10;
    now = performance.now();
  }
  return ((now - start) / n) * 1000;
}

const fmt = (us: number) => (us >= 1000 ? `${(us / 1000).toFixed(2)} ms` : `${us.toFixed(1)} µs`);

let edit = 0;
let sink = 0;
const liquidEngine = new Liquid({ strictFilters: false, greedy: true });

export async function run(): Promise<void> {
  const source = readFileSync(fileURLToPath(new URL("../../templates/generic-header.hbt", import.meta.url)), "utf8");
  const config = demoConfig();
  const compiled = compileTemplate(source);
  if (!compiled.ok) throw new Error(`generic-header does not compile: ${compiled.errors[0].message}`);
  const ours = () => {
    const r = renderTemplate(compiled.template, config, META);
    if (!r.ok) throw new Error(r.errors[0].message);
    return r.output;
  };
  const hbs = handlebarsRenderer();
  const liquid = liquidRenderer();
  const reference = ours();
  for (const [name, out] of [
    ["hand-written JS", handWritten(config, META, { types: TYPES, accessors: ACCESSORS })],
    ["Handlebars", hbs(config, META)],
    ["liquidjs", liquid(config, META)],
  ] as const) {
    if (out !== reference) {
      const at = [...out].findIndex((ch, i) => ch !== reference[i]);
      throw new Error(`${name} output differs from generic-header at offset ${at}: ${JSON.stringify(out.slice(at - 40, at + 40))} vs ${JSON.stringify(reference.slice(at - 40, at + 40))}`);
    }
  }
  console.log(`generic-header, demo config: ${reference.length} bytes, identical output from all four renderers`);
  // Interleaved rounds, best of each: other work on the machine hits all renderers alike.
  const fns: Record<string, () => void> = {
    ours,
    hbs: () => hbs(config, META),
    js: () => handWritten(config, META, { types: TYPES, accessors: ACCESSORS }),
    liquid: () => liquid(config, META),
    // The editor's path: a source never seen before (one edit), with no caches at all.
    edited: () => compileTemplate(`${source}@# ${edit++} #@`, { cache: false }),
    // References for compiling: Handlebars turning the equivalent template into its JavaScript
    // source (parse and code generation; running that source would need eval), liquidjs parsing
    // its equivalent, and the floor for any lexer: reading every character of the source once.
    hbsCompile: () => Handlebars.precompile(HBS, { noEscape: true, strict: false }),
    liquidParse: () => liquidEngine.parse(LIQUID),
    floor: () => {
      const s = `${source}@# ${edit++} #@`;
      let h = 0;
      for (let i = 0; i < s.length; i++) h = (h + s.charCodeAt(i)) | 0;
      sink ^= h;
    },
  };
  // Compiles that the caches keep run after everything else, in rounds of their own: what they
  // keep survives into V8's old generation, and V8 then allocates the compiler's objects there
  // from the start (pretenuring), which slowed the editor-path compile measured after them 4×.
  const cachedFns: Record<string, () => void> = {
    cold: () => {
      templateCache.clear();
      compileTemplate(source);
    },
    // A resolver makes compile skip its own cache, leaving only the parse cached.
    check: () => compileTemplate(source, { partials: () => undefined }),
    warm: () => compileTemplate(source),
  };
  const best: Record<string, number> = {};
  for (const group of [fns, cachedFns])
    for (let round = 0; round < 5; round++) {
      for (const [name, fn] of Object.entries(group)) best[name] = Math.min(best[name] ?? Infinity, time(fn, name === "liquid" ? 300 : 150));
    }
  const { ours: tOurs, hbs: tHbs, js: tJs, liquid: tLiquid, cold: tCompile, check: tCheck, warm: tWarm } = best;
  console.log(`render  ours ${fmt(tOurs)} | Handlebars ${fmt(tHbs)} | hand-written JS ${fmt(tJs)} | liquidjs ${fmt(tLiquid)}`);
  console.log(`ratio   Handlebars / ours = ${(tHbs / tOurs).toFixed(2)}× (target ≥ 1.5×)`);
  console.log(`ratio   ours / hand-written JS = ${(tOurs / tJs).toFixed(2)}× (stretch ≤ 2×)`);
  console.log(`ratio   liquidjs / ours = ${(tLiquid / tOurs).toFixed(1)}×`);
  const { edited: tEdited, hbsCompile: tHbsCompile, liquidParse: tLiquidParse, floor: tFloor } = best;
  // The issue set its targets on a machine where the hand-written renderer took about 41 µs; the
  // same target on this machine scales with the hand-written renderer measured in this run.
  const scaled = (100 * tJs) / 41;
  console.log(
    `compile generic-header (${source.length} chars): ${fmt(tEdited)} after an edit (editor path, no caches: tokenize, parse, check, closures), ${fmt(tCompile)} cold, ${fmt(tCheck)} with the parse cached, ${fmt(tWarm)} for a version already compiled`,
  );
  console.log(`ratio   Handlebars precompile / ours = ${(tHbsCompile / tEdited).toFixed(1)}× (${fmt(tHbsCompile)}); liquidjs parse / ours = ${(tLiquidParse / tEdited).toFixed(1)}× (${fmt(tLiquidParse)})`);
  console.log(`ratio   ours / one read of every character = ${(tEdited / tFloor).toFixed(1)}× (${fmt(tFloor)})`);
  console.log(
    `target  compile < 100 µs where hand-written JS renders in 41 µs: ${fmt(scaled)} on this machine (hand-written ${fmt(tJs)} here); ours ${fmt(tEdited)} = ${(tEdited / scaled).toFixed(2)}× of it${tEdited <= 100 ? "; under 100 µs outright" : ""}`,
  );
  if (sink === 0.5) console.log(sink);
}

if (import.meta.url === `file://${process.argv[1]}`) await run();
