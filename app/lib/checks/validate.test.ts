// One row per semantic rule: a change to the demo config that must trigger the code, and a
// near miss (or the demo itself) that must not.
import { describe, expect, it } from "vitest";
import { demoConfig } from "../config/demo";
import { newLayer } from "../config/layers";
import type { Config, Layer } from "../config/schema";
import { RULES } from "./rules/codes";
import { validate, validateConfig } from "./validate";

type Row = { code: string; trigger: (c: Config) => void; pass?: (c: Config) => void };

const blade = (c: Config, p = 0) => c.presets[p].looks.blade.layers;
const chamber = (c: Config, p = 0) => c.presets[p].looks.chamber.layers;
const crystal = (c: Config, p = 0) => c.presets[p].looks.crystal.layers;
const find = <K extends Layer["kind"]>(layers: Layer[], kind: K, event?: string) =>
  layers.find((l) => l.kind === kind && (event === undefined || ("event" in l && l.event === event))) as Extract<Layer, { kind: K }>;
const allPresets = (c: Config, fn: (p: Config["presets"][number]) => void) => c.presets.forEach(fn);

const ROWS: Row[] = [
  // references
  { code: "duplicate-channel-id", trigger: (c) => void (c.rig.channels[2].id = "chamber") },
  { code: "duplicate-button-id", trigger: (c) => void (c.rig.buttons[1].id = "activation") },
  { code: "duplicate-font-id", trigger: (c) => void (c.fonts[1].id = "ashfall") },
  { code: "duplicate-preset-id", trigger: (c) => void (c.presets[1].id = "ashfall") },
  // Layer ids are unique within a look; the same id in another look or preset is fine.
  {
    code: "duplicate-layer-id",
    trigger: (c) => void (blade(c)[3].id = blade(c)[1].id),
    pass: (c) => void ((blade(c)[3].id = chamber(c)[0].id), (blade(c, 1)[0].id = blade(c)[0].id)),
  },
  { code: "duplicate-preset-name", trigger: (c) => void (c.presets[1].name = " ASHFALL "), pass: (c) => void (c.presets[1].name = "Ashfall II") },
  { code: "duplicate-font-folder", trigger: (c) => void (c.fonts[1].folder = "ASHFALL"), pass: (c) => void (c.fonts[1].folder = "ashfall-2") },
  { code: "unknown-font", trigger: (c) => void (c.presets[0].fontId = "squall") },
  { code: "unknown-look-channel", trigger: (c) => void (c.presets[0].looks.hilt = { layers: [newLayer("fill")] }) },
  { code: "unknown-mirror-channel", trigger: (c) => void (find(chamber(c), "mirror").channelId = "hilt") },
  { code: "mirror-self", trigger: (c) => void (find(chamber(c), "mirror").channelId = "chamber") },
  {
    code: "mirror-cycle",
    trigger: (c) => void blade(c).push(newLayer("mirror", { channelId: "chamber" })),
    pass: (c) => void crystal(c).push(newLayer("mirror", { channelId: "chamber" })),
  },
  { code: "unknown-button", trigger: (c) => void ((c.controls[2].trigger as { buttonId: string }).buttonId = "trigger") },
  // completeness
  { code: "no-presets", trigger: (c) => void (c.presets = []) },
  { code: "missing-look", trigger: (c) => void delete c.presets[0].looks.crystal },
  {
    code: "empty-look",
    trigger: (c) => crystal(c).forEach((l) => (l.enabled = false)),
    pass: (c) => crystal(c).forEach((l, i) => (l.enabled = i === 0)),
  },
  {
    code: "no-ignition-control",
    trigger: (c) => void (c.controls[0].trigger.state = "lit"),
    pass: (c) => void (c.controls[0].trigger.state = "any"),
  },
  {
    code: "no-retraction-control",
    trigger: (c) => void (c.controls = c.controls.filter((x) => x.event !== "retraction")),
    pass: (c) => void (c.controls[1].trigger.state = "any"),
  },
  {
    code: "duplicate-trigger",
    trigger: (c) => void c.controls.push({ event: "clash", trigger: { input: "button", buttonId: "activation", gesture: "press", state: "any" } }),
    pass: (c) => void c.controls.push({ event: "clash", trigger: { input: "button", buttonId: "activation", gesture: "triple-press", state: "lit" } }),
  },
  {
    code: "font-promised",
    trigger: () => {},
    pass: (c) => void Object.assign(c.fonts[4], { status: "received", cues: [...c.fonts[0].cues] }),
  },
  { code: "font-invalid", trigger: (c) => void (c.fonts[0].status = "invalid") },
  {
    code: "font-missing-cue",
    trigger: (c) => void (c.fonts[0].cues = c.fonts[0].cues.filter((q) => q !== "clash")),
    pass: (c) => void (c.fonts[0].cues = c.fonts[0].cues.filter((q) => q !== "boot")),
  },
  {
    // The looks answer drag; with that hold gone only the drag control still wants the sound.
    code: "font-missing-control-cue",
    trigger: (c) => {
      c.presets[0].looks.blade.layers = blade(c).filter((l) => !(l.kind === "hold" && l.event === "drag"));
      c.fonts[0].cues = c.fonts[0].cues.filter((q) => q !== "drag");
    },
    pass: (c) => void (c.fonts[0].cues = c.fonts[0].cues.filter((q) => q !== "drag")),
  },
  // The demo's ignition wipe takes 340 ms: a 2 s ignite sound is far longer, 400 ms lands with it.
  { code: "wipe-off-font-sound", trigger: (c) => void (c.fonts[0].igniteMs = 2000), pass: (c) => void (c.fonts[0].igniteMs = 400) },
  { code: "font-unused", trigger: (c) => void c.fonts.push({ id: "squall", name: "Squall", folder: "squall", status: "received", cues: ["hum"] }) },
  {
    code: "blade-without-ignition-wipe",
    trigger: (c) => void (find(blade(c), "wipe", "ignition").enabled = false),
    pass: (c) => void (find(blade(c), "wipe", "retraction").durationMs = 600),
  },
  { code: "blade-without-retraction-wipe", trigger: (c) => void (c.presets[1].looks.blade.layers = blade(c, 1).filter((l) => !(l.kind === "wipe" && l.event === "retraction"))) },
  {
    code: "button-unused",
    trigger: (c) => void c.rig.buttons.push({ id: "spare", name: "Spare", kind: "auxiliary", pin: 8 }),
    pass: (c) => {
      c.rig.buttons.push({ id: "spare", name: "Spare", kind: "auxiliary", pin: 8 });
      c.controls.push({ event: "blast", trigger: { input: "button", buttonId: "spare", gesture: "press", state: "lit" } });
    },
  },
  {
    code: "control-without-effect",
    trigger: (c) => allPresets(c, (p) => (p.looks.crystal.layers = p.looks.crystal.layers.filter((l) => l.kind !== "spark"))),
    // Blast stays answered by its sound even with the sparks gone.
    pass: (c) => allPresets(c, (p) => (p.looks.blade.layers = p.looks.blade.layers.filter((l) => !(l.kind === "spark" && l.event === "blast")))),
  },
  { code: "effect-without-control", trigger: (c) => void (c.controls = c.controls.filter((x) => x.event !== "blast")) },
  // rig
  { code: "unknown-data-pin", trigger: (c) => void (c.rig.channels[0].pin = 9), pass: (c) => void (c.rig.channels[0].pin = 5) },
  { code: "shared-data-pin", trigger: (c) => void (c.rig.channels[1].pin = 2) },
  { code: "unknown-input-pin", trigger: (c) => void (c.rig.buttons[0].pin = 9), pass: (c) => void (c.rig.buttons[0].pin = 8) },
  { code: "shared-input-pin", trigger: (c) => void (c.rig.buttons[1].pin = 6) },
  {
    code: "pin-used-as-data-and-input",
    trigger: (c) => {
      // The board allows pin 4 for either use, but the crystal already drives it.
      c.rig.board.inputPins.push(4);
      c.rig.buttons[1].pin = 4;
    },
    pass: (c) => {
      c.rig.board.inputPins.push(5);
      c.rig.buttons[1].pin = 5;
    },
  },
  {
    code: "too-many-pixels-on-pin",
    trigger: (c) => void (c.rig.channels[0].pixels = 301),
    // Parallel strips share the line and the data: 300 pixels × 4 strips is still 300 on the pin.
    pass: (c) => void Object.assign(c.rig.channels[0], { pixels: 300, parallelStrips: 4 }),
  },
  {
    code: "pattern-on-one-pixel",
    trigger: (c) => void crystal(c).push(newLayer("gradient")),
    pass: (c) => void chamber(c).push(newLayer("gradient")),
  },
  {
    code: "range-beyond-channel",
    trigger: (c) => void (crystal(c)[0].range = { start: 0, end: 2 }),
    pass: (c) => void (crystal(c)[0].range = { start: 0, end: 1 }),
  },
  { code: "empty-range", trigger: (c) => void (blade(c)[0].range = { start: 3, end: 3 }), pass: (c) => void (blade(c)[0].range = { start: 3, end: 4 }) },
  {
    code: "gradient-stops-out-of-order",
    trigger: (c) => void chamber(c).push(newLayer("gradient", { stops: [{ at: 0.8, color: "#ffffff" }, { at: 0.2, color: "#000000" }] })),
    pass: (c) => void chamber(c).push(newLayer("gradient", { stops: [{ at: 0.2, color: "#ffffff" }, { at: 0.2, color: "#000000" }] })),
  },
  // timing (ranges are common practice; the boundaries themselves pass)
  { code: "timing-not-positive", trigger: (c) => void (find(blade(c), "wipe", "ignition").durationMs = 0) },
  {
    code: "wipe-duration-out-of-range",
    trigger: (c) => void (find(blade(c), "wipe", "ignition").durationMs = 99),
    pass: (c) => {
      find(blade(c), "wipe", "ignition").durationMs = 100;
      find(blade(c), "wipe", "retraction").durationMs = 5000;
    },
  },
  {
    code: "breathe-period-out-of-range",
    trigger: (c) => void (find(crystal(c), "breathe").periodMs = 25_000),
    pass: (c) => void (find(crystal(c), "breathe").periodMs = 20_000),
  },
  { code: "spark-decay-out-of-range", trigger: (c) => void (find(blade(c), "spark", "clash").decayMs = 10), pass: (c) => void (find(blade(c), "spark", "clash").decayMs = 20) },
  { code: "shimmer-rate-out-of-range", trigger: (c) => void (find(blade(c), "shimmer").rateHz = 90), pass: (c) => void (find(blade(c), "shimmer").rateHz = 60) },
  // power
  {
    code: "breathe-floor-above-ceiling",
    trigger: (c) => void Object.assign(find(crystal(c), "breathe"), { floor: 0.9, ceiling: 0.5 }),
    pass: (c) => void Object.assign(find(crystal(c), "breathe"), { floor: 0.5, ceiling: 0.5 }),
  },
  // The demo peaks at about 11 A (full-white clash over both 132-pixel strips at cap 0.6).
  { code: "peak-over-cell-rating", trigger: (c) => void (c.rig.power.cellMaxContinuousAmps = 10), pass: (c) => void (c.rig.power.cellMaxContinuousAmps = 11.5) },
  { code: "peak-near-cell-rating", trigger: (c) => void (c.rig.power.cellMaxContinuousAmps = 13), pass: (c) => void (c.rig.power.cellMaxContinuousAmps = 14) },
  { code: "wire-drop-high", trigger: (c) => void (c.rig.power.wireGaugeAwg = 30), pass: (c) => void (c.rig.power.wireGaugeAwg = 24) },
];

