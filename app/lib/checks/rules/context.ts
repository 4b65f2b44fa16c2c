// What every semantic rule needs, indexed once: the parsed config, lookups by id, the power
// estimate and the sink the rules write to. Rules run after the schema has accepted the input.
import type { PowerSummary } from "../../power/estimate";
import { DiagnosticSink, keySegment } from "../diagnostics";
import type { Button, Channel, Config, Font, Layer } from "../../config/schema";

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

/** Where a layer sits; its path is only spelled out when a rule reports something. */
export type LayerAt = { presetIndex: number; channelId: string; layerIndex: number };
export type LayerCheck = (ctx: RuleContext, layer: Layer, at: LayerAt, channel: Channel) => void;

export function pathOf(at: LayerAt, field?: string): string {
  const base = layerPath(at.presetIndex, at.channelId, at.layerIndex);
  return field ? `${base}.${field}` : base;
}

/** One walk over every layer of every look whose key names a channel, running all checks. */
export function walkLayers(ctx: RuleContext, checks: readonly LayerCheck[]): void {
  const presets = ctx.config.presets;
  for (let pi = 0; pi < presets.length; pi++) {
    const looks = presets[pi].looks;
    for (const channelId in looks) {
      const channel = ctx.channels.get(channelId);
      if (!channel) continue;
      const layers = looks[channelId].layers;
      for (let li = 0; li < layers.length; li++) {
        const at = { presetIndex: pi, channelId, layerIndex: li };
        for (const check of checks) check(ctx, layers[li], at, channel);
      }
    }
  }
}

export function plural(n: number, word: string): string {
  return `${n} ${word}${n === 1 ? "" : "s"}`;
}
