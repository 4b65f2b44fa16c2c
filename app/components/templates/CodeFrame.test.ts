import { describe, expect, it } from "vitest";
import { compileTemplate } from "~/lib/template";
import { codeFrame, frameText } from "./CodeFrame";

describe("code frames under template diagnostics", () => {
  it("quotes the line before and the line itself, with carets under the span", () => {
    const source = "/* header */\n#define N @( config.rig.chanels )@\n";
    const r = compileTemplate(source, { cache: false });
    expect(r.ok).toBe(false);
    const e = !r.ok ? r.errors[0] : undefined;
    expect(e).toMatchObject({ line: 2, column: 25 });
    expect(frameText(codeFrame(source, e!))).toBe(
      ["  1 | /* header */", "> 2 | #define N @( config.rig.chanels )@", `    | ${" ".repeat(24)}^^^^^^^`].join("\n"),
    );
  });

  it("has one caret for an empty span and none past the end of the line; the first line has no line before", () => {
    expect(frameText(codeFrame("@( x", { line: 1, column: 5, from: 4, to: 4 }))).toBe("> 1 | @( x\n    |     ^");
    expect(frameText(codeFrame("ab\ncd", { line: 2, column: 2, from: 4, to: 40 }))).toBe("  1 | ab\n> 2 | cd\n    |  ^");
  });

  it("pads the caret with the line's own tabs and widens the gutter for two-digit lines", () => {
    const source = Array.from({ length: 9 }, () => "x").join("\n") + "\n\t\tbad @( y )@";
    expect(frameText(codeFrame(source, { line: 10, column: 4, from: 0, to: 3 }))).toBe("   9 | x\n> 10 | \t\tbad @( y )@\n     | \t\t ^^^");
  });

  it("shows a window around the column on a very long line", () => {
    const line = "a".repeat(500) + "@( oops )@" + "b".repeat(500);
    const f = codeFrame(line, { line: 1, column: 501, from: 500, to: 510 });
    expect(f.lines[0].text.startsWith("…")).toBe(true);
    expect(f.lines[0].text.endsWith("…")).toBe(true);
    expect(f.lines[0].text.length).toBeLessThan(200);
    const caretAt = f.pad.length;
    expect(f.lines[0].text.slice(caretAt, caretAt + f.carets)).toBe("@( oops )@");
  });

  it("keeps to the source when a position is out of range", () => {
    expect(frameText(codeFrame("one", { line: 7, column: 99 }))).toBe("> 1 | one\n    |    ^");
  });
});
