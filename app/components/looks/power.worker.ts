// Works out the power panel's figures off the main thread, so the live preview keeps its frame
// rate while a heavy look's current is rendered. One message in (config, preset), one out.
import type { Config } from "~/lib/config/schema";
import { presetPowerFigures, type PresetPowerFigures } from "~/lib/power/figures";

export type PowerRequest = { id: number; config: Config; presetId: string };
export type PowerReply = { id: number; figures: PresetPowerFigures } | { id: number; error: string };

self.onmessage = (e: MessageEvent<PowerRequest>) => {
  const { id, config, presetId } = e.data;
  try {
    const reply: PowerReply = { id, figures: presetPowerFigures(config, presetId) };
    self.postMessage(reply);
  } catch (err) {
    self.postMessage({ id, error: err instanceof Error ? err.message : String(err) } satisfies PowerReply);
  }
};
