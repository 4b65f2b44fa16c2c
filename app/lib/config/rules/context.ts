// What every semantic rule needs, indexed once: the parsed config, lookups by id, the power
// estimate and the sink the rules write to. Rules run after the schema has accepted the input.
import type { PowerSummary } from "../../power/estimate";
import { DiagnosticSink, keySegment } from "../diagnostics";
import type { Button, Channel, Config, Font, Layer } from "../schema";

export type RuleContext = {
  config: Config;
  sink: DiagnosticSink;
  /** First channel, button and font with each id (later duplicates are reported, not indexed). */
  channels: Map<string, Channel>;
  buttons: Map<string, Button>;
  fonts: Map<string, Font>;
  power: PowerSummary;
};

export function buildContext(config: Config, power: PowerSummary, sink = new DiagnosticSink()): RuleContext {
  const channels = new Map<string, Channel>();
  for (const c of config.rig.channels) if (!channels.has(c.id)) channels.set(c.id, c);
  const buttons = new Map<string, Button>();
  for (const b of config.rig.buttons) if (!buttons.has(b.id)) buttons.set(b.id, b);
  const fonts = new Map<string, Font>();
  for (const f of config.fonts) if (!fonts.has(f.id)) fonts.set(f.id, f);
  return { config, sink, channels, buttons, fonts, power };
}

export function lookPath(presetIndex: number, channelId: string): string {
  return `presets[${presetIndex}].looks${keySegment(channelId)}`;
}

export function layerPath(presetIndex: number, channelId: string, layerIndex: number): string {
  return `${lookPath(presetIndex, channelId)}.layers[${layerIndex}]`;
}

/** Calls `fn` for every layer of every look whose key names a channel of the rig. */
export function eachLayer(ctx: RuleContext, fn: (layer: Layer, path: string, channel: Channel, presetIndex: number) => void): void {
  ctx.config.presets.forEach((preset, pi) => {
    for (const [channelId, look] of Object.entries(preset.looks)) {
      const channel = ctx.channels.get(channelId);
      if (!channel) continue;
      look.layers.forEach((layer, li) => fn(layer, layerPath(pi, channelId, li), channel, pi));
    }
  });
}

export function plural(n: number, word: string): string {
  return `${n} ${word}${n === 1 ? "" : "s"}`;
}
