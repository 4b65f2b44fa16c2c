import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { demoConfig } from "../config/demo";
import { newLayer } from "../config/layers";
import type { Config, Layer } from "../config/schema";
import { boundPixels, lookBound } from "./bounds";
import { audioMilliamps, typicalAudioMilliamps } from "./current";
import { estimatedDrawSource, powerSummary, presetPower } from "./estimate";
import { wireDropVolts } from "./wire";

/** One 132-pixel blade with two parallel strips, cap 1, no pixel idle current: easy sums. */
function bladeOnly(layers: Layer[], over: Partial<Config["rig"]["power"]> = {}): Config {
  const c = demoConfig();
  c.rig.channels = [c.rig.channels[0]];
  c.rig.power = { ...c.rig.power, brightnessCap: 1, pixelIdleMilliamps: 0, ...over };
  c.presets = [{ id: "p", name: "P", fontId: "ashfall", looks: { blade: { layers } } }];
  return c;
}

const fixedPeakMa = (c: Config) => c.rig.board.idleMilliamps + audioMilliamps(c.rig.speaker, c.rig.power);

describe("estimated channel draw", () => {
  it("a full-white fill draws the common-practice 60 mA per pixel on both strips", () => {
    // Common practice: 132 px × 2 strips × 60 mA = 15.84 A at full white.
    const c = bladeOnly([newLayer("fill", { color: "#ffffff" })]);
    const d = estimatedDrawSource()(c.rig.channels[0], c.presets[0], c);
    expect(d.peakMa).toBeCloseTo(15_840, 3);
    expect(d.meanMa).toBeCloseTo(15_840, 3);
  });

  it("scales with the brightness cap and adds pixel idle current", () => {
    const c = bladeOnly([newLayer("fill", { color: "#ff0000" })], { brightnessCap: 0.5, pixelIdleMilliamps: 1 });
    const d = estimatedDrawSource()(c.rig.channels[0], c.presets[0], c);
    expect(d.peakMa).toBeCloseTo((132 * 20 * 0.5 + 132) * 2, 3);
  });

  it("counts a clash spark as full white over its width at peak, but not in the typical draw", () => {
    const c = bladeOnly([newLayer("fill", { color: "#000000" }), newLayer("spark", { color: "#ffffff", widthPixels: 264, position: 0.5 })]);
    const d = estimatedDrawSource()(c.rig.channels[0], c.presets[0], c);
    expect(d.peakMa).toBeCloseTo(15_840, 3);
    expect(d.meanMa).toBeCloseTo(0, 6);
  });

  it("limits a narrow spark to its pixels", () => {
    const c = bladeOnly([newLayer("spark", { color: "#ffffff", widthPixels: 10, position: 0.5 })]);
    expect(estimatedDrawSource()(c.rig.channels[0], c.presets[0], c).peakMa).toBeCloseTo(10 * 60 * 2, 3);
  });

  it("takes a breathe's ceiling for peaks and its midpoint for typical draw", () => {
    const c = bladeOnly([newLayer("breathe", { color: "#ffffff", floor: 0.2, ceiling: 0.6 })]);
    const d = estimatedDrawSource()(c.rig.channels[0], c.presets[0], c);
    expect(d.peakMa).toBeCloseTo(15_840 * 0.6, 2);
    expect(d.meanMa).toBeCloseTo(15_840 * 0.4, 2);
  });

  it("follows a mirror to the channel it repeats", () => {
    const c = demoConfig();
    c.rig.power.pixelIdleMilliamps = 0;
    const chamber = c.rig.channels[1];
    c.presets[0].looks.chamber = { layers: [newLayer("mirror", { channelId: "blade" })] };
    c.presets[0].looks.blade = { layers: [newLayer("fill", { color: "#ffffff" })] };
    const d = estimatedDrawSource()(chamber, c.presets[0], c);
    expect(d.peakMa).toBeCloseTo(7 * 60 * c.rig.power.brightnessCap, 0);
  });

  it("survives a mirror cycle by assuming full white", () => {
    const c = demoConfig();
    c.presets[0].looks.chamber = { layers: [newLayer("mirror", { channelId: "crystal" })] };
    c.presets[0].looks.crystal = { layers: [newLayer("mirror", { channelId: "chamber" })] };
    const d = estimatedDrawSource()(c.rig.channels[1], c.presets[0], c);
    expect(Number.isFinite(d.peakMa)).toBe(true);
    expect(d.peakMa).toBeGreaterThan(0);
  });
});

