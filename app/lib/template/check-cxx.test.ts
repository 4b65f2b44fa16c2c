import { describe, expect, it } from "vitest";
import { builtinSource } from "./builtins";
import { compileTemplate } from "./compile";

const warnings = (src: string) => {
  const c = compileTemplate(src, { cache: false });
  if (!c.ok) throw new Error(c.errors.map((e) => e.message).join("\n"));
  return c.warnings.map((w) => ({ at: `${w.line}:${w.column}`, message: w.message }));
};
const STRUCT = "typedef struct { int a; const char *b, *c; double d[4]; } t_t;\n";

describe("target c: constructs only C accepts (C++ portability)", () => {
  it("flags array-index designators in initializers, literal or printed, and nothing in declarations or code", () => {
    const w = warnings(
      "@[ target c ]@\n" +
        STRUCT +
        "static const t_t tab[3] = {\n" +
        "@[ over config.presets as p, n ]@\n" +
        "  [@( n.index )@] = { .a = 1 },\n" +
        "@[ /over ]@\n" +
        "  [7] = { .a = 2 },\n" +
        "};\n" +
        "static int x[4] = { 1, 2 };\n" +
        "static void f(void) { x[0] = x[1] == 2; }\n",
    );
    expect(w.map((x) => x.at)).toEqual(["5:3", "7:3"]);
    expect(w[0].message).toMatch(/^an array-index designator \('\[n\] = …'\) is C only: C\+\+ refuses it/);
  });

  it("flags field designators out of the order the template's own struct declares", () => {
    const w = warnings("@[ target c ]@\n" + STRUCT + "static const t_t one = { .a = 1, .c = \"x\", .b = \"y\" };\nstatic const t_t ok = { .a = 1, .b = 0, .d = { 1.0 } };\n");
    expect(w).toEqual([{ at: "3:44", message: "'.b' is designated after '.c' but t_t declares it before: C++ needs field designators in declaration order" }]);
  });

  it("compares fields along each path: alternatives in a 'when' are not out of order, a wrong order inside one is", () => {
    const alternatives =
      "@[ target c ]@\n" + STRUCT + "static const t_t t[2] = {\n@[ over config.presets as p ]@\n  { .a = 1@[~ when p.name == \"x\" ~]@, .c = 0@[~ otherwise ~]@, .b = 0@[~ /when ~]@, .d = { 0 } },\n@[ /over ]@\n};\n";
    expect(warnings(alternatives)).toEqual([]);
    const wrong = alternatives.replace(", .c = 0@[~ otherwise", ", .c = 0, .b = 0@[~ otherwise");
    expect(warnings(wrong).map((x) => x.message)).toEqual(["'.b' is designated after '.c' but t_t declares it before: C++ needs field designators in declaration order"]);
  });

  it("follows pieces where they are used", () => {
    const src = "@[ target c ]@\n@[ piece tail() ]@.d = { 0 }, .b = 0@[ /piece ]@\n" + STRUCT + "static const t_t one = { .a = 1, @[ use tail() ]@ };\n";
    expect(warnings(src).map((x) => x.message)).toEqual(["'.b' is designated after '.d' but t_t declares it before: C++ needs field designators in declaration order"]);
  });

  it("says nothing where it cannot know (a struct the template does not declare) or in text templates", () => {
    expect(warnings("@[ target c ]@\n#include \"types.h\"\nstatic const their_t x = { .z = 1, .a = 2 };\n")).toEqual([]);
    expect(warnings(STRUCT + "static const t_t one = { .b = 0, .a = 1 };\nint v[2] = { [1] = 3 };\n")).toEqual([]);
  });

  it("finds what g++ refused in generic-header v1 (array designators, spark and hold layers), and nothing in v2", () => {
    const v1 = warnings(builtinSource("generic-header", 1)!);
    expect(v1.filter((w) => w.message.startsWith("an array-index designator"))).toHaveLength(9);
    expect(v1.filter((w) => w.message.includes("declaration order")).map((w) => w.message)).toEqual([
      "'.color' is designated after '.event' but hb_layer_t declares it before: C++ needs field designators in declaration order",
      "'.color' is designated after '.event' but hb_layer_t declares it before: C++ needs field designators in declaration order",
    ]);
    expect(warnings(builtinSource("generic-header", 2)!)).toEqual([]);
  });
});