function codesAfter(fn: (c: Config) => void): { codes: Set<string>; all: ReturnType<typeof validate> } {
  const c = demoConfig();
  fn(c);
  const all = validate(c);
  return { codes: new Set(all.map((d) => d.code)), all };
}

describe("layer ids", () => {
  it("reports a layer id used twice in one look at the later layer's id, naming the first", () => {
    const c = demoConfig();
    blade(c)[4].id = blade(c)[1].id;
    const d = validate(c).filter((x) => x.code === "duplicate-layer-id");
    expect(d).toEqual([
      expect.objectContaining({ severity: "error", path: "presets[0].looks.blade.layers[4].id", message: expect.stringContaining(`"${blade(c)[1].id}" is used twice`) }),
    ]);
    expect(d[0].message).toContain("layer 2");
  });

  it("reads a hiltbench.config/1 document as its upgrade, and refuses a /2 layer without an id", () => {
    const v1 = JSON.parse(JSON.stringify(demoConfig()).replace(/"id":"l-[0-9a-z]{6}",/g, "").replace("hiltbench.config/2", "hiltbench.config/1"));
    const r = validateConfig(v1);
    expect(r.config).toEqual(demoConfig());
    const v2 = { ...v1, format: "hiltbench.config/2" };
    expect(validate(v2).filter((x) => x.severity === "error")[0]).toMatchObject({
      code: "missing-field",
      path: "presets[0].looks.blade.layers[0].id",
      message: expect.stringContaining("every layer has an id"),
      hint: expect.stringContaining("hiltbench.config/1"),
    });
  });
});

