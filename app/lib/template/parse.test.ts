import { describe, expect, it } from "vitest";
import { parseCached, parseTemplate, templateCache } from "./cache";
import { formatError } from "./errors";
import { out, run } from "./test-helpers";

describe("parser", () => {
  it("builds a typed AST with spans", () => {
    const p = parseTemplate("a@( x.y |> pad(3) )@");
    expect(p.errors).toEqual([]);
    const node = p.ast!.body[1];
    expect(node.k).toBe("out");
    if (node.k === "out") {
      expect(node.expr).toMatchObject({ k: "filter", name: "pad", input: { k: "get", key: "y", obj: { k: "var", name: "x" } }, args: [{ k: "lit", value: 3 }] });
      expect(node.from).toBe(1);
    }
  });

  it("points 'never closed' at the opening tag", () => {
    const src = "one\n@[ over config.presets as p ]@\n  @[ when true ]@\n  x\n  @[ /when ]@\n";
    const r = run(src);
    expect(r.errors).toHaveLength(1);
    expect(r.errors[0]).toMatchObject({ stage: "parse", line: 2, column: 1, message: "'over' is never closed with '@[ /over ]@'" });
  });

  it("reports several errors in one pass", () => {
    const src = "@( 1 + )@\n@[ frobnicate ]@\n@( config. )@\n@[ /over ]@\n@[ when ]@x";
    const r = run(src);
    const lines = r.errors.map((e) => e.line);
    expect(r.errors.every((e) => e.stage === "parse")).toBe(true);
    expect(lines).toEqual(expect.arrayContaining([1, 2, 3, 4, 5]));
    expect(r.errors.find((e) => e.line === 2)!.message).toMatch(/unknown statement 'frobnicate'/);
    expect(r.errors.find((e) => e.line === 4)!.message).toMatch(/'\/over' without a matching opening tag/);
  });

  it("rejects 'orwhen' after 'otherwise'", () => {
    const r = run("@[ when true ]@a@[ otherwise ]@b@[ orwhen false ]@c@[ /when ]@");
    expect(r.errors[0].message).toMatch(/'orwhen' after 'otherwise'/);
  });

  it("refuses long chains of prefixes, operators and filters with a positioned error, never a stack overflow", () => {
    // Each of these builds a tree as deep as the chain is long; before the limits they escaped
    // compile as a RangeError (a 500 from the API, a page error in the editor).
    const cases: [string, RegExp][] = [
      ["@( " + "not ".repeat(50_000) + "true )@", /expression nested deeper than the limit of 64/],
      ["@( " + "- ".repeat(50_000) + "1 )@", /expression nested deeper than the limit of 64/],
      ["@( 1" + " + 1".repeat(50_000) + " )@", /more than 256 operators and filters in one tag \(the limit\); split the expression with 'let'/],
      ["@( 'a'" + " |> upper".repeat(20_000) + " )@", /more than 256 operators and filters in one tag/],
      ["@( config" + ".rig".repeat(20_000) + " )@", /more than 256 operators and filters in one tag/],
    ];
    for (const [src, message] of cases) {
      const r = run(src, { cache: false });
      expect(r.errors).toHaveLength(1);
      expect(r.errors[0]).toMatchObject({ stage: "parse", line: 1 });
      expect(r.errors[0].message).toMatch(message);
      expect(r.errors[0].column).toBeGreaterThan(3);
    }
    // Up to the limits they still work.
    expect(out("@( not " + "not ".repeat(40) + "true )@")).toBe("false");
    expect(out("@( 0" + " + 1".repeat(250) + " )@")).toBe("250");
  });

  it("limits nesting depth with a clear error", () => {
    const deep = "@[ when true ]@".repeat(100) + "x" + "@[ /when ]@".repeat(100);
    const r = run(deep);
    expect(r.errors[0].message).toMatch(/nested deeper than the limit of 64/);
    const parens = "@( " + "(".repeat(200) + "1" + ")".repeat(200) + " )@";
    expect(run(parens).errors[0].message).toMatch(/nested deeper than the limit of 64/);
  });

  it("formats a code frame with a caret under the span", () => {
    const src = "first line\n@( config.rig.chanels |> count )@\n";
    const r = run(src);
    const frame = formatError(r.errors[0], src);
    expect(frame).toBe(
      [
        "error (check) at 2:15: unknown field 'chanels' on rig — did you mean 'channels'?",
        "  1 | first line",
        "> 2 | @( config.rig.chanels |> count )@",
        "    |               ^^^^^^^",
      ].join("\n"),
    );
  });

  it("caches parses by source", () => {
    templateCache.clear();
    const src = "@( meta.buildName )@ cached";
    const a = parseCached(src);
    expect(templateCache.has(src)).toBe(true);
    expect(parseCached(src)).toBe(a);
    expect(out(src)).toBe("Kestrel cached");
    expect(templateCache.size).toBe(1);
  });
});
