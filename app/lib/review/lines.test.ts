import { describe, expect, it } from "vitest";
import { structuredPatch } from "diff";
import { lineAt, lineCount, lineMapper } from "./lines";

const before = ["#define A 1", "#define B 2", "#define C 3", "#define D 4", "#define E 5"].join("\n") + "\n";

describe("lineMapper", () => {
  it("keeps unchanged lines, shifted by lines added above them", () => {
    const after = ["// new header", "#define A 1", "#define B 2", "#define C 3", "#define D 4", "#define E 5"].join("\n") + "\n";
    const map = lineMapper(before, after);
    expect([1, 2, 3, 4, 5].map(map)).toEqual([2, 3, 4, 5, 6]);
  });

  it("marks a changed or removed line as outdated (null) and keeps the rest", () => {
    const after = ["#define A 1", "#define B 20", "#define D 4", "#define E 5"].join("\n") + "\n";
    const map = lineMapper(before, after);
    expect([1, 2, 3, 4, 5].map(map)).toEqual([1, null, null, 3, 4]);
  });

  it("agrees with the diff package's own hunks: every unchanged line maps onto an equal line", () => {
    const a = Array.from({ length: 200 }, (_, i) => `line ${i} ${i % 7}`).join("\n");
    const b = a
      .split("\n")
      .map((l, i) => (i % 17 === 0 ? `${l} changed` : l))
      .filter((_, i) => i % 29 !== 5)
      .join("\n");
    const map = lineMapper(a, b);
    const al = a.split("\n");
    const bl = b.split("\n");
    for (let l = 1; l <= al.length; l++) {
      const m = map(l);
      if (m !== null) expect(bl[m - 1]).toBe(al[l - 1]);
    }
    // Lines the diff package's structuredPatch reports as removed are exactly the ones that do not map.
    const removed = new Set<number>();
    for (const h of structuredPatch("a", "b", a, b, "", "", { context: 0 }).hunks) {
      let l = h.oldStart;
      for (const x of h.lines) {
        if (x.startsWith("-")) removed.add(l++);
        else if (!x.startsWith("+")) l++;
      }
    }
    for (let l = 1; l <= al.length; l++) expect(map(l) === null).toBe(removed.has(l));
  });

  it("answers null for lines outside the text", () => {
    expect(lineMapper(before, before)(0)).toBeNull();
    expect(lineMapper(before, before)(6)).toBeNull();
    expect(lineMapper(before, before)(5)).toBe(5);
  });
});

describe("lineAt / lineCount", () => {
  it("counts lines without the final newline and reads 1-based lines", () => {
    expect(lineCount(before)).toBe(5);
    expect(lineAt(before, 1)).toBe("#define A 1");
    expect(lineAt(before, 6)).toBeUndefined();
    expect(lineAt(before, 0)).toBeUndefined();
    expect(lineCount("")).toBe(0);
  });
});
