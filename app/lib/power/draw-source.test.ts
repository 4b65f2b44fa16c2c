import { describe, expect, it } from "vitest";
import { demoConfig } from "~/lib/config/demo";
import { newLayer } from "~/lib/config/layers";
import { validateConfig } from "~/lib/checks/validate";
import { engineDrawSource } from "./draw-source";
import { channelDrawFromFrames, sequenceCurrent } from "./sequence";

describe("engine figures in the validator", () => {
  it("reports each channel's rendered peak and mean, not the bound", () => {
    const c = demoConfig();
    const power = validateConfig(c, { power: "engine" }).power!;
    const ash = power.presets[0];
    for (const ch of c.rig.channels) {
      const want = channelDrawFromFrames(c, "ashfall", ch);
      expect(ash.channels.find((x) => x.channelId === ch.id)).toEqual({ channelId: ch.id, ...want });
    }
    // Frames sampled once per 60 fps step never exceed the sequence's own peak from the same frames.
    expect(ash.peakAmps).toBeGreaterThanOrEqual(sequenceCurrent(c, "ashfall").peakAmps - 1e-9);
  });

  it("a spark whose event never comes in the sequence counts in the bound, not in the engine", () => {
    // "auxiliary" never fires in the demonstration sequence: only the bound counts it.
    const c = demoConfig();
    c.presets = [c.presets[0]];
    c.presets[0].looks.crystal = { layers: [newLayer("spark", { event: "auxiliary", color: "#ffffff", widthPixels: 1, decayMs: 400 })] };
    const engine = validateConfig(c, { power: "engine" }).power!.presets[0].channels.find((x) => x.channelId === "crystal")!;
    const bound = validateConfig(c).power!.presets[0].channels.find((x) => x.channelId === "crystal")!;
    const idleOnly = c.rig.power.pixelIdleMilliamps;
    expect(engine.peakMa).toBeCloseTo(idleOnly, 6);
    expect(bound.peakMa).toBeGreaterThan(idleOnly + 20);
  });

  it("drives the peak rule: a preset over the cell's rating is an error at its path", () => {
    const c = demoConfig();
    c.rig.power.cellMaxContinuousAmps = 2;
    const d = validateConfig(c, { power: "engine" }).diagnostics.filter((x) => x.code === "peak-over-cell-rating");
    expect(d.map((x) => x.path)).toContain("presets[0]");
  });

  it("samples at the step asked for", () => {
    const c = demoConfig();
    const coarse = engineDrawSource(500)(c.rig.channels[0], c.presets[0], c);
    expect(coarse).toEqual(channelDrawFromFrames(c, "ashfall", c.rig.channels[0], 500));
  });
});
