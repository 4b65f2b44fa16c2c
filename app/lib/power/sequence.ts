// Current drawn over the demonstration sequence, from frames the engine actually renders rather
// than from a bound: what the validator's power rules and the look editor's power panel plot.
import type { Channel, Config } from "~/lib/config/schema";
import { audioMilliamps, boardIdleMilliamps, frameCurrentMilliamps, typicalAudioMilliamps } from "~/lib/power/current";
import { createRenderer, renderContextFor } from "../effects/engine";
import { bladeStateAt, DEMO_SEQUENCE, DEMO_SEQUENCE_MS, heldSince, latestEventAt, SEQUENCE_SEED, type BladeState, type Timeline } from "../effects/timeline";

/**
 * Assumption, not a measurement: an ignition, clash, blast or retraction sound plays near the
 * speaker's rating for about this long; lockup and drag play near it for as long as they are held.
 */
export const EFFECT_SOUND_MS = 500;

const LOUD_MOMENTS = ["ignition", "retraction", "clash", "blast"] as const;

export interface SequenceCurrent {
  timesMs: number[];
  /** Cell current at each time: LEDs of every channel (all parallel strips), board idle and audio. */
  milliamps: number[];
  peakAmps: number;
  meanAmps: number;
}

/**
 * Audio share of the cell current at one instant: silent while unlit (after the retraction
 * sound), the speaker's rating during effect sounds, the typical hum share otherwise.
 */
export function audioAt(config: Config, timeline: Timeline, t: number, state: BladeState): number {
  const { speaker, power } = config.rig;
  const loud = audioMilliamps(speaker, power);
  for (const e of LOUD_MOMENTS) {
    const at = latestEventAt(timeline, e, t);
    if (t - at < EFFECT_SOUND_MS) return loud;
  }
  if (state.lit && (!Number.isNaN(heldSince(timeline, "lockup", t)) || !Number.isNaN(heldSince(timeline, "drag", t)))) return loud;
  return state.lit ? typicalAudioMilliamps(speaker, power) : 0;
}

/**
 * Steps through the demonstration sequence (t = 0, step, 2·step, … < its length) and sums the
 * current of every channel's real frame with the board and the speaker. A preset id that is not
 * in the config renders every channel black (idle currents only).
 */
export function sequenceCurrent(config: Config, presetId: string, stepMs = 1000 / 60, timeline: Timeline = DEMO_SEQUENCE, lengthMs = DEMO_SEQUENCE_MS): SequenceCurrent {
  const step = stepMs > 0 && Number.isFinite(stepMs) ? stepMs : 1000 / 60;
  const renderer = createRenderer(renderContextFor(config, presetId));
  const { channels, power, board } = config.rig;
  const state: BladeState = { lit: false, sinceMs: NaN };
  const timesMs: number[] = [];
  const milliamps: number[] = [];
  let peak = 0;
  let sum = 0;
  const frames = Math.ceil(lengthMs / step);
  for (let i = 0; i < frames; i++) {
    const t = i * step;
    let ma = boardIdleMilliamps(board) + audioAt(config, timeline, t, bladeStateAt(timeline, t, state));
    for (const c of channels) ma += frameCurrentMilliamps(renderer.render(c.id, t, timeline, SEQUENCE_SEED), c, power);
    timesMs.push(t);
    milliamps.push(ma);
    if (ma > peak) peak = ma;
    sum += ma;
  }
  return { timesMs, milliamps, peakAmps: peak / 1000, meanAmps: frames > 0 ? sum / frames / 1000 : 0 };
}

/**
 * LED current of one channel over the sequence (peak and mean, mA, cap applied): the shape of
 * power's ChannelDrawSource, so the power summary can use rendered frames instead of its bound.
 */
export function channelDrawFromFrames(config: Config, presetId: string, channel: Channel, stepMs = 1000 / 60): { peakMa: number; meanMa: number } {
  const renderer = createRenderer(renderContextFor(config, presetId));
  const frames = Math.ceil(DEMO_SEQUENCE_MS / stepMs);
  let peak = 0;
  let sum = 0;
  for (let i = 0; i < frames; i++) {
    const ma = frameCurrentMilliamps(renderer.render(channel.id, i * stepMs, DEMO_SEQUENCE, SEQUENCE_SEED), channel, config.rig.power);
    if (ma > peak) peak = ma;
    sum += ma;
  }
  return { peakMa: peak, meanMa: frames > 0 ? sum / frames : 0 };
}
