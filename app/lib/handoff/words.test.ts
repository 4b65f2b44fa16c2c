import { describe, expect, it } from "vitest";
import { BUILD_STATUSES } from "../db/types";
import { sizeInWords, stageInWords } from "./words";

describe("stageInWords", () => {
  it("has words for every status, none naming the workshop's own steps", () => {
    for (const s of BUILD_STATUSES) {
      const w = stageInWords(s, false);
      expect(w.label.length).toBeGreaterThan(2);
      expect(w.detail).not.toMatch(/revision|template|review request/i);
    }
  });
  it("says ready once a release exists, even while a change is under way", () => {
    expect(stageInWords("released", true).label).toBe("Ready");
    const w = stageInWords("configuring", true);
    expect(w.label).toBe("Ready");
    expect(w.detail).toMatch(/working on a change \(being set up\)/);
  });
  it("says where an unreleased build is", () => {
    expect(stageInWords("in-review", false).label).toBe("Being checked");
  });
});

describe("sizeInWords", () => {
  // Decimal units as SI defines them (1 kB = 1000 bytes), the way card sizes are sold.
  it("uses decimal units and keeps the exact count", () => {
    expect(sizeInWords(999)).toBe("999 bytes");
    expect(sizeInWords(1500)).toBe("1.5 kB (1,500 bytes)");
    expect(sizeInWords(2_345_678)).toBe("2.3 MB (2,345,678 bytes)");
    expect(sizeInWords(123_456_789)).toBe("123 MB (123,456,789 bytes)");
  });
});
