import { describe, expect, it } from "vitest";
import { demoConfig } from "~/lib/config/demo";
import { newLayer } from "~/lib/config/layers";
import { sequenceCurrent } from "~/lib/power/sequence";
import { suggestedBrightnessCap } from "~/lib/power/current";
import { capForFrames, presetPowerFigures, sampleStepMs } from "./figures";

describe("capForFrames", () => {
  it("agrees with suggestedBrightnessCap for a single frame", () => {
    for (const [colour, fixed, rating] of [
      [10000, 400, 10],
      [3000, 900, 5],
      [0, 100, 1],
      [5000, 9000, 10],
    ]) {
      expect(capForFrames([colour], [fixed], rating)).toBe(suggestedBrightnessCap(colour, fixed, rating));
    }
  });

  it("is bound by the worst frame, which need not be the brightest", () => {
    // Budget 8000 mA. Frame A: bright but quiet → (8000-500)/10000 = 0.75.
    // Frame B: dimmer but with loud audio → (8000-3000)/8000 = 0.625.
    expect(capForFrames([10000, 8000], [500, 3000], 10)).toBe(0.62);
  });
});

describe("presetPowerFigures", () => {
  const c = demoConfig();
  const f = presetPowerFigures(c, "ashfall");

  it("plots the engine's current over the whole sequence", () => {
    const run = sequenceCurrent(c, "ashfall");
    expect(f.series).toHaveLength(450);
    expect(f.peakAmps).toBe(run.peakAmps);
    expect(f.meanAmps).toBe(run.meanAmps);
    expect(Math.max(...f.series.map((p) => p.amps))).toBeCloseTo(run.peakAmps, 9);
  });

  it("derives runtime and wire drop from the rig", () => {
    expect(f.runtimeHours).toBeCloseTo(3000 / (f.meanAmps * 1000), 9);
    // 22 AWG ≈ 0.0529 Ω/m (ASTM B258 diameter, IACS copper); 0.3 m round trip.
    expect(f.wireDropVolts).toBeCloseTo(0.0529 * 0.3 * f.peakAmps, 2);
  });

  it("suggests a cap that actually keeps the peak under 80 % of the rating", () => {
    const tight = demoConfig();
    tight.rig.power.cellMaxContinuousAmps = 6;
    const t = presetPowerFigures(tight, "ashfall");
    expect(t.suggestedCap).toBeGreaterThan(0);
    expect(t.suggestedCap).toBeLessThan(tight.rig.power.brightnessCap);
    const capped = demoConfig();
    capped.rig.power.cellMaxContinuousAmps = 6;
    capped.rig.power.brightnessCap = t.suggestedCap;
    expect(sequenceCurrent(capped, "ashfall").peakAmps).toBeLessThanOrEqual(6 * 0.8 + 0.01);
    // One step brighter goes over (the suggestion is the highest that fits, within byte rounding).
    capped.rig.power.brightnessCap = Math.min(1, t.suggestedCap + 0.03);
    expect(sequenceCurrent(capped, "ashfall").peakAmps).toBeGreaterThan(6 * 0.8);
  });

  it("works out the cap from full brightness when the cap is zero", () => {
    const dark = demoConfig();
    dark.rig.power.brightnessCap = 0;
    expect(presetPowerFigures(dark, "ashfall").suggestedCap).toBe(f.suggestedCap);
  });

  it("samples less often for very heavy looks", () => {
    expect(sampleStepMs(c, "ashfall")).toBeCloseTo(1000 / 60, 9);
    const heavy = demoConfig();
    heavy.presets[0].looks.blade.layers = Array.from({ length: 200 }, () => newLayer("fill"));
    expect(sampleStepMs(heavy, "ashfall")).toBeGreaterThan(1000 / 60);
  });
});
