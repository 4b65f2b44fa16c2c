import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { configSchema } from "../config/schema";
import { demoConfig } from "../config/demo";
import { validateConfig } from "../checks/validate";
import { badTextReason, findBadFormField, findBadText, int4From, INT4_MAX, isInt4 } from "./edges";

describe("text PostgreSQL cannot store", () => {
  it("finds NUL characters and lone surrogates, and nothing else", () => {
    expect(badTextReason("Ember & Anvil \u00e9 \ud83d\udd25")).toBeNull();
    expect(badTextReason("a\u0000b")).toMatch(/NUL/);
    expect(badTextReason("\ud800x")).toMatch(/surrogate/);
    expect(badTextReason("x\udc00")).toMatch(/surrogate/);
    expect(badTextReason("\ud83d")).toMatch(/surrogate/);
  });

  it("agrees with the engine's own well-formedness check on random text", () => {
    fc.assert(
      fc.property(fc.string({ unit: "binary" }), (s) => {
        const expected = s.includes("\u0000") || !(s as unknown as { isWellFormed(): boolean }).isWellFormed();
        expect(badTextReason(s) !== null).toBe(expected);
      }),
      { numRuns: 2000 },
    );
  });

  it("names the JSON path of the first bad string or key", () => {
    expect(findBadText({ presets: [{ name: "ok" }, { name: "x\u0000" }] })).toEqual({ path: "presets[1].name", reason: expect.stringMatching(/NUL/) });
    expect(findBadText({ looks: { "a\ud800": 1 } })?.path).toBe('looks["a\ufffd"]');
    expect(findBadText({ a: [1, true, null, "fine"] })).toBeNull();
  });

  it("names the form field (form data itself turns lone surrogates into U+FFFD, so NUL is what is left)", () => {
    const f = new FormData();
    f.set("name", "\ud800x");
    expect(f.get("name")).toBe("\ufffdx");
    f.set("clientName", "a\u0000");
    expect(findBadFormField(f.entries())?.path).toBe("clientName");
  });

  it("the config schema refuses them in every free-text field, with the path", () => {
    const c = structuredClone(demoConfig());
    c.presets[0].name = "x */ \u0000";
    c.rig.board.profile = "\ud800x";
    const r = configSchema.safeParse(c);
    expect(r.success).toBe(false);
    const paths = r.error!.issues.map((i) => i.path.join("."));
    expect(paths).toContain("presets.0.name");
    expect(paths).toContain("rig.board.profile");
    const d = validateConfig(c).diagnostics.filter((x) => x.severity === "error");
    expect(d.length).toBeGreaterThan(0);
  });
});

describe("int4", () => {
  it("keeps whole numbers inside the column's range", () => {
    expect(isInt4(INT4_MAX)).toBe(true);
    expect(isInt4(INT4_MAX + 1)).toBe(false);
    expect(isInt4(2 ** 31)).toBe(false);
    expect(isInt4(-1)).toBe(false);
    expect(isInt4(1.5)).toBe(false);
    expect(isInt4(0, 1)).toBe(false);
    expect(int4From("2147483647")).toBe(INT4_MAX);
    expect(int4From("2147483648")).toBeNull();
    expect(int4From("99999999999999999999")).toBeNull();
    expect(int4From("1e3")).toBeNull();
    expect(int4From("")).toBeNull();
    expect(int4From(" 7 ")).toBe(7);
    expect(int4From("0", 1)).toBeNull();
  });
});
