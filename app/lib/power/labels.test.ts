import { describe, expect, it } from "vitest";
import { capAdvice, formatHours, formatRange, powerFigures, type PowerView } from "./labels";
import { CAP_MARGIN, PEAK_WARN_FRACTION, peakLevel, WIRE_DROP_WARN_FRACTION, wireDropLevel } from "./thresholds";

const rig = { cellMaxContinuousAmps: 10, cellCapacityMah: 3000, cellNominalVolts: 3.7, wireGaugeAwg: 22, wireLengthMm: 150, brightnessCap: 0.8 };
const build: PowerView = { rig, peakAmps: 8.5, peakWhere: "in Northlight", typicalAmps: [1.2, 2.5], runtimeHours: [1.2, 2.5], wireDropVolts: 0.31, wireHeatWatts: 0.4, energyWh: 11.1, suggestedCap: 0.7 };
const preset: PowerView = { rig, peakAmps: 3, peakWhere: "at 1.50 s", typicalAmps: [1.25], runtimeHours: [2.4], wireDropVolts: 0.1, suggestedCap: 1 };

describe("power labels, shared by the Checks card and the look editor's panel", () => {
  it("labels a build's figures and one preset's the same way", () => {
    expect(powerFigures(build).map((f) => f.label)).toEqual(["Peak", "Typical", "Runtime", "Energy", "Wire drop at peak", "Wire heat at peak", "Brightness cap", "Suggested cap"]);
    // One preset has no energy or lead heat figure; every label it has is the build's.
    const labels = powerFigures(preset).map((f) => f.label);
    expect(labels).toEqual(["Peak", "Typical", "Runtime", "Wire drop at peak", "Brightness cap", "Suggested cap"]);
  });

  it("prints values, ranges and notes", () => {
    const by = Object.fromEntries(powerFigures(build).map((f) => [f.key, f]));
    expect(by.peak).toMatchObject({ value: "8.50 A", note: "in Northlight · 85 % of the cell's 10 A", level: "near" });
    expect(by.typical).toMatchObject({ value: "1.20 A – 2.50 A", note: "mean over the sequence, by preset" });
    expect(by.runtime.value).toBe("1 h 12 min – 2 h 30 min");
    expect(by["wire-drop"]).toMatchObject({ value: "0.31 V", note: "22 AWG, 150 mm each way · 8.4 % of 3.7 V", level: "near" });
    expect(by["suggested-cap"]).toMatchObject({ value: "70 %", note: "keeps every peak under 80 % of the cell's continuous rating", level: "near" });
    expect(capAdvice(build)).toBe("Lower the rig's brightness cap to 70 % or less, or fit a cell with a higher continuous rating.");
    const one = Object.fromEntries(powerFigures(preset).map((f) => [f.key, f]));
    expect(one.typical).toMatchObject({ value: "1.25 A", note: "mean over the sequence" });
    expect(one["suggested-cap"].level).toBe("good");
    expect(capAdvice(preset)).toBeNull();
    expect(formatHours(Infinity)).toBe("—");
    expect(formatHours(1.999)).toBe("2 h 00 min");
    expect(formatRange([], String)).toBe("—");
  });

  it("judges figures against the validator's own lines", () => {
    expect([PEAK_WARN_FRACTION, WIRE_DROP_WARN_FRACTION]).toEqual([0.8, 0.08]);
    expect(1 - CAP_MARGIN).toBeCloseTo(PEAK_WARN_FRACTION, 12);
    expect([peakLevel(10.1, 10), peakLevel(8.1, 10), peakLevel(8, 10)]).toEqual(["over", "near", "ok"]);
    expect([wireDropLevel(0.081), wireDropLevel(0.08)]).toEqual(["near", "ok"]);
  });
});
