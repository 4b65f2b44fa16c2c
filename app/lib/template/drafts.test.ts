// The editor compiles a draft on every keystroke: such compiles must not fill the caches, and the
// whitespace rules (character scans since the speed work) must behave as documented.
import { describe, expect, it } from "vitest";
import { demoConfig } from "../config/demo";
import { BUILTIN_TEMPLATES, compileTemplate, renderTemplate, templateCache } from "./index";
import { META, out } from "./test-helpers";

describe("drafts and whitespace", () => {
  it("compiles a draft without caching its parse or result, rendering the same bytes", () => {
    templateCache.clear();
    const draft = BUILTIN_TEMPLATES["generic-header"] + "@# draft 1 #@";
    const a = compileTemplate(draft, { cache: false });
    expect(templateCache.has(draft)).toBe(false);
    expect(compileTemplate(draft, { cache: false })).not.toBe(a);
    const b = compileTemplate(draft);
    expect(templateCache.has(draft)).toBe(true);
    expect(a.ok && b.ok).toBe(true);
    if (!a.ok || !b.ok) return;
    const ra = renderTemplate(a.template, demoConfig(), META);
    const rb = renderTemplate(b.template, demoConfig(), META);
    expect(ra.ok && rb.ok && ra.output === rb.output).toBe(true);
  });

  it("removes block-tag-only lines with their line end (LF and CRLF), keeps other lines", () => {
    expect(out("a\n  @[ when true ]@  \nb\n@[ /when ]@\nc")).toBe("a\nb\nc");
    expect(out("a\r\n\t@[ when true ]@\r\nb\r\n@[ /when ]@\r\nc")).toBe("a\r\nb\r\nc");
    expect(out("a @[ when true ]@b@[ /when ]@ c")).toBe("a b c");
    expect(out("@[ let x = 1 ]@\n@( x )@")).toBe("1");
    expect(out("x  \n  @(~ 1 ~)@  \n  y")).toBe("x1y");
  });
});
