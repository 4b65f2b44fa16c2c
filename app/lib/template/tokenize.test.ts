import { describe, expect, it } from "vitest";
import { out, run } from "./test-helpers";

describe("delimiters and text", () => {
  it("leaves C nested initializers and braces untouched", () => {
    const src = "static const int m[2][2] = {{1, 2}, {3, 4}};\nint a = b[0]; /* {{ x }} {% y %} */\n";
    expect(out(src)).toBe(src);
  });

  it("prints values and keeps '@' that is not a delimiter", () => {
    expect(out("mail: shop@example.test @( 1 + 2 )@")).toBe("mail: shop@example.test 3");
  });

  it("drops comments", () => {
    expect(out("a@# a comment with )@ and ]@ inside #@b")).toBe("ab");
  });

  it("keeps verbatim blocks as they are", () => {
    expect(out("@[ verbatim ]@@( not evaluated )@ @[ when ]@@[ /verbatim ]@")).toBe("@( not evaluated )@ @[ when ]@");
  });
});

describe("whitespace control", () => {
  it("removes lines that hold only statement tags", () => {
    const src = "start\n@[ over config.rig.channels as ch ]@\n  - @( ch.id )@\n@[ /over ]@\nend\n";
    expect(out(src)).toBe("start\n  - blade\n  - chamber\n  - crystal\nend\n");
  });

  it("removes consecutive tag-only lines and comment lines", () => {
    expect(out("a\n  @[ when true ]@\n  @# note #@\n    @[ when true ]@\nb\n@[ /when ]@\n@[ /when ]@\nc")).toBe("a\nb\nc");
  });

  it("keeps a tag line that also prints something", () => {
    expect(out("x\n@[ when true ]@y@[ /when ]@\nz")).toBe("x\ny\nz");
  });

  it("trims next to '~'", () => {
    expect(out("a   \n  @(~ 1 ~)@  \n  b")).toBe("a1b");
    expect(out("[ @[~ when true ~]@ x @[~ /when ~]@ ]")).toBe("[x]");
  });
});

describe("tokenize errors", () => {
  it("points an unclosed output tag at its opening", () => {
    const r = run("line one\n  @( config.format ");
    expect(r.errors[0]).toMatchObject({ stage: "tokenize", line: 2, column: 3, from: 11, to: 13 });
    expect(r.errors[0].message).toMatch(/never closed with '\)@'/);
  });

  it("points an unclosed comment and string at their start", () => {
    expect(run("ab @# never").errors[0]).toMatchObject({ stage: "tokenize", line: 1, column: 4 });
    expect(run('@( "open )@').errors[0]).toMatchObject({ stage: "tokenize", column: 4, message: expect.stringMatching(/string is never closed/) });
  });

  it("rejects a tag that opens inside another", () => {
    expect(run("@( config @( x )@").errors[0].message).toMatch(/new tag starts before/);
  });

  it("reports binary garbage inside a tag with its position", () => {
    const r = run("ok @( \u0000\u0001\uFFFD )@");
    expect(r.errors[0]).toMatchObject({ stage: "tokenize", line: 1, column: 7 });
    expect(r.errors[0].message).toMatch(/unexpected character '\\u\{0\}'/);
  });

  it("passes binary garbage outside tags through as text", () => {
    const garbage = String.fromCharCode(...Array.from({ length: 256 }, (_, i) => (i === 64 ? 65 : i)));
    expect(out(garbage)).toBe(garbage);
  });

  it("refuses a 5 MB template before tokenizing", () => {
    const big = "x".repeat(5 * 1024 * 1024);
    const r = run(big);
    expect(r.errors[0]).toMatchObject({ stage: "tokenize", line: 1, column: 1 });
    expect(r.errors[0].message).toMatch(/over the limit of 262144/);
  });

  it("accepts only strings", () => {
    const r = run(42 as unknown as string);
    expect(r.errors[0]).toMatchObject({ stage: "tokenize", message: "a template must be a string" });
  });
});
