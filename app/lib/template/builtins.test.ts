import { describe, expect, it } from "vitest";
import { demoConfig, demoConfigSmall } from "../config/demo";
import { configSchema } from "../config/schema";
import { BUILTIN_TEMPLATES, builtinPartials } from "./builtins";
import { compileTemplate, render, renderTemplate } from "./compile";
import { ccCheck, hasCC, META } from "./test-helpers";

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
    expect(h).toContain('  [0] = { .id = "blade", .name = "Main blade", .role = HB_ROLE_MAIN_BLADE, .pixels = 132, .parallel_strips = 2, .pin = 2, .color_order = HB_ORDER_GRB },\n');
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
  // made it. The built-ins are all version 1; a change to one of these files would change the
  // bytes of every such build while the header still said v1. So their contents are fixed here:
  // changing a file means giving built-ins a new version (BUILTIN_VERSION) and new digests.
  const DIGESTS: Record<keyof typeof BUILTIN_TEMPLATES, string> = {
    "generic-header": "c9c6a8bf4976325a68beaf293049fdf04e6d62f2bb7f32637210c9a643e98a53",
    "readable-copy": "07ad7c08b2598d6ded60ee0b1774bb03f07319fa49d3bcccc8dceec62e48fbd8",
    "config-json": "cfc1dfadc85fda04111cd648cf71339d1038de80e09cb976946fc97c2b6e98e3",
  };
  it("are the files version 1 was released with", async () => {
    const { createHash } = await import("node:crypto");
    for (const [name, source] of Object.entries(BUILTIN_TEMPLATES)) {
      const digest = createHash("sha256").update(source, "utf8").digest("hex");
      expect(digest, `templates/${name}.hbt changed: give the built-ins a new version before releasing it`).toBe(DIGESTS[name as keyof typeof BUILTIN_TEMPLATES]);
    }
  });
});
