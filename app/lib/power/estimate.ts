// Peak and typical current per preset, and the power figures a build sheet shows. The LED part
// comes from a pluggable per-channel source: today a conservative estimate from the looks'
// colours (bounds.ts); later the effect engine's rendered frames can be fed in instead.
import type { Channel, Config, Preset } from "../config/schema";
import { litMatters, lookBound, type Bound, type Mode } from "./bounds";
import {
  audioMilliamps,
  boardIdleMilliamps,
  energyWh,
  runtimeHours,
  suggestedBrightnessCap,
  typicalAudioMilliamps,
} from "./current";
import { wireDropVolts, wireHeatWatts } from "./wire";

/** LED current of one channel (all its parallel strips, brightness cap applied), in mA. */
export type ChannelDraw = { peakMa: number; meanMa: number };
export type ChannelDrawSource = (channel: Channel, preset: Preset, config: Config) => ChannelDraw;

export type PresetPower = {
  presetId: string;
  peakAmps: number;
  typicalAmps: number;
  runtimeHours: number;
  channels: { channelId: string; peakMa: number; meanMa: number }[];
};

export type PowerSummary = {
  presets: PresetPower[];
  overall: {
    /** The worst preset's peak. */
    peakAmps: number;
    worstPresetId: string | null;
    /** Round-trip drop in the cell leads at that peak. */
    wireDropVolts: number;
    wireHeatWatts: number;
    /** Highest cap that keeps every preset's peak under 80 % of the cell's rating. */
    suggestedBrightnessCap: number;
    energyWh: number;
    cellMaxContinuousAmps: number;
  };
};

/**
 * Same sum as frameCurrentMilliamps, taken over runs instead of pixels so the estimate does not
 * build a frame for every channel of every preset (bytes would round; the bound does not).
 */
function boundCurrentMilliamps(bound: Bound, channel: Channel, power: Config["rig"]["power"]): number {
  const { starts, rgb } = bound;
  let sum = 0;
  for (let j = 0; j < starts.length - 1; j++) sum += (starts[j + 1] - starts[j]) * (rgb[j * 3] + rgb[j * 3 + 1] + rgb[j * 3 + 2]);
  const perStrip = sum * power.brightnessCap * power.ledMilliampsPerColor + channel.pixels * power.pixelIdleMilliamps;
  return perStrip * channel.parallelStrips;
}

/** The default source: bounds of every look in a preset, resolved through mirrors. */
export function estimatedDrawSource(): ChannelDrawSource {
  // Bounds of the preset being estimated, by channel id: slots peak-lit, peak-unlit, typical.
  // null marks a bound being computed, i.e. a mirror cycle (the validator reports those).
  let current: Preset | null = null;
  let cache = new Map<string, (Bound | null | undefined)[]>();
  let byId = new Map<string, Channel>();
  let indexed: Config | null = null;
  const boundOf = (config: Config, preset: Preset, channelId: string, mode: Mode, lit: boolean): Bound | null => {
    if (config !== indexed) {
      indexed = config;
      // First channel per id, as the validator indexes them (duplicates are reported there).
      byId = new Map();
      for (const c of config.rig.channels) if (!byId.has(c.id)) byId.set(c.id, c);
    }
    if (preset !== current) {
      current = preset;
      cache = new Map();
    }
    const channel = byId.get(channelId);
    if (!channel) return null;
    const look = preset.looks[channelId];
    // Looks without lit/unlit layers are the same either way: share the lit bound.
    if (!lit && !litMatters(look)) lit = true;
    let slots = cache.get(channelId);
    if (!slots) cache.set(channelId, (slots = [undefined, undefined, undefined, undefined]));
    const slot = (mode === "peak" ? 0 : 2) + (lit ? 0 : 1);
    const hit = slots[slot];
    if (hit === null) return { starts: [0, channel.pixels], rgb: [1, 1, 1] };
    if (hit) return hit;
    slots[slot] = null;
    const b = lookBound(look, channel.pixels, mode, lit, (id) => boundOf(config, preset, id, mode, lit));
    slots[slot] = b;
    return b;
  };
  return (channel, preset, config) => {
    const { power } = config.rig;
    const lit = boundCurrentMilliamps(boundOf(config, preset, channel.id, "peak", true)!, channel, power);
    const unlit = boundCurrentMilliamps(boundOf(config, preset, channel.id, "peak", false)!, channel, power);
    const mean = boundCurrentMilliamps(boundOf(config, preset, channel.id, "typical", true)!, channel, power);
    return { peakMa: Math.max(lit, unlit), meanMa: mean };
  };
}

