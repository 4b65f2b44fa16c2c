import { describe, expect, it } from "vitest";
import { demoConfig } from "~/lib/config/demo";
import { newLayer } from "~/lib/config/layers";
import type { Config } from "~/lib/config/schema";
import { audioMilliamps, typicalAudioMilliamps } from "~/lib/power/current";
import { channelDrawFromFrames, EFFECT_SOUND_MS, sequenceCurrent } from "./sequence";

/** The demo rig with one white blade and dark chamber and crystal: every figure is hand-checkable. */
function whiteBlade(): Config {
  const c = demoConfig();
  c.presets = [{ id: "white", name: "White", fontId: "ashfall", looks: { blade: { layers: [newLayer("fill", { color: "#ffffff" })] } } }];
  c.rig.power.brightnessCap = 0.5;
  return c;
}

describe("sequenceCurrent", () => {
  it("sums real frames, board idle and audio at each step", () => {
    const c = whiteBlade();
    const { power, board, speaker } = c.rig;
    const s = sequenceCurrent(c, "white", 100);
    expect(s.timesMs.length).toBe(75);
    expect(s.milliamps.length).toBe(75);
    expect(s.timesMs[3]).toBe(300);
    // Pixel idle of every strip of every channel: 132×2 + 7 + 1 pixels.
    const idle = (132 * 2 + 7 + 1) * power.pixelIdleMilliamps;
    // Cap 0.5 of 255 is 127.5, which the byte rounds to 128 (round half to even): 3 colours per pixel.
    const blade = (132 * 3 * 128) / 255 * power.ledMilliampsPerColor * 2;
    const hum = typicalAudioMilliamps(speaker, power);
    // t = 1000: lit, humming, no effect sound.
    expect(s.milliamps[10]).toBeCloseTo(board.idleMilliamps + idle + blade + hum, 6);
    // t = 0: ignition sound at the speaker's rating.
    expect(s.milliamps[0]).toBeCloseTo(board.idleMilliamps + idle + blade + audioMilliamps(speaker, power), 6);
    // After the retraction (no wipe: off at once) and its sound: board and pixel idle only.
    expect(s.milliamps[Math.ceil((6500 + EFFECT_SOUND_MS) / 100)]).toBeCloseTo(board.idleMilliamps + idle, 6);
    expect(s.peakAmps).toBeCloseTo(Math.max(...s.milliamps) / 1000, 9);
    expect(s.meanAmps).toBeCloseTo(s.milliamps.reduce((a, b) => a + b, 0) / 75 / 1000, 9);
  });

  it("runs the demo presets with sensible figures", () => {
    const c = demoConfig();
    const s = sequenceCurrent(c, "ashfall");
    expect(s.timesMs.length).toBe(450);
    expect(s.peakAmps).toBeGreaterThan(s.meanAmps);
    expect(s.milliamps.every((m) => Number.isFinite(m) && m > 0)).toBe(true);
    // A full-white 264-pixel blade at cap 0.6 is the ceiling for the LEDs (common practice: 20 mA per colour).
    expect(s.peakAmps).toBeLessThan((264 * 60 * 0.6 + 8 * 60 + 2000) / 1000);
  });

  it("gives one channel's peak and mean LED current", () => {
    const c = whiteBlade();
    const d = channelDrawFromFrames(c, "white", c.rig.channels[0], 100);
    const lit = (132 * 3 * 128) / 255 * 20 * 2 + 132 * 2 * 0.6;
    expect(d.peakMa).toBeCloseTo(lit, 6);
    expect(d.meanMa).toBeLessThan(lit);
  });
});
