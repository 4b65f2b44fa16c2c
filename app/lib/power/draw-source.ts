// The power summary's per-channel LED figures from frames the engine renders over the
// demonstration sequence, instead of the colour bound. Slower than the bound (every frame of
// every channel of every preset), so the validator uses it only when asked (power: "engine").
import type { ChannelDrawSource } from "~/lib/power/estimate";
import { channelDrawFromFrames } from "./sequence";

/** Frames at `stepMs` apart (the sequence's own 60 fps by default). */
export function engineDrawSource(stepMs = 1000 / 60): ChannelDrawSource {
  return (channel, preset, config) => channelDrawFromFrames(config, preset.id, channel, stepMs);
}
