import { PNG } from "pngjs";
import { describe, expect, it } from "vitest";
import { demoConfig } from "~/lib/config/demo";
import { lookTimeImage } from "./image";
import { encodePng, lookTimePng } from "./png.server";

describe("lookTimeImage", () => {
  const config = demoConfig();
  const img = lookTimeImage(config, "ashfall", "blade");
  const at = (row: number, x: number) => Array.from(img.rgba.slice((row * img.width + x) * 4, (row * img.width + x) * 4 + 4));

  it("has a column per pixel and a row per 60 fps frame of the demonstration sequence", () => {
    expect(img.width).toBe(132);
    expect(img.height).toBe(450);
    expect(img.rgba.length).toBe(132 * 450 * 4);
  });

  it("shows the ignition edge, the lit blade and the dark end", () => {
    // Row 0 is t = 0: the ignition wipe has not started to show; the tip is dark.
    expect(at(0, 131)).toEqual([0, 0, 0, 255]);
    // Row 6 (100 ms) is mid-wipe: base lit, tip still dark.
    expect(at(6, 0)[0]).toBeGreaterThan(0);
    expect(at(6, 131)[0]).toBe(0);
    // Row 60 (1 s): lit along the whole blade in the base colour's hue, red strongest.
    expect(at(60, 131)[0]).toBeGreaterThan(at(60, 131)[2]);
    // Last row (after the retraction wipe): dark.
    expect(at(449, 0)).toEqual([0, 0, 0, 255]);
  });

  it("gives nothing for an unknown channel", () => {
    expect(lookTimeImage(config, "ashfall", "nope")).toEqual({ width: 0, height: 0, rgba: new Uint8Array(0) });
  });
});

describe("encodePng", () => {
  it("round-trips through pngjs", () => {
    const img = lookTimeImage(demoConfig(), "glasswind", "chamber");
    const back = PNG.sync.read(encodePng(img));
    expect(back.width).toBe(7);
    expect(back.height).toBe(450);
    expect(Buffer.compare(back.data, Buffer.from(img.rgba))).toBe(0);
  });

  it("encodes a look's picture in one call", () => {
    const back = PNG.sync.read(lookTimePng(demoConfig(), "ashfall", "crystal"));
    expect([back.width, back.height]).toEqual([1, 450]);
  });

  it("writes an empty image as a valid 1 × 1 file", () => {
    const back = PNG.sync.read(encodePng({ width: 0, height: 0, rgba: new Uint8Array(0) }));
    expect([back.width, back.height]).toEqual([1, 1]);
  });
});
