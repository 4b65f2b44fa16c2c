// Structural problems come from the schema; each must read as a sentence with a JSON path.
import { describe, expect, it } from "vitest";
import { demoConfig } from "../config/demo";
import { formatPath, joinPath, keySegment } from "./diagnostics";
import { newLayer } from "../config/layers";
import { RULES } from "./rules/codes";
import { MAX_STRUCTURE_DIAGNOSTICS } from "./structure";
import { validate, validateConfig } from "./validate";

type Loose = Record<string, any>; // eslint-disable-line @typescript-eslint/no-explicit-any

const ROWS: { code: string; path: string; trigger: (c: Loose) => void; says: RegExp }[] = [
  { code: "wrong-type", path: "rig.channels[1].pixels", trigger: (c) => (c.rig.channels[1].pixels = "7"), says: /should be a number, but it is a string \("7"\)/ },
  { code: "missing-field", path: "rig.channels[0].name", trigger: (c) => delete c.rig.channels[0].name, says: /is missing/ },
  { code: "not-a-number", path: "presets[0].looks.blade.layers[0].opacity", trigger: (c) => (c.presets[0].looks.blade.layers[0].opacity = NaN), says: /is NaN/ },
  { code: "not-a-number", path: "presets[0].looks.blade.layers[2].decayMs", trigger: (c) => (c.presets[0].looks.blade.layers[2].decayMs = Infinity), says: /Infinity/ },
  { code: "not-whole-number", path: "rig.channels[0].pixels", trigger: (c) => (c.rig.channels[0].pixels = 2.5), says: /whole number/ },
  { code: "out-of-range", path: "rig.channels[0].pixels", trigger: (c) => (c.rig.channels[0].pixels = -4), says: /is -4, but it must be at least 1/ },
  { code: "out-of-range", path: "rig.power.brightnessCap", trigger: (c) => (c.rig.power.brightnessCap = 1.5), says: /at most 1/ },
  { code: "too-few-items", path: "rig.board.dataPins", trigger: (c) => (c.rig.board.dataPins = []), says: /has 0 items; it needs at least 1/ },
  { code: "too-many-items", path: "rig.buttons", trigger: (c) => (c.rig.buttons = Array.from({ length: 9 }, (_, i) => ({ ...c.rig.buttons[0], id: `b${i}` }))), says: /has 9 items; it needs at most 8/ },
  { code: "text-too-short", path: "presets[0].name", trigger: (c) => (c.presets[0].name = ""), says: /has 0 characters/ },
  { code: "text-too-long", path: "presets[0].name", trigger: (c) => (c.presets[0].name = "x".repeat(61)), says: /at most 60/ },
  { code: "invalid-color", path: "presets[0].looks.blade.layers[0].color", trigger: (c) => (c.presets[0].looks.blade.layers[0].color = "#12345g"), says: /"#12345g".*#rrggbb/ },
  { code: "invalid-id", path: "rig.channels[0].id", trigger: (c) => (c.rig.channels[0].id = "Main Blade"), says: /lowercase/ },
  { code: "invalid-id", path: 'presets[0].looks["Bad Key"]', trigger: (c) => (c.presets[0].looks["Bad Key"] = { layers: [] }), says: /"Bad Key" is not a valid id/ },
  { code: "unknown-layer-kind", path: "presets[0].looks.blade.layers[1].kind", trigger: (c) => (c.presets[0].looks.blade.layers[1].kind = "sparkle"), says: /"sparkle", which is not a layer kind/ },
  { code: "unknown-choice", path: "presets[0].looks.blade.layers[0].blend", trigger: (c) => (c.presets[0].looks.blade.layers[0].blend = "overlay"), says: /"normal", "add", "multiply" or "screen"/ },
  { code: "unknown-choice", path: "controls[0].trigger.input", trigger: (c) => (c.controls[0].trigger.input = "joystick"), says: /"joystick"/ },
  { code: "missing-field", path: "controls[0].trigger.state", trigger: (c) => delete c.controls[0].trigger.state, says: /is missing.*"lit", "unlit" or "any"/ },
  { code: "unknown-field", path: "rig.power.voltage", trigger: (c) => (c.rig.power.voltage = 5), says: /voltage/ },
  { code: "unknown-format", path: "format", trigger: (c) => (c.format = "something-else/2"), says: /not a Hiltbench config/ },
];

describe("structural diagnostics", () => {
  it("covers every structural code in the catalogue except the two fallbacks", () => {
    const tested = new Set([...ROWS.map((r) => r.code), "too-many-problems", "semantic-rules-skipped"]);
    const listed = Object.entries(RULES).filter(([, r]) => r.area === "structure").map(([code]) => code);
    expect(listed.filter((c) => !tested.has(c)).sort()).toEqual(["invalid-format", "invalid-value"]);
  });

  it.each(ROWS)("$code at $path", ({ code, path, trigger, says }) => {
    const c = demoConfig() as Loose;
    trigger(c);
    const { config, diagnostics, power } = validateConfig(c);
    expect(config).toBeNull();
    expect(power).toBeNull();
    const d = diagnostics.find((x) => x.code === code && x.path === path);
    expect(d, JSON.stringify(diagnostics)).toBeDefined();
    expect(d!.severity).toBe("error");
    expect(`${d!.message} ${d!.hint}`).toMatch(says);
    // No zod wording leaks through.
    expect(d!.message).not.toMatch(/Invalid input|Too small|Too big|expected number to be/);
    expect(diagnostics[diagnostics.length - 1].code).toBe("semantic-rules-skipped");
  });

  it.each(ROWS)("$code is absent from the demo", ({ code }) => {
    expect(validate(demoConfig()).map((d) => d.code)).not.toContain(code);
  });

  it.each([42, null, "config", [], undefined])("explains a non-object input (%s)", (input) => {
    const [d] = validate(input);
    expect(d.path).toBe("");
    expect(["wrong-type", "missing-field"]).toContain(d.code);
    expect(d.message).toMatch(/^The config/);
  });

  it("caps the list and summarises the rest", () => {
    const c = demoConfig() as Loose;
    c.presets[0].looks.blade.layers = Array.from({ length: 200 }, () => newLayer("fill", { color: "#12345g" }));
    const d = validate(c);
    expect(d.filter((x) => x.code === "invalid-color")).toHaveLength(MAX_STRUCTURE_DIAGNOSTICS);
    const summary = d.find((x) => x.code === "too-many-problems")!;
    expect(summary.message).toBe("150 more structural problems not listed.");
  });

  it("no summary when under the cap", () => {
    const c = demoConfig() as Loose;
    c.presets[0].looks.blade.layers[0].color = "#12345g";
    expect(validate(c).map((x) => x.code)).not.toContain("too-many-problems");
  });

  it("answers a 10,000-layer look quickly and readably", () => {
    const c = demoConfig() as Loose;
    c.presets[0].looks.blade.layers = Array.from({ length: 10_000 }, (_, i) => ({ kind: i % 2 ? "sparkle" : "fill", color: "#zzzzzz" }));
    const t0 = performance.now();
    const d = validate(c);
    expect(performance.now() - t0).toBeLessThan(1000);
    expect(d.length).toBeLessThanOrEqual(MAX_STRUCTURE_DIAGNOSTICS + 2);
    expect(d[0].path).toBe("presets[0].looks.blade.layers");
    expect(d[0].message).toMatch(/has 10000 items; it needs at most 256/);
  });
});

describe("paths", () => {
  it("formats JSON paths the way a person points at them", () => {
    expect(formatPath(["presets", 2, "looks", "chamber", "layers", 1, "periodMs"])).toBe("presets[2].looks.chamber.layers[1].periodMs");
    expect(formatPath([])).toBe("");
    expect(formatPath(["looks", "2nd blade"])).toBe('looks["2nd blade"]');
    expect(joinPath("presets[0]", "looks", "blade")).toBe("presets[0].looks.blade");
    expect(joinPath("rig.channels", 3)).toBe("rig.channels[3]");
    expect(keySegment("9-pixel")).toBe('["9-pixel"]');
  });
});

describe("semantic rules after a structural failure", () => {
  it("are skipped, with a note saying so", () => {
    const c = demoConfig() as Loose;
    c.rig.channels[0].pin = "two";
    c.presets[0].fontId = "no-such-font";
    const codes = validate(c).map((d) => d.code);
    expect(codes).toContain("semantic-rules-skipped");
    expect(codes).not.toContain("unknown-font");
  });

  it("run when the structure is right, without the note", () => {
    const c = demoConfig();
    c.presets[0].fontId = "no-such-font";
    const codes = validate(c).map((d) => d.code);
    expect(codes).not.toContain("semantic-rules-skipped");
    expect(codes).toContain("unknown-font");
  });
});
