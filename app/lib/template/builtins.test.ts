import { describe, expect, it } from "vitest";
import { demoConfig, demoConfigSmall } from "../config/demo";
import { configSchema } from "../config/schema";
import { BUILTIN_TEMPLATES, BUILTIN_VERSION, builtinPartials, builtinSource, type BuiltinTemplateName } from "./builtins";
import { compileTemplate, render, renderTemplate } from "./compile";
import { ccCheck, hasCC, META } from "./test-helpers";
import { C_REFERENCE, hasC, hasClang, hasCxx, syntaxCheck, TOOLCHAINS, walkTables } from "./test-compilers";

function renderBuiltin(name: keyof typeof BUILTIN_TEMPLATES, config = demoConfig(), meta = META): string {
  const r = render(BUILTIN_TEMPLATES[name], config, meta);
  if (!r.ok) throw new Error(r.errors.map((e) => `${e.line}:${e.column} ${e.message}`).join("\n"));
  return r.output;
}

describe("built-in templates", () => {
  it("compile without errors or warnings", () => {
    for (const [name, src] of Object.entries(BUILTIN_TEMPLATES)) {
      const c = compileTemplate(src);
      expect(c.ok, name).toBe(true);
      expect(c.ok && c.warnings, name).toEqual([]);
    }
    expect(builtinPartials("readable-copy")).toBe(BUILTIN_TEMPLATES["readable-copy"]);
    expect(builtinPartials("__proto__")).toBeUndefined();
  });

  it.skipIf(!hasCC)("generic-header: the C compiler accepts the demo output on its own (outside judge: cc -std=c11)", () => {
    ccCheck(renderBuiltin("generic-header"));
    const tricky = demoConfigSmall();
    tricky.rig.buttons = [];
    tricky.rig.board.inputPins = [];
    tricky.controls = [];
    tricky.rig.channels[0].name = 'Blade "main" */ \\ ??/';
    ccCheck(renderBuiltin("generic-header", tricky, { ...META, buildName: "Harrier */ #endif \\", clientName: undefined, revision: undefined }));
  });

  it("generic-header: names the build, the save time and the template version; one line per entry", () => {
    const h = renderBuiltin("generic-header", demoConfig(), { ...META, templateName: "generic-header", templateVersion: 4 });
    expect(h).toContain(" * build:    Kestrel\n");
    expect(h).toContain(" * saved:    2026-03-14T09:30:00Z\n");
    expect(h).toContain(" * template: generic-header v4\n");
    expect(h).toMatch(/^#ifndef HB_CONFIG_H\n#define HB_CONFIG_H$/m);
    expect(h).toContain("#define HB_PRESET_COUNT   5\n");
    expect(h).toContain('  /* #0 */ { .id = "blade", .name = "Main blade", .role = HB_ROLE_MAIN_BLADE, .pixels = 132, .parallel_strips = 2, .pin = 2, .color_order = HB_ORDER_GRB },\n');
    // Version 1 wrote C's array designators; builds asked for version 1 still get them.
    const v1 = render(builtinSource("generic-header", 1)!, demoConfig(), META);
    expect(v1.ok && v1.output).toContain('  [0] = { .id = "blade", .name = "Main blade", .role = HB_ROLE_MAIN_BLADE, .pixels = 132, .parallel_strips = 2, .pin = 2, .color_order = HB_ORDER_GRB },\n');
    expect(h).not.toMatch(/\n\n\n/);
    expect(h.endsWith("#endif /* HB_CONFIG_H */\n")).toBe(true);
  });

  it("is deterministic: same config, metadata and template give the same bytes", () => {
    const c = compileTemplate(BUILTIN_TEMPLATES["generic-header"]);
    if (!c.ok) throw new Error("compile failed");
    const a = renderTemplate(c.template, demoConfig(), META);
    const b = renderTemplate(c.template, demoConfig(), META);
    expect(a).toEqual(b);
  });

  it("readable-copy lists channels, presets in order with fonts, and controls", () => {
    const t = renderBuiltin("readable-copy");
    expect(t).toContain("   1. Main blade               132 px × 2 strips  (pin 2, GRB)\n");
    const order = ["Ashfall", "Glasswind", "Tidebreak", "Emberdusk", "Northlight"].map((n) => t.indexOf(`. ${n} `));
    expect(order.every((v, i) => v > 0 && (i === 0 || v > order[i - 1]))).toBe(true);
    expect(t).toContain("font: Northlight (/northlight) — promised");
    expect(t).toContain("  previous-preset  double-press auxiliary button while unlit\n");
  });

  it("config-json is the model itself", () => {
    const json = JSON.parse(renderBuiltin("config-json"));
    expect(configSchema.parse(json)).toEqual(demoConfig());
  });
});

describe("built-in versions", () => {
  // Every build without a pin renders with generic-header, and its header says which version
  // made it. A change to one of these files would change the bytes of every such build while
  // the header still named the old version. So each released version's contents are fixed
  // here: changing a file means releasing the built-ins as a new version (BUILTIN_VERSION),
  // keeping the old files, and adding the new digests (decision 015).
  const DIGESTS: Record<number, Record<BuiltinTemplateName, string>> = {
    1: {
      "generic-header": "c9c6a8bf4976325a68beaf293049fdf04e6d62f2bb7f32637210c9a643e98a53",
      "readable-copy": "07ad7c08b2598d6ded60ee0b1774bb03f07319fa49d3bcccc8dceec62e48fbd8",
      "config-json": "cfc1dfadc85fda04111cd648cf71339d1038de80e09cb976946fc97c2b6e98e3",
    },
    2: {
      "generic-header": "587f94ca1773e356a4583c4a5379473ff35806ff1c9a64f31d514fdf51a404d7",
      "readable-copy": "07ad7c08b2598d6ded60ee0b1774bb03f07319fa49d3bcccc8dceec62e48fbd8",
      "config-json": "cfc1dfadc85fda04111cd648cf71339d1038de80e09cb976946fc97c2b6e98e3",
    },
  };
  it("are the files each version was released with", async () => {
    const { createHash } = await import("node:crypto");
    expect(Object.keys(DIGESTS).map(Number)).toEqual(Array.from({ length: BUILTIN_VERSION }, (_, i) => i + 1));
    for (let version = 1; version <= BUILTIN_VERSION; version++)
      for (const name of Object.keys(BUILTIN_TEMPLATES) as BuiltinTemplateName[]) {
        const digest = createHash("sha256").update(builtinSource(name, version)!, "utf8").digest("hex");
        expect(digest, `${name} v${version} changed: release the built-ins as a new version instead`).toBe(DIGESTS[version][name]);
      }
    expect(BUILTIN_TEMPLATES["generic-header"]).toBe(builtinSource("generic-header"));
    expect(builtinSource("generic-header", 0)).toBeUndefined();
    expect(builtinSource("generic-header", BUILTIN_VERSION + 1)).toBeUndefined();
  });

  it("version 1 still renders version 1's bytes", () => {
    const r = render(builtinSource("generic-header", 1)!, demoConfig(), META);
    const v1 = r.ok ? r.output : "";
    expect(v1).toMatch(/^ {2}\[2\] = \{ \.look = 0, \.kind = HB_LAYER_SPARK, \.enabled = true, .*\.event = HB_EVENT_CLASH, \.color = /m);
    expect(v1).not.toContain("/* #");
  });
});

// Firmware for small boards is often built with a C++ toolchain (common practice): the header
// must build in both languages, held to strict flags, and a program that walks its tables by
// their counts and links must find every index in range (testdata/walk-tables.c).
describe.skipIf(!hasC || !C_REFERENCE)("generic-header as firmware sees it (outside judges: the machine's C and C++ compilers)", () => {
  const v2 = () => renderBuiltin("generic-header");
  it(`compiles on its own with ${TOOLCHAINS.map((t) => t.name).join(", ")}${hasClang ? "" : " (clang is not installed here: skipped)"}`, () => {
    const tricky = demoConfigSmall();
    tricky.rig.buttons = [];
    tricky.rig.board.inputPins = [];
    tricky.controls = [];
    tricky.fonts[0].cues = [];
    tricky.rig.channels[0].name = 'Blade "main" */ \\ ??/';
    const empty = demoConfigSmall();
    empty.presets = [];
    empty.fonts = [];
    empty.controls = [];
    empty.rig.buttons = [];
    for (const header of [v2(), renderBuiltin("generic-header", tricky), renderBuiltin("generic-header", empty)]) for (const tc of TOOLCHAINS) syntaxCheck(header, tc);
  });

  it("the demo build: a consumer program in each language walks every table, and reads the same values as from version 1 in C", () => {
    const v1 = render(builtinSource("generic-header", 1)!, demoConfig(), META);
    const reference = walkTables(v1.ok ? v1.output : "", C_REFERENCE!);
    expect(reference.code, reference.stderr).toBe(0);
    expect(reference.stdout).toContain("walked 15 looks, 68 layers, 4 stops; 0 problems");
    for (const tc of TOOLCHAINS) {
      const r = walkTables(v2(), tc);
      expect(r.code, `${tc.name}: ${r.stderr}`).toBe(0);
      expect(r.stdout, tc.name).toBe(reference.stdout);
    }
  }, 60_000);

  it.skipIf(!hasCxx)("the consumer is a real judge: C++ refuses version 1, and a look whose layers are not its own fails the walk", () => {
    const cxx = TOOLCHAINS.find((t) => t.lang === "c++")!;
    const v1 = render(builtinSource("generic-header", 1)!, demoConfig(), META);
    expect(() => syntaxCheck(v1.ok ? v1.output : "", cxx)).toThrow(/designator order|designated initializers/);
    const broken = v2().replace(/(\/\* #5 \*\/ \{ \.look = )0,/, "$11,");
    expect(broken).not.toBe(v2());
    const r = walkTables(broken, cxx);
    expect(r.code).toBe(1);
    expect(r.stderr).toContain("layer 5: belongs to look 1, reached from look 0 (a look whose layers are not its own)");
    const outOfRange = walkTables(v2().replace(/(\/\* #0 \*\/ \{ \.id = "ashfall".*\.look_count = )3 /, "$199 "), cxx);
    expect(outOfRange.code).toBe(1);
    expect(outOfRange.stderr).toContain("preset 0: looks 0+99 out of range");
  }, 30_000);
});
