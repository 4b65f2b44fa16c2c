import { describe, expect, it } from "vitest";
import { demoConfig } from "../config/demo";
import { ENGINE_BUDGET, LOOK_OVERHEAD, engineWork, powerModeFor } from "./power-mode";

describe("powerModeFor", () => {
  it("uses the engine for the demo config", () => {
    // 5 presets; blade 132 px, chamber 7 px, crystal 1 px; work = Σ pixels × (layers + 1), plus a
    // render of the blade's look for each chamber layer that mirrors the blade.
    const c = demoConfig();
    const plain = (p: (typeof c.presets)[number], id: string) => LOOK_OVERHEAD + c.rig.channels.find((ch) => ch.id === id)!.pixels * (p.looks[id].layers.length + 1);
    const expected = c.presets.reduce(
      (sum, p) => sum + c.rig.channels.reduce((s, ch) => s + plain(p, ch.id) + p.looks[ch.id].layers.filter((l) => l.kind === "mirror").length * plain(p, "blade"), 0),
      0,
    );
    expect(c.presets.every((p) => p.looks.blade.layers.every((l) => l.kind !== "mirror"))).toBe(true);
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
    expect(engineWork({ rig: { channels: [{ id: "a", pixels: 10 }] }, presets: [{ looks: { a: { layers: [{}, {}] } } }] })).toBe(LOOK_OVERHEAD + 30);
  });
});

describe("engineWork with mirrors", () => {
  const common = { enabled: true, opacity: 1, blend: "normal", when: "always" };
  it("counts a mirror layer as a render of the look it repeats", () => {
    const input = {
      rig: { channels: [{ id: "a", pixels: 10 }, { id: "b", pixels: 4 }] },
      presets: [{ looks: { a: { layers: [{ kind: "mirror", ...common, channelId: "b" }, { kind: "mirror", ...common, channelId: "b" }] }, b: { layers: [{ kind: "fill" }, { kind: "fill" }] } } }],
    };
    // b: 24 + 4 × 3 = 36; a: 24 + 10 × 3 + 2 × 36 = 126; total 162.
    expect(engineWork(input)).toBe(162);
  });
  it("sends a look of many mirrors of a busy look to the estimate", () => {
    const c = demoConfig() as unknown as { presets: { looks: Record<string, { layers: unknown[] }> }[] };
    c.presets = [c.presets[0]];
    c.presets[0].looks.chamber.layers = Array.from({ length: 256 }, () => ({ kind: "shimmer", ...common, color: "#ff0000", amount: 0.5, rateHz: 10 }));
    c.presets[0].looks.blade.layers = Array.from({ length: 256 }, () => ({ kind: "mirror", ...common, channelId: "chamber", fit: "stretch" }));
    expect(powerModeFor(c)).toBe("estimate");
  });
  it("stops at a mirror cycle", () => {
    const input = { rig: { channels: [{ id: "a", pixels: 2 }, { id: "b", pixels: 2 }] }, presets: [{ looks: { a: { layers: [{ kind: "mirror", channelId: "b" }] }, b: { layers: [{ kind: "mirror", channelId: "a" }] } } }] };
    expect(Number.isFinite(engineWork(input))).toBe(true);
  });
});

describe("engineWork overhead", () => {
  it("counts each look's fixed cost, so hundreds of presets of tiny channels go to the estimate", () => {
    const channels = Array.from({ length: 16 }, (_, i) => ({ id: `c${i}`, pixels: 1 }));
    const presets = Array.from({ length: 500 }, () => ({ looks: Object.fromEntries(channels.map((c) => [c.id, { layers: [] }])) }));
    expect(engineWork({ rig: { channels }, presets })).toBe(500 * 16 * (LOOK_OVERHEAD + 1));
    expect(powerModeFor({ rig: { channels }, presets })).toBe("estimate");
  });
});