describe("bounds are upper bounds", () => {
  // Compose a concrete frame the way any renderer of these blend formulas would, with each
  // breathe at some intensity between floor and ceiling; the peak bound must never be lower.
  const blendOf = (mode: Layer["blend"], u: number, o: number, a: number) =>
    mode === "normal" ? u * (1 - a) + o * a : mode === "add" ? Math.min(1, u + o * a) : mode === "multiply" ? u * (1 - a + a * o) : 1 - (1 - u) * (1 - o * a);
  const hex = fc.integer({ min: 0, max: 0xffffff }).map((n) => `#${n.toString(16).padStart(6, "0")}`);
  const layer = fc.record({
    kind: fc.constantFrom("fill" as const, "breathe" as const),
    color: hex,
    blend: fc.constantFrom("normal" as const, "add" as const, "multiply" as const, "screen" as const),
    opacity: fc.double({ min: 0, max: 1, noNaN: true }),
    floor: fc.double({ min: 0, max: 1, noNaN: true }),
    ceiling: fc.double({ min: 0, max: 1, noNaN: true }),
    t: fc.double({ min: 0, max: 1, noNaN: true }),
  });

  it("for random stacks of fills and breathes in every blend mode", () => {
    fc.assert(
      fc.property(fc.array(layer, { minLength: 1, maxLength: 6 }), (spec) => {
        const layers = spec.map((s) =>
          s.kind === "fill"
            ? newLayer("fill", { color: s.color, blend: s.blend, opacity: s.opacity })
            : newLayer("breathe", { color: s.color, blend: s.blend, opacity: s.opacity, floor: s.floor, ceiling: s.ceiling }),
        );
        const bound = boundPixels(lookBound({ layers }, 4, "peak", true, () => null));
        const rgb = [0, 0, 0];
        spec.forEach((s) => {
          const n = Number.parseInt(s.color.slice(1), 16);
          const col = [(n >> 16) & 255, (n >> 8) & 255, n & 255].map((v) => v / 255);
          const k = s.kind === "fill" ? 1 : s.floor + (s.ceiling - s.floor) * s.t;
          for (let i = 0; i < 3; i++) rgb[i] = blendOf(s.blend, rgb[i], col[i] * k, s.opacity);
        });
        for (let i = 0; i < 3; i++) expect(bound[i]).toBeGreaterThanOrEqual(rgb[i] - 1e-6);
      }),
    );
  });
});

describe("preset power and summary", () => {
  it("adds board idle and full audio to the LED peak", () => {
    const c = bladeOnly([newLayer("fill", { color: "#ffffff" })]);
    const pp = presetPower(c, c.presets[0]);
    expect(pp.peakAmps * 1000).toBeCloseTo(15_840 + fixedPeakMa(c), 3);
    const typicalMa = 15_840 + c.rig.board.idleMilliamps + typicalAudioMilliamps(c.rig.speaker, c.rig.power);
    expect(pp.typicalAmps * 1000).toBeCloseTo(typicalMa, 3);
    expect(pp.runtimeHours).toBeCloseTo(c.rig.power.cellCapacityMah / typicalMa, 9);
  });

  it("takes per-channel figures from a plugged-in source", () => {
    const c = demoConfig();
    const pp = presetPower(c, c.presets[0], () => ({ peakMa: 1000, meanMa: 500 }));
    expect(pp.peakAmps * 1000).toBeCloseTo(3 * 1000 + fixedPeakMa(c), 6);
    expect(pp.channels.map((ch) => ch.channelId)).toEqual(["blade", "chamber", "crystal"]);
  });

  it("reports the worst preset, the wire drop at its peak, and the demo's energy", () => {
    const c = demoConfig();
    const s = powerSummary(c, (ch, p) => ({ peakMa: p.id === "tidebreak" ? 4000 : 1000, meanMa: 100 }));
    expect(s.overall.worstPresetId).toBe("tidebreak");
    expect(s.overall.wireDropVolts).toBeCloseTo(wireDropVolts(22, 0.15, s.overall.peakAmps), 9);
    // 3000 mAh × 3.6 V = 10.8 Wh (Wh = Ah × nominal V).
    expect(s.overall.energyWh).toBeCloseTo(10.8, 9);
    expect(s.overall.cellMaxContinuousAmps).toBe(20);
  });

  it("suggests a cap under which every preset stays below 80 % of the cell's rating", () => {
    const c = bladeOnly([newLayer("fill", { color: "#ffffff" })], { cellMaxContinuousAmps: 10, brightnessCap: 0.9, pixelIdleMilliamps: 0.6 });
    const cap = powerSummary(c).overall.suggestedBrightnessCap;
    expect(cap).toBeGreaterThan(0);
    expect(cap).toBeLessThan(0.9);
    c.rig.power.brightnessCap = cap;
    expect(powerSummary(c).overall.peakAmps).toBeLessThanOrEqual(10 * 0.8 + 1e-9);
    c.rig.power.brightnessCap = cap + 0.02;
    expect(powerSummary(c).overall.peakAmps).toBeGreaterThan(10 * 0.8);
  });

  it("still suggests a cap when the current cap is zero", () => {
    const c = bladeOnly([newLayer("fill", { color: "#ffffff" })], { cellMaxContinuousAmps: 10, brightnessCap: 0 });
    const cap = powerSummary(c).overall.suggestedBrightnessCap;
    expect(cap).toBeGreaterThan(0.3);
    expect(cap).toBeLessThan(0.5);
  });
});
