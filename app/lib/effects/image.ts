// The time-by-pixel picture of a look: the demonstration sequence laid out as one image, time
// running down one row per frame at 60 fps, pixels across from base (left) to tip (right). One
// glance shows the ignition edge, the clash flash, the lockup band and the retraction.
import type { Config } from "~/lib/config/schema";
import { createRenderer, renderContextFor } from "./engine";
import { DEMO_SEQUENCE, DEMO_SEQUENCE_FRAMES, SEQUENCE_SEED } from "./timeline";

export interface RgbaImage {
  width: number;
  height: number;
  /** Row-major RGBA, 4 bytes per pixel, fully opaque. */
  rgba: Uint8Array;
}

/** A channel that is not in the rig gives a 0 × 0 image. */
export function lookTimeImage(config: Config, presetId: string, channelId: string): RgbaImage {
  const channel = config.rig.channels.find((c) => c.id === channelId);
  if (channel === undefined) return { width: 0, height: 0, rgba: new Uint8Array(0) };
  const renderer = createRenderer(renderContextFor(config, presetId));
  const width = channel.pixels;
  const height = DEMO_SEQUENCE_FRAMES;
  const rgba = new Uint8Array(width * height * 4);
  for (let row = 0; row < height; row++) {
    const frame = renderer.render(channelId, (row * 1000) / 60, DEMO_SEQUENCE, SEQUENCE_SEED);
    for (let x = 0, o = row * width * 4; x < width; x++, o += 4) {
      rgba[o] = frame[x * 3];
      rgba[o + 1] = frame[x * 3 + 1];
      rgba[o + 2] = frame[x * 3 + 2];
      rgba[o + 3] = 255;
    }
  }
  return { width, height, rgba };
}
