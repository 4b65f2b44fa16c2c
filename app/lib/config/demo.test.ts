// The seeded builds must open clean: complete, valid configs whose only note is the one the
// demo is built to show (a promised font that has not arrived).
import { describe, expect, it } from "vitest";
import { demoConfig, demoConfigSmall } from "./demo";
import { configSchema } from "./schema";
import { validateConfig } from "../checks/validate";

describe("demo configs", () => {
  it("Kestrel's config is valid, with the Northlight font still promised", () => {
    const c = demoConfig();
    expect(configSchema.safeParse(c).success).toBe(true);
    const { diagnostics, power } = validateConfig(c, { power: "engine" });
    expect(diagnostics.map((d) => [d.severity, d.code, d.path])).toEqual([["warning", "font-promised", "presets[4].fontId"]]);
    expect(power?.presets.map((p) => p.presetId)).toEqual(c.presets.map((p) => p.id));
  });
  it("Harrier's config is valid with no diagnostics", () => {
    const c = demoConfigSmall();
    expect(configSchema.safeParse(c).success).toBe(true);
    expect(validateConfig(c, { power: "engine" }).diagnostics).toEqual([]);
  });
  it("every preset has a look for every channel", () => {
    for (const c of [demoConfig(), demoConfigSmall()]) for (const p of c.presets) expect(Object.keys(p.looks).sort()).toEqual(c.rig.channels.map((ch) => ch.id).sort());
  });
});
