import { describe, expect, it } from "vitest";
import { demoConfig } from "../config/demo";
import type { Channel, Power } from "../config/schema";
import {
  audioMilliamps,
  boardIdleMilliamps,
  energyWh,
  frameCurrentMilliamps,
  runtimeHours,
  runtimeHoursAtWatts,
  suggestedBrightnessCap,
  typicalAudioMilliamps,
  TYPICAL_AUDIO_FRACTION,
} from "./current";

const rig = demoConfig().rig;
const power: Power = { ...rig.power, ledMilliampsPerColor: 20, pixelIdleMilliamps: 0 };
const strip = (pixels: number, parallelStrips = 1): Channel => ({ ...rig.channels[0], pixels, parallelStrips });
const white = (pixels: number) => new Uint8ClampedArray(pixels * 3).fill(255);

describe("frame current", () => {
  it("draws about 60 mA per full-white pixel", () => {
    // Common practice (5050-type addressable LEDs): ~20 mA per colour at full duty, 60 mA white.
    expect(frameCurrentMilliamps(white(1), strip(1), power)).toBeCloseTo(60, 9);
  });

  it("matches the full-white strip figures", () => {
    // Common practice: 132 px ≈ 7.92 A; two strips in parallel (264 px) ≈ 15.84 A.
    expect(frameCurrentMilliamps(white(132), strip(132), power)).toBeCloseTo(7920, 6);
    expect(frameCurrentMilliamps(white(132), strip(132, 2), power)).toBeCloseTo(15840, 6);
  });

  it("sums channel bytes in proportion and adds idle current per pixel", () => {
    const frame = new Uint8ClampedArray([255, 0, 0, 0, 128, 0]);
    const p = { ...power, pixelIdleMilliamps: 0.5 };
    expect(frameCurrentMilliamps(frame, strip(2), p)).toBeCloseTo(((255 + 128) / 255) * 20 + 2 * 0.5, 9);
  });

  it("ignores bytes past the channel's pixels and counts missing ones as dark", () => {
    expect(frameCurrentMilliamps(white(10), strip(4), power)).toBeCloseTo(240, 9);
    expect(frameCurrentMilliamps(white(2), strip(4), { ...power, pixelIdleMilliamps: 1 })).toBeCloseTo(120 + 4, 9);
  });
});

describe("board, audio and cell", () => {
  it("reads board idle current from the profile", () => {
    expect(boardIdleMilliamps(rig.board)).toBe(90);
  });

  it("turns rated speaker power into cell current through the amplifier efficiency", () => {
    // 3 W at 3.6 V with 80 % efficiency: 3 / (3.6 × 0.8) A.
    expect(audioMilliamps({ ...rig.speaker, ratedPowerWatts: 3, amplifierEfficiency: 0.8 }, { ...power, cellNominalVolts: 3.6 })).toBeCloseTo(1041.667, 2);
    expect(typicalAudioMilliamps(rig.speaker, power)).toBeCloseTo(audioMilliamps(rig.speaker, power) * TYPICAL_AUDIO_FRACTION, 9);
  });

  it("reproduces the lithium-ion worked example", () => {
    // Source: Battery University BU-303 (3.6 V nominal) and references.md: 3.0 Ah × 3.6 V =
    // 10.8 Wh; at 10 W with η 0.9 the runtime is 10.8 × 0.9 / 10 = 0.972 h.
    expect(energyWh(3000, 3.6)).toBeCloseTo(10.8, 9);
    expect(runtimeHoursAtWatts(10.8, 10, 0.9)).toBeCloseTo(0.972, 9);
    // The same load as a current: 10 W / 3.6 V.
    expect(runtimeHours(3000, 10_000 / 3.6, 0.9)).toBeCloseTo(0.972, 9);
  });

  it("runs forever with no load", () => {
    expect(runtimeHours(3000, 0)).toBe(Infinity);
    expect(runtimeHoursAtWatts(10, 0)).toBe(Infinity);
  });
});

describe("suggested brightness cap", () => {
  it("keeps the peak under the rating less a 20 % margin", () => {
    // 10 A cell → 8 A budget; 1 A fixed → 7 A for LEDs that would draw 14 A at full: cap 0.5.
    expect(suggestedBrightnessCap(14_000, 1000, 10)).toBe(0.5);
    const cap = suggestedBrightnessCap(15_840, 1200, 10);
    expect(15_840 * cap + 1200).toBeLessThanOrEqual(8000);
    expect(15_840 * (cap + 0.01) + 1200).toBeGreaterThan(8000);
  });

  it("never suggests more than full brightness, and zero when the fixed load alone is too much", () => {
    expect(suggestedBrightnessCap(1000, 100, 20)).toBe(1);
    expect(suggestedBrightnessCap(1000, 9000, 10)).toBe(0);
  });
});
