import { describe, expect, it } from "vitest";
import { demoConfig } from "./demo";
import { ENGINE_BUDGET, engineWork, powerModeFor } from "./power-mode";

describe("powerModeFor", () => {
  it("uses the engine for the demo config", () => {
    // 5 presets; blade 132 px, chamber 7 px, crystal 1 px; work = Σ pixels × (layers + 1).
    const c = demoConfig();
    const expected = c.presets.reduce((sum, p) => sum + c.rig.channels.reduce((s, ch) => s + ch.pixels * ((p.looks[ch.id]?.layers.length ?? 0) + 1), 0), 0);
    expect(engineWork(c)).toBe(expected);
    expect(powerModeFor(c)).toBe("engine");
  });
  it("falls back to the estimate past the budget", () => {
    const c = demoConfig();
    const p = c.presets[0];
    c.presets = Array.from({ length: 200 }, (_, i) => ({ ...p, id: `p-${i}` }));
    expect(engineWork(c)).toBeGreaterThan(ENGINE_BUDGET);
    expect(powerModeFor(c)).toBe("estimate");
  });
  it("reads malformed input without throwing", () => {
    for (const bad of [null, 1, "x", [], { rig: 1 }, { rig: { channels: [null, { pixels: "9" }] }, presets: [null, { looks: 3 }] }]) expect(() => powerModeFor(bad)).not.toThrow();
    expect(engineWork({ rig: { channels: [{ id: "a", pixels: 10 }] }, presets: [{ looks: { a: { layers: [{}, {}] } } }] })).toBe(30);
  });
});
