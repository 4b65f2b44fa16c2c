import { describe, expect, it } from "vitest";
import { demoConfig } from "./demo";
import { diagnosticHref, parsePath } from "./links";
import { validateConfig } from "../checks/validate";

describe("parsePath", () => {
  it("reads dotted keys, indexes and quoted keys", () => {
    expect(parsePath('presets[2].looks["odd key"].layers[1].periodMs')).toEqual(["presets", 2, "looks", "odd key", "layers", 1, "periodMs"]);
    expect(parsePath("rig.channels[0].pixels")).toEqual(["rig", "channels", 0, "pixels"]);
    expect(parsePath("")).toEqual([]);
    expect(parsePath("rig..x")).toBeNull();
    expect(parsePath(".rig")).toBeNull();
  });
});

describe("diagnosticHref", () => {
  const c = demoConfig();
  it("points rig values at the rig form's inputs", () => {
    expect(diagnosticHref("b1", "rig.channels[0].pixels", c)).toBe("/builds/b1/rig#f-channels-0-pixels");
    expect(diagnosticHref("b1", "rig.power.wireGaugeAwg", c)).toBe("/builds/b1/rig#f-power-wireGaugeAwg");
    expect(diagnosticHref("b1", "rig.board.dataPins[3]", c)).toBe("/builds/b1/rig#f-board-dataPins");
    expect(diagnosticHref("b1", "rig.buttons[1]", c)).toBe("/builds/b1/rig#f-buttons-1-id");
    expect(diagnosticHref("b1", "rig.channels", c)).toBe("/builds/b1/rig");
    expect(diagnosticHref("b1", "rig.board.nonsense", c)).toBe("/builds/b1/rig");
  });
  it("points preset and look values at the Looks page for that preset", () => {
    expect(diagnosticHref("b1", "presets[4].fontId", c)).toBe("/builds/b1/looks?preset=northlight");
    expect(diagnosticHref("b1", "presets[0].looks.blade.layers[1].color", c)).toBe("/builds/b1/looks?preset=ashfall");
    expect(diagnosticHref("b1", "presets[99].fontId", c)).toBe("/builds/b1/looks");
    expect(diagnosticHref("b1", "presets[0].id", { presets: [{ id: 5 }] })).toBe("/builds/b1/looks");
  });
  it("gives no link where there is no page", () => {
    expect(diagnosticHref("b1", "", c)).toBeNull();
    expect(diagnosticHref("b1", "fonts[0].cues", c)).toBeNull();
    expect(diagnosticHref("b1", "controls[1].trigger", c)).toBeNull();
  });
  it("links the demo's Northlight warning", () => {
    const d = validateConfig(c).diagnostics.find((x) => x.code === "font-promised")!;
    expect(diagnosticHref("b1", d.path, c)).toBe("/builds/b1/looks?preset=northlight");
  });
});
