import { applyPatch } from "diff";
import { describe, expect, it } from "vitest";
import { diffVersions, MAX_EDIT_LINES, newerPartials, parseCompare, patchFileName } from "./version-diff";

const v = (version: number, source: string) => ({ version, source });

describe("template version diffs", () => {
  it("numbers old and new lines through a change, with context around it", () => {
    const before = ["a", "b", "c", "d", "e", "f", "g", "h", "i"].join("\n") + "\n";
    const after = ["a", "b", "c", "d", "E", "e2", "f", "g", "h", "i"].join("\n") + "\n";
    const d = diffVersions("shop", v(2, before), v(3, after));
    expect(d.kind).toBe("changed");
    if (d.kind !== "changed") return;
    expect([d.added, d.removed]).toEqual([2, 1]);
    expect(d.hunks).toHaveLength(1);
    expect(d.hunks[0].rows).toEqual([
      { kind: "context", oldNo: 2, newNo: 2, text: "b" },
      { kind: "context", oldNo: 3, newNo: 3, text: "c" },
      { kind: "context", oldNo: 4, newNo: 4, text: "d" },
      { kind: "removed", oldNo: 5, text: "e" },
      { kind: "added", newNo: 5, text: "E" },
      { kind: "added", newNo: 6, text: "e2" },
      { kind: "context", oldNo: 6, newNo: 7, text: "f" },
      { kind: "context", oldNo: 7, newNo: 8, text: "g" },
      { kind: "context", oldNo: 8, newNo: 9, text: "h" },
    ]);
  });

  it("writes a patch that turns the old version into the new one (checked with the diff package's applyPatch)", () => {
    const before = "#define A 1\n#define B 2\n";
    const after = "#define A 1\n#define B 3\n#define C 4";
    const d = diffVersions("shop header", v(1, before), v(4, after));
    if (d.kind !== "changed") throw new Error("expected a change");
    expect(d.patch.startsWith("--- shop header@v1\n+++ shop header@v4\n@@ -1,2 +1,3 @@\n")).toBe(true);
    expect(applyPatch(before, d.patch)).toBe(after);
    expect(d.hunks[0].rows.at(-1)).toEqual({ kind: "added", newNo: 3, text: "#define C 4", noNewline: true });
    expect(patchFileName("Shop Header!", 1, 4)).toBe("shop-header-v1-to-v4.patch");
  });

  it("says so when two versions are the same, and gives up on a wholesale rewrite", () => {
    expect(diffVersions("x", v(1, "same\n"), v(2, "same\n"))).toEqual({ kind: "same", patch: "--- x@v1\n+++ x@v2\n" });
    const lines = (p: string) => Array.from({ length: MAX_EDIT_LINES + 10 }, (_, i) => `${p}${i}`).join("\n");
    expect(diffVersions("x", v(1, lines("old")), v(2, lines("new")))).toEqual({ kind: "too-large", limit: MAX_EDIT_LINES });
  });

  it("reads 'from..to' and nothing else", () => {
    expect(parseCompare("3..5")).toEqual([3, 5]);
    expect(parseCompare("5..3")).toEqual([5, 3]);
    for (const bad of ["3", "3..", "..5", "a..b", "0..2", "3...5", "-1..2", "1.5..2", "99999999999..1"]) expect(parseCompare(bad), bad).toBeNull();
  });

  it("names the partials that moved on since a version was saved, and what it renders with", () => {
    const recorded = { blade: { id: "t1", version: 2 }, hilt: { id: "t2", version: 1 } };
    const now = { blade: { id: "t1", version: 3 }, hilt: { id: "t2", version: 1 }, trim: { id: "t3", version: 1 }, core: { id: "t9", version: 4 } };
    expect(newerPartials({ ...recorded, core: { id: "t4", version: 4 } }, now)).toEqual([
      { name: "blade", version: 3, was: 2 },
      { name: "trim", version: 1, was: null },
      { name: "core", version: 4, was: null },
    ]);
    expect(newerPartials(recorded, recorded)).toEqual([]);
  });
});
