import { describe, expect, it } from "vitest";
import { demoConfig } from "../config/demo";
import { BUILTIN_TEMPLATES, compileTemplate, formatError, render, renderTemplate, templateCache, type TemplateError } from "./index";
import { readHeader } from "../readback";
import { META } from "./test-helpers";

describe("public API", () => {
  it("compiles once per template version and renders many times", () => {
    templateCache.clear();
    const a = compileTemplate(BUILTIN_TEMPLATES["readable-copy"]);
    const b = compileTemplate(BUILTIN_TEMPLATES["readable-copy"]);
    expect(a).toBe(b);
    expect(a.ok).toBe(true);
    if (!a.ok) return;
    const one = renderTemplate(a.template, demoConfig(), META);
    const two = renderTemplate(a.template, demoConfig(), { ...META, buildName: "Harrier" });
    expect(one.ok && one.output.startsWith("KESTREL")).toBe(true);
    expect(two.ok && two.output.startsWith("HARRIER")).toBe(true);
  });

  it("renders a header that reads back, through the convenience call", () => {
    const r = render(BUILTIN_TEMPLATES["generic-header"], demoConfig(), META);
    expect(r.ok).toBe(true);
    if (r.ok) expect(readHeader(r.output).config).toEqual(demoConfig());
  });

  it("returns errors in the editor's diagnostic shape", () => {
    const src = "ok\n@( config.rig.bord.profile )@";
    const r = render(src, demoConfig(), META);
    expect(r.ok).toBe(false);
    if (r.ok) return;
    const e: TemplateError = r.errors[0];
    expect(Object.keys(e).sort()).toEqual(["column", "from", "line", "message", "severity", "stage", "to"]);
    expect(e).toMatchObject({ stage: "check", severity: "error", line: 2, column: 15, from: 17, to: 21 });
    expect(formatError(e, src)).toContain("    |               ^^^^");
  });
});
