import { describe, expect, it } from "vitest";
import { capErrors, cappedNote, errorKind, MAX_LISTED } from "./error-list";

describe("capped error lists", () => {
  it("keeps the first 50, the total and the kinds with counts", () => {
    const errors = Array.from({ length: 19872 }, (_, i) => ({ message: i % 3 === 0 ? `unknown field 'f${i}' on config` : i % 3 === 1 ? `unknown filter 'g${i}'` : `no template named "t${i}" is available to use` }));
    const c = capErrors(errors);
    expect(c.errors).toHaveLength(MAX_LISTED);
    expect(c.errors[0]).toBe(errors[0]);
    expect(c.total).toBe(19872);
    expect(c.kinds).toEqual([
      { kind: "unknown field '…' on config", count: 6624 },
      { kind: "unknown filter '…'", count: 6624 },
      { kind: 'no template named "…" is available to use', count: 6624 },
    ]);
    expect(JSON.stringify(c).length).toBeLessThan(10_000);
    expect(cappedNote(c)).toMatch(/^The first 50 of 19,872 errors are listed; they are of 3 kinds/);
    expect(cappedNote(capErrors(errors.slice(0, 3)))).toBe("");
  });

  it("counts an error inside a used template with its kind", () => {
    expect(errorKind('in template "shared" at 2:14: unknown field \'bord\' on rig')).toBe("unknown field '…' on rig");
  });
});
