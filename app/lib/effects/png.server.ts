// PNG encoding of engine pictures. Server only: pngjs needs Node's zlib and Buffer, and the
// browser draws frames on a canvas instead.
import { PNG } from "pngjs";
import type { Config } from "~/lib/config/schema";
import { lookTimeImage, type RgbaImage } from "./image";

/** Encodes an RGBA image as a PNG file. A 0 × 0 image becomes a 1 × 1 transparent PNG (PNG has no empty image). */
export function encodePng(image: RgbaImage): Buffer {
  const empty = image.width === 0 || image.height === 0;
  const png = new PNG({ width: empty ? 1 : image.width, height: empty ? 1 : image.height, colorType: 6 });
  if (!empty) png.data = Buffer.from(image.rgba.buffer, image.rgba.byteOffset, image.rgba.byteLength);
  else png.data.fill(0);
  return PNG.sync.write(png, { colorType: 6 });
}

/** The time-by-pixel picture of a channel's look over the demonstration sequence, as a PNG file. */
export function lookTimePng(config: Config, presetId: string, channelId: string): Buffer {
  return encodePng(lookTimeImage(config, presetId, channelId));
}