export function presetPower(config: Config, preset: Preset, source: ChannelDrawSource = estimatedDrawSource()): PresetPower {
  const { board, power } = config.rig;
  const fixedPeak = boardIdleMilliamps(board) + audioMilliamps(config.rig.speaker, power);
  const fixedTypical = boardIdleMilliamps(board) + typicalAudioMilliamps(config.rig.speaker, power);
  const channels = config.rig.channels.map((c) => ({ channelId: c.id, ...source(c, preset, config) }));
  const ledPeak = channels.reduce((s, c) => s + c.peakMa, 0);
  const ledMean = channels.reduce((s, c) => s + c.meanMa, 0);
  const typicalMa = ledMean + fixedTypical;
  return {
    presetId: preset.id,
    peakAmps: (ledPeak + fixedPeak) / 1000,
    typicalAmps: typicalMa / 1000,
    runtimeHours: runtimeHours(power.cellCapacityMah, typicalMa),
    channels,
  };
}

/** Pixels' own idle current: drawn whatever the cap, so it sits with the fixed loads. */
function pixelIdleMilliamps(config: Config): number {
  const p = config.rig.power.pixelIdleMilliamps;
  return config.rig.channels.reduce((s, c) => s + c.pixels * c.parallelStrips * p, 0);
}

export function powerSummary(config: Config, source: ChannelDrawSource = estimatedDrawSource()): PowerSummary {
  const { power, board, speaker } = config.rig;
  const presets = config.presets.map((p) => presetPower(config, p, source));
  let worst: PresetPower | null = null;
  for (const p of presets) if (!worst || p.peakAmps > worst.peakAmps) worst = p;
  const peakAmps = worst ? worst.peakAmps : (boardIdleMilliamps(board) + audioMilliamps(speaker, power) + pixelIdleMilliamps(config)) / 1000;
  const oneWayMetres = power.wireLengthMm / 1000;
  return {
    presets,
    overall: {
      peakAmps,
      worstPresetId: worst ? worst.presetId : null,
      wireDropVolts: wireDropVolts(power.wireGaugeAwg, oneWayMetres, peakAmps),
      wireHeatWatts: wireHeatWatts(power.wireGaugeAwg, oneWayMetres, peakAmps),
      suggestedBrightnessCap: capSuggestion(config, worst, source),
      energyWh: energyWh(power.cellCapacityMah, power.cellNominalVolts),
      cellMaxContinuousAmps: power.cellMaxContinuousAmps,
    },
  };
}

function capSuggestion(config: Config, worst: PresetPower | null, source: ChannelDrawSource): number {
  const { power, board, speaker } = config.rig;
  const idle = pixelIdleMilliamps(config);
  const fixed = boardIdleMilliamps(board) + audioMilliamps(speaker, power) + idle;
  if (!worst) return suggestedBrightnessCap(0, fixed, power.cellMaxContinuousAmps);
  let colourAtFull: number;
  if (power.brightnessCap > 0) {
    const ledPeak = worst.channels.reduce((s, c) => s + c.peakMa, 0);
    colourAtFull = Math.max(0, ledPeak - idle) / power.brightnessCap;
  } else {
    // A zero cap hides how bright the looks are; measure them again at full brightness.
    const full: Config = { ...config, rig: { ...config.rig, power: { ...power, brightnessCap: 1 } } };
    const preset = config.presets.find((p) => p.id === worst.presetId)!;
    colourAtFull = full.rig.channels.reduce((s, c) => s + source(c, preset, full).peakMa, 0) - idle;
  }
  return suggestedBrightnessCap(colourAtFull, fixed, power.cellMaxContinuousAmps);
}
