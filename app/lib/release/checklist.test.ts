import { describe, expect, it } from "vitest";
import { demoConfig } from "../config/demo";
import type { Config } from "../config/schema";
import { benchChecklist, benchItems } from "./checklist";

describe("the bench check", () => {
  it("groups presets, channels, buttons, power and the card, in that order", () => {
    const c = demoConfig();
    const groups = benchChecklist(c);
    expect(groups.map((g) => g.kind)).toEqual([...c.presets.map(() => "preset"), ...c.rig.channels.map(() => "channel"), "buttons", "power", "card"]);
    const first = groups[0];
    expect(first.title).toBe(`Preset: ${c.presets[0].name}`);
    expect(first.items.map((i) => i.key)).toEqual(
      ["select", "font", "ignition", "retraction", "clash", "blast", "lockup", "drag", "auxiliary"].map((k) => `preset:${c.presets[0].id}:${k}`),
    );
    expect(first.items.find((i) => i.key.endsWith(":ignition"))!.label).toMatch(/ignite sound/);
    expect(groups.at(-1)!.items[0].label).toMatch(/Check a card reports no differences/);
  });

  it("asks only for the events the controls fire", () => {
    const c = demoConfig();
    c.controls = c.controls.filter((x) => !["drag", "auxiliary", "blast"].includes(x.event));
    const keys = benchItems(c).map((i) => i.key);
    expect(keys.some((k) => /:(drag|auxiliary|blast)$/.test(k))).toBe(false);
    expect(keys).toContain(`preset:${c.presets[0].id}:clash`);
  });

  it("has one item per distinct control, in plain words", () => {
    const c = demoConfig();
    const buttons = benchChecklist(c).find((g) => g.kind === "buttons")!;
    expect(buttons.items).toHaveLength(c.controls.length);
    expect(buttons.items[0]).toEqual({ key: "control:ignition:button:activation:press:unlit", label: "Press Activation while off: lights the blade" });
    c.controls.push(structuredClone(c.controls[0]));
    expect(benchChecklist(c).find((g) => g.kind === "buttons")!.items).toHaveLength(buttons.items.length);
  });

  it("marks the heat check as common practice and defers power to the cell maker", () => {
    const power = benchChecklist(demoConfig()).find((g) => g.kind === "power")!;
    expect(power.items.find((i) => i.key === "power:no-hot-spots")!.commonPractice).toBe(true);
    expect(power.items.find((i) => i.key === "power:charging")!.label).toMatch(/cell maker's data/);
  });

  it("keeps keys stable across revisions: a rename, a reorder or a new preset leaves the others' keys alone", () => {
    const a = demoConfig();
    const b: Config = structuredClone(a);
    b.presets.reverse();
    b.presets[0].name = "Renamed";
    b.rig.channels[0].name = "Blade";
    b.rig.buttons[0].name = "Main switch";
    b.presets.push({ ...structuredClone(a.presets[0]), id: "extra", name: "Extra" });
    const ka = new Set(benchItems(a).map((i) => i.key));
    const kb = new Set(benchItems(b).map((i) => i.key));
    for (const k of ka) expect(kb.has(k), k).toBe(true);
    expect([...kb].filter((k) => !ka.has(k)).every((k) => k.startsWith("preset:extra:"))).toBe(true);
  });

  it("gives unique keys within the column's limit", () => {
    const keys = benchItems(demoConfig()).map((i) => i.key);
    expect(new Set(keys).size).toBe(keys.length);
    for (const k of keys) expect(k.length).toBeLessThanOrEqual(200);
  });
});
