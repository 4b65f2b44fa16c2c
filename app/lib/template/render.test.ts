import { describe, expect, it } from "vitest";
import { demoConfig } from "../config/demo";
import { compileTemplate, render, renderTemplate } from "./compile";
import { META, out, run } from "./test-helpers";

describe("expressions and statements", () => {
  it("evaluates arithmetic, comparisons and boolean logic", () => {
    expect(out("@( 2 + 3 * 4 )@ @( (2 + 3) * 4 )@ @( 7 % 3 )@ @( -2 - -3 )@ @( 1 / 4 )@")).toBe("14 20 1 1 0.25");
    expect(out("@( 1 < 2 and 'b' > 'a' )@ @( not (1 == 1) or 2 != 2 )@ @( nothing == config.rig.board.missing2 )@".replace("config.rig.board.missing2", "meta.clientName"))).toBe(
      "true false false",
    );
  });

  it("branches with orwhen and otherwise", () => {
    const src = "@[ over config.rig.channels as ch ]@@[ when ch.pixels > 100 ]@L@[ orwhen ch.pixels > 1 ]@M@[ otherwise ]@S@[ /when ]@@[ /over ]@";
    expect(out(src)).toBe("LMS");
  });

  it("gives loops index, number, first, last and length, and an empty branch", () => {
    const src = "@[ over config.rig.channels as ch, n ]@@( n.index )@/@( n.number )@/@( n.length )@@[ when n.first ]@F@[ /when ]@@[ when n.last ]@L@[ /when ]@ @[ /over ]@";
    expect(out(src)).toBe("0/1/3F 1/2/3 2/3/3L ");
    const cfg = demoConfig();
    cfg.controls = [];
    const c = compileTemplate("@[ over config.controls as k ]@x@[ none ]@no controls@[ /over ]@");
    expect(c.ok && renderTemplate(c.template, cfg, META)).toEqual({ ok: true, output: "no controls" });
  });

  it("walks keyed tables with entries, and indexes lists and tables", () => {
    expect(out("@[ over config.presets[0].looks |> entries as e ]@@( e.key )@:@( e.value.layers |> count )@ @[ /over ]@")).toBe("blade:8 chamber:3 crystal:2 ");
    expect(out("@( config.presets[1].looks['blade'].layers[1].kind )@ @( config.rig.channels[9].id |> default('none') )@")).toBe("drift none");
  });

  it("lets counters run across loops", () => {
    expect(out("@[ let total = 0 ]@@[ over config.rig.channels as ch ]@@[ let total = total + ch.pixels * ch.parallelStrips ]@@[ /over ]@@( total )@")).toBe("272");
  });

  it("expands pieces with parameters and defaults, and other templates", () => {
    const src = "@[ piece row(label, value, width = 8) ]@@( label |> pad(width) )@=@( value )@;@[ /piece ]@@[ use row(label = 'a', value = 1) ]@@[ use row(label = 'b', value = 2, width = 3) ]@";
    expect(out(src)).toBe("a       =1;b  =2;");
    const withPartial = out('<@[ use "sig"(who = meta.buildName) ]@>', { partials: (n) => (n === "sig" ? "made for @( who |> upper )@" : undefined) });
    expect(withPartial).toBe("<made for KESTREL>");
  });

  it("pieces do not see the caller's variables", () => {
    const r = run("@[ piece p ]@@( ch.id )@@[ /piece ]@@[ over config.rig.channels as ch ]@@[ use p ]@@[ /over ]@");
    expect(r.errors[0].message).toMatch(/unknown name 'ch'/);
  });

  it("is deterministic: same input, same bytes", () => {
    const src = "@( meta.savedAt )@ @[ over config.presets as p ]@@( p.name |> cident('p') )@ @[ /over ]@";
    expect(render(src, demoConfig(), META)).toEqual(render(src, demoConfig(), META));
  });
});

