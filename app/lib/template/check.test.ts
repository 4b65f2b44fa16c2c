import { describe, expect, it } from "vitest";
import { compileTemplate } from "./compile";
import { run } from "./test-helpers";

const errorsOf = (src: string) => {
  const c = compileTemplate(src);
  return c.ok ? [] : c.errors.filter((e) => e.severity === "error");
};

describe("schema check at compile time", () => {
  it("checks filters with and without arguments the same way after types are shared", () => {
    // The C text filters share their output types; a compile must not change them for the next.
    for (let i = 0; i < 2; i++) {
      const c = compileTemplate("@[ target c ]@@( meta.clientName |> cstr )@ @( meta.buildName |> cstr |> upper )@ @( meta.revision |> default(0) |> cint )@", { cache: false });
      expect(c).toMatchObject({ ok: true, warnings: [] });
    }
    expect(errorsOf("@( meta.buildName |> cstr(1) )@")[0].message).toBe("filter 'cstr' takes 0 arguments, got 1");
    // Field chains are checked innermost first; a prototype member is never a field.
    expect(errorsOf("@( config.rig.constructor.name )@").map((e) => e.message)).toEqual(["unknown field 'constructor' on rig"]);
    expect(errorsOf("@( meta.bildName.x.y )@")[0].message).toBe("unknown field 'bildName' on meta — did you mean 'buildName'?");
  });

  it("suggests the intended field for a misspelt one", () => {
    const src = "@[ over config.presets as p ]@@[ over p.looks.blade.layers as layer ]@@( layer.sped )@@[ /over ]@@[ /over ]@";
    const [e] = errorsOf(src);
    expect(e).toMatchObject({ stage: "check", message: "unknown field 'sped' on layer — did you mean 'speedPixelsPerSecond'?" });
    expect(src.slice(e.from, e.to)).toBe("sped");
  });

  it("knows the fields of every layer kind (a union has the union of fields)", () => {
    const src = "@[ over config.presets as p ]@@[ over p.looks.blade.layers as l ]@@( l.decayMs |> default(0) )@ @( l.easing |> default('-') )@ @( l.stops |> default(nothing) |> count )@@[ /over ]@@[ /over ]@";
    expect(errorsOf(src)).toEqual([]);
  });

  it("gives loop variables the element type of their list", () => {
    expect(errorsOf("@[ over config.rig.channels as ch ]@@( ch.pixles )@@[ /over ]@")[0].message).toBe("unknown field 'pixles' on channel — did you mean 'pixels'?");
    expect(errorsOf("@[ over config.fonts as f, n ]@@( n.frist )@@[ /over ]@")[0].message).toMatch(/unknown field 'frist' on loop information — did you mean 'first'\?/);
  });

  it("checks names, filters, argument counts and input types", () => {
    expect(errorsOf("@( confg.format )@")[0].message).toMatch(/unknown name 'confg' — did you mean 'config'\?/);
    expect(errorsOf("@( meta.buildName |> uper )@")[0].message).toBe("unknown filter 'uper' — did you mean 'upper'?");
    expect(errorsOf("@( meta.buildName |> pad )@")[0].message).toBe("filter 'pad' takes 1 to 3 arguments, got 0");
    expect(errorsOf("@( meta.buildName |> upper(1) )@")[0].message).toBe("filter 'upper' takes 0 arguments, got 1");
    expect(errorsOf("@( config.rig.board.maxPixelsPerPin |> upper )@")[0].message).toBe("filter 'upper' needs text, but gets a number");
    expect(errorsOf("@( meta.buildName |> fixed(2) )@")[0].message).toBe("filter 'fixed' needs a number, but gets text");
    expect(errorsOf("@( config.presets |> cstr )@")[0].message).toBe("filter 'cstr' needs text, but gets a list");
    expect(errorsOf("@( meta.buildName + 1 )@")[0].message).toBe("'+' needs a number, not text");
  });

  it("rejects printing whole objects and walking non-lists", () => {
    expect(errorsOf("@( config.rig )@")[0].message).toMatch(/cannot print a whole rig/);
    expect(errorsOf("@[ over config.presets as p ]@@[ over p.looks as l ]@@[ /over ]@@[ /over ]@")[0].message).toMatch(/'\|> entries'/);
    expect(errorsOf("@[ over config.rig.board as b ]@@[ /over ]@")[0].message).toMatch(/'over' needs a list, not a board/);
  });

  it("treats prototype keys as unknown fields", () => {
    for (const key of ["__proto__", "constructor", "prototype", "toString", "hasOwnProperty"]) {
      expect(errorsOf(`@( config.${key} )@`)[0].message).toMatch(new RegExp(`unknown field '${key}' on config`));
    }
    expect(errorsOf("@( meta |> constructor )@")[0].message).toMatch(/unknown filter 'constructor'/);
  });

  it("refuses model text printed into C without a C context filter, pointing at the tag with the fix", () => {
    const src = "@[ target c ]@\nconst char *n = \"@( meta.buildName )@\"; @( meta.buildName |> upper )@ @( meta.buildName |> cstr )@ @( meta.buildName |> ccomment )@ @( config.format )@";
    const c = compileTemplate(src);
    expect(c.ok).toBe(false);
    if (!c.ok) {
      const errs = c.errors.filter((e) => e.severity === "error");
      expect(errs).toHaveLength(2);
      expect(errs[0]).toMatchObject({ stage: "check", severity: "error", line: 2 });
      expect(src.slice(errs[0].from, errs[0].to)).toBe("@( meta.buildName )@");
      expect(src.slice(errs[1].from, errs[1].to)).toBe("@( meta.buildName |> upper )@");
      expect(errs[0].message).toMatch(/without a C filter/);
      expect(errs[0].message).toMatch(/'\|> cstr'.*'\|> ccomment'.*'\|> cident'.*'\|> raw'/);
    }
    const text = compileTemplate("@( meta.buildName )@");
    expect(text.ok && text.warnings).toEqual([]);
  });

  it("prints model text into C as it is only when the template says '|> raw'", () => {
    const c = compileTemplate('@[ target c ]@\n// @( meta.buildName |> raw )@ @( meta.buildName |> raw("reviewed: a folder name") )@');
    expect(c.ok).toBe(true);
    if (c.ok) expect(c.warnings).toEqual([]);
    expect(errorsOf("@( meta.buildName |> raw(1) |> raw(2, 3) )@").map((e) => e.message).join("\n")).toMatch(/raw/);
    // Filters after 'raw' that keep text free make it free again.
    expect(compileTemplate("@[ target c ]@ @( meta.buildName |> raw |> default(meta.buildName) )@").ok).toBe(false);
  });

  it("checks piece parameters and reports partial cycles", () => {
    expect(errorsOf("@[ piece a(x) ]@@( x )@@[ /piece ]@@[ use a(y = 1) ]@").map((e) => e.message)).toEqual([
      "piece 'a' has no parameter 'y' — did you mean 'x'?",
      "piece 'a' needs the parameter 'x'",
    ]);
    const cyc = errorsOf("@[ piece a ]@@[ use b ]@@[ /piece ]@@[ piece b ]@@[ use a ]@@[ /piece ]@@[ use a ]@");
    expect(cyc[0].message).toBe("partial cycle: a → b → a");
    const ext = compileTemplate('@[ use "one" ]@', { partials: (n) => (n === "one" ? '@[ use "two" ]@' : n === "two" ? '@[ use "one" ]@' : undefined) });
    expect(!ext.ok && ext.errors[0].message).toMatch(/partial cycle: "one" → "two" → "one"/);
    expect(errorsOf('@[ use "missing" ]@')[0].message).toBe('no template named "missing" is available to use');
  });

  it("points errors inside another template at the 'use' that brought it in", () => {
    const src = 'header\n@[ use "shared" ]@';
    const c = compileTemplate(src, { partials: () => "line\n@( config.rig.bord )@" });
    expect(c.ok).toBe(false);
    if (!c.ok) {
      expect(c.errors[0]).toMatchObject({ line: 2, column: 1 });
      expect(c.errors[0].message).toMatch(/in template "shared" at 2:\d+: unknown field 'bord' on rig — did you mean 'board'\?/);
    }
  });

  it("bounds the work of compiling when a big piece is used many times, pointing at the outermost use", () => {
    const body = "@( meta.buildName |> upper )@".repeat(2000);
    const src = `@[ piece big ]@${body}@[ /piece ]@@[ piece twice ]@@[ use big ]@@[ use big ]@@[ /piece ]@\n` + "@[ use twice ]@".repeat(40);
    const started = performance.now();
    const errs = errorsOf(src);
    expect(performance.now() - started).toBeLessThan(5000);
    expect(errs).toHaveLength(1);
    expect(errs[0].message).toBe("the template grows past the limit of 100000 nodes when its pieces and used templates are expanded; use fewer or smaller pieces");
    // The use in the template's own text, not the one inside the piece that was being expanded.
    expect(src.slice(errs[0].from, errs[0].to)).toBe("@[ use twice ]@");
    expect(errs[0].line).toBe(2);
    // A smaller budget stops the same template sooner; the built-ins are far below the default.
    expect(errorsOf("@( 1 + 2 )@@( 3 )@".repeat(10)).length).toBe(0);
    const small = compileTemplate("@( 1 + 2 )@".repeat(10), { limits: { maxCompileNodes: 12 } });
    expect(small.ok).toBe(false);
  });

  it("refuses model text that reaches C through 'json' or a 'default' fallback", () => {
    const src = "@[ target c ]@ @( meta.revision |> default(meta.buildName) )@ @( config.rig |> json )@ @( meta.revision |> default(0) )@";
    const c = compileTemplate(src, { cache: false });
    expect(c.ok).toBe(false);
    if (c.ok) return;
    // The first two tags are refused; a number fallback is not text.
    expect(c.errors.map((w) => w.column)).toEqual([src.indexOf("@( meta") + 1, src.indexOf("@( config") + 1]);
    expect(c.errors.every((w) => w.message.startsWith("model text printed into C without a C filter"))).toBe(true);
  });

  it("expands pieces a bounded number of times", () => {
    let src = "@[ piece p0 ]@x@[ /piece ]@";
    for (let i = 1; i <= 14; i++) src += `@[ piece p${i} ]@@[ use p${i - 1} ]@@[ use p${i - 1} ]@@[ /piece ]@`;
    src += "@[ use p14 ]@";
    expect(errorsOf(src)[0].message).toMatch(/more than the limit of 2000 partial expansions/);
    let deep = "@[ piece q0 ]@x@[ /piece ]@";
    for (let i = 1; i <= 20; i++) deep += `@[ piece q${i} ]@@[ use q${i - 1} ]@@[ /piece ]@`;
    deep += "@[ use q20 ]@";
    expect(errorsOf(deep)[0].message).toMatch(/partials are nested deeper than the limit of 16/);
  });

  it("reports every check error with a stage and position", () => {
    const r = run("@( config.nope )@\n@( meta.nope )@");
    expect(r.errors.map((e) => [e.stage, e.line, e.column])).toEqual([
      ["check", 1, 11],
      ["check", 2, 9],
    ]);
  });
});