describe("semantic rules", () => {
  it("has unique codes in the table", () => {
    expect(new Set(ROWS.map((r) => r.code)).size).toBe(ROWS.length);
  });

  it("covers every semantic code in the catalogue", () => {
    const semantic = Object.entries(RULES).filter(([, r]) => r.area !== "structure").map(([code]) => code);
    expect(ROWS.map((r) => r.code).sort()).toEqual(semantic.sort());
  });

  it.each(ROWS)("$code triggers", ({ code, trigger }) => {
    const { codes, all } = codesAfter(trigger);
    expect(codes).toContain(code);
    const d = all.find((x) => x.code === code)!;
    expect(d.severity).toBe(RULES[code as keyof typeof RULES].severity);
    expect(d.message.length).toBeGreaterThan(10);
    expect(d.hint.length).toBeGreaterThan(5);
  });

  it.each(ROWS)("$code stays quiet on the near miss", ({ code, pass }) => {
    const { codes } = codesAfter(pass ?? (() => {}));
    expect(codes).not.toContain(code);
  });
});

describe("the demo config", () => {
  it("validates with no errors; its only warning is the promised Northlight font", () => {
    const { config, diagnostics, power } = validateConfig(demoConfig());
    expect(config).not.toBeNull();
    expect(diagnostics.filter((d) => d.severity === "error")).toEqual([]);
    expect(diagnostics.filter((d) => d.severity === "warning").map((d) => [d.code, d.path])).toEqual([["font-promised", "presets[4].fontId"]]);
    expect(power!.presets).toHaveLength(5);
    expect(power!.overall.peakAmps).toBeGreaterThan(10);
    expect(power!.overall.peakAmps).toBeLessThan(20 * 0.8);
  });
});

