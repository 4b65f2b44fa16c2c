// Words for a frame: the live preview's text alternative and anything else that must say what a
// channel shows without showing it.
import { DECODE_BYTE, formatHex, srgbEncode } from "./color";

export interface FrameSummary {
  /** Pixels giving any light. */
  litPixels: number;
  pixels: number;
  /** Every pixel for short channels; base, middle, tip and the mean for long ones. */
  samples: { label: string; hex: string }[];
}

/** Channels up to this many pixels are listed pixel by pixel. */
export const LIST_EACH_UP_TO = 8;

export function summarizeFrame(frame: Uint8ClampedArray): FrameSummary {
  const pixels = Math.floor(frame.length / 3);
  let litPixels = 0;
  let r = 0, g = 0, b = 0;
  for (let i = 0; i < pixels; i++) {
    const o = i * 3;
    if (frame[o] + frame[o + 1] + frame[o + 2] > 0) litPixels++;
    r += DECODE_BYTE[frame[o]];
    g += DECODE_BYTE[frame[o + 1]];
    b += DECODE_BYTE[frame[o + 2]];
  }
  const at = (i: number) => formatHex(frame[i * 3], frame[i * 3 + 1], frame[i * 3 + 2]);
  const samples: FrameSummary["samples"] = [];
  if (pixels <= LIST_EACH_UP_TO) {
    for (let i = 0; i < pixels; i++) samples.push({ label: pixels === 1 ? "pixel" : `pixel ${i + 1}`, hex: at(i) });
  } else if (pixels > 0) {
    samples.push({ label: "base", hex: at(0) }, { label: "middle", hex: at(Math.floor(pixels / 2)) }, { label: "tip", hex: at(pixels - 1) });
    // The mean is of light, then encoded: the colour the whole strip gives through a diffuser.
    const enc = (l: number) => srgbEncode(l) * 255;
    samples.push({ label: "mean", hex: formatHex(enc(r / pixels), enc(g / pixels), enc(b / pixels)) });
  }
  return { litPixels, pixels, samples };
}