describe("render errors", () => {
  it("refuses to print a missing value", () => {
    const r = run("@[ over config.presets[0].looks.blade.layers as l ]@@( l.color )@,@[ /over ]@");
    expect(r.errors[0]).toMatchObject({ stage: "render", line: 1, column: 53 });
    expect(r.errors[0].message).toMatch(/value is missing here/);
  });

  it("reports a filter applied to the wrong type at run time", () => {
    // Values read through 'entries' of a plain object are untyped, so only render can tell.
    const src = "@[ over config.rig.board |> entries as e ]@@( e.value |> upper )@;@[ /over ]@";
    const r = run(src);
    expect(r.errors[0]).toMatchObject({ stage: "render", line: 1, column: src.indexOf("upper") + 1 });
    expect(r.errors[0].message).toBe("filter 'upper': the input must be text, not a list");
    expect(run("@( 1 / 0 )@").errors[0].message).toMatch(/division by zero/);
  });

  it("bounds filter arguments instead of allocating", () => {
    const r = run("@( 'x' |> pad(1000000000) )@");
    expect(r.errors[0]).toMatchObject({ stage: "render", column: 11 });
    expect(r.errors[0].message).toBe("filter 'pad': the width of 'pad' must be a whole number from 0 to 1000, not 1000000000");
    expect(run("@( 1 |> fixed(99) )@").errors[0].message).toMatch(/at most 20 digits/);
  });

  it("stops enormous loops by the step budget, even with an empty body", () => {
    const nest = (depth: number) => "@[ over config.presets[0].looks.blade.layers as a ]@".repeat(depth) + "@[ /over ]@".repeat(depth);
    const r = run(nest(8));
    expect(r.errors[0]).toMatchObject({ stage: "render", line: 1 });
    expect(r.errors[0].message).toMatch(/more than the limit of 1000000 steps/);
  });

  it("stops enormous output by the output budget", () => {
    const src = "@[ over config.presets as a ]@@[ over config.presets as b ]@@[ over config.presets as c ]@@[ over config.presets as d ]@" + "@( 'y' |> pad(1000) )@" + "@[ /over ]@".repeat(4);
    const r = run(src, { limits: { maxOutput: 100_000 } });
    expect(r.errors[0].message).toBe("output is larger than the limit of 100000 characters");
  });

  it("charges filter calls, so a render with few loop passes but heavy filters still stops on time", () => {
    // Five loop passes, each with 2,000 JSON copies of the whole config: few steps of the old
    // kind (loop passes), so the clock was never looked at and the render ran to the end.
    const src = "@[ over config.presets as p ]@" + "@[ let n = config |> json |> count ]@".repeat(2000) + "@[ /over ]@";
    const started = performance.now();
    const r = run(src, { limits: { maxMillis: 20 } });
    expect(r.errors[0]).toMatchObject({ stage: "render", message: "rendering took longer than the time limit" });
    expect(performance.now() - started).toBeLessThan(2000);
    expect(run("@( 'x' |> upper |> lower )@", { limits: { maxSteps: 1 } }).errors[0].message).toBe(
      "evaluation took more than the limit of 1 steps (loop passes, piece uses, filter calls)",
    );
  });

  it("stops a slow render by the time budget", () => {
    const nest = "@[ over config.presets[0].looks.blade.layers as a ]@".repeat(9) + "@[ /over ]@".repeat(9);
    const r = run(nest, { limits: { maxMillis: 5, maxSteps: 1e12 } });
    expect(r.errors[0].message).toBe("rendering took longer than the time limit");
  });

  it("reads only own data: prototype tricks through untyped values find nothing", () => {
    const src = "@[ over config.rig |> entries as e ]@[@( e.value.constructor |> default('-') )@ @( e.value['__proto__'] |> default('-') )@ @( e.value.toString |> default('-') )@]@[ /over ]@";
    expect(out(src)).toBe("[- - -]".repeat(5));
  });

  it("never calls into the data it reads", () => {
    const cfg = demoConfig() as unknown as Record<string, unknown>;
    let called = false;
    Object.defineProperty(cfg, "valueOf", { value: () => ((called = true), 1), enumerable: false });
    const c = compileTemplate("@( config.format )@");
    expect(c.ok && renderTemplate(c.template, cfg as never, META)).toEqual({ ok: true, output: "hiltbench.config/2" });
    expect(called).toBe(false);
  });
});