describe("rule details", () => {
  it("points at the exact layer field, with the range in the message", () => {
    const c = demoConfig();
    find(chamber(c, 2), "breathe").periodMs = 100;
    const d = validate(c).find((x) => x.code === "breathe-period-out-of-range")!;
    expect(d.path).toBe("presets[2].looks.chamber.layers[0].periodMs");
    expect(d.message).toContain("500–20000 ms");
  });

  it("flags a promised font on every preset that uses it", () => {
    const c = demoConfig();
    c.presets[1].fontId = "northlight";
    const paths = validate(c).filter((d) => d.code === "font-promised").map((d) => d.path);
    expect(paths).toEqual(["presets[1].fontId", "presets[4].fontId"]);
  });

  it("reports a three-channel mirror cycle once, naming the ring", () => {
    const c = demoConfig();
    blade(c).push(newLayer("mirror", { channelId: "crystal" }));
    crystal(c).push(newLayer("mirror", { channelId: "chamber" }));
    const cycles = validate(c).filter((d) => d.code === "mirror-cycle");
    expect(cycles).toHaveLength(1);
    expect(cycles[0].message).toMatch(/blade → crystal → chamber → blade|chamber → blade → crystal → chamber|crystal → chamber → blade → crystal/);
  });

  it("offers a brightness cap that fits when the peak is over the rating", () => {
    const c = demoConfig();
    c.rig.power.cellMaxContinuousAmps = 10;
    const { diagnostics, power } = validateConfig(c);
    const d = diagnostics.find((x) => x.code === "peak-over-cell-rating")!;
    expect(d.severity).toBe("error");
    const cap = power!.overall.suggestedBrightnessCap;
    expect(cap).toBeLessThan(0.6);
    expect(d.hint).toContain(cap.toFixed(2));
    c.rig.power.brightnessCap = cap;
    expect(validate(c).map((x) => x.code)).not.toContain("peak-near-cell-rating");
  });

  it("puts errors before warnings before notes", () => {
    const c = demoConfig();
    c.fonts.push({ id: "squall", name: "Squall", folder: "squall", status: "received", cues: ["hum"] });
    c.rig.channels[0].pin = 9;
    const sev = validate(c).map((d) => d.severity);
    expect(sev).toEqual([...sev].sort((a, b) => ["error", "warning", "info"].indexOf(a) - ["error", "warning", "info"].indexOf(b)));
    expect(sev[0]).toBe("error");
  });
});
