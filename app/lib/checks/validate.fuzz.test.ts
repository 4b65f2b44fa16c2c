// Diagnostics are data, never thrown: whatever arrives, the validator answers with a list.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { demoConfig } from "../config/demo";
import { RULES } from "./rules/codes";
import { validateConfig } from "./validate";

type Json = Record<string | number, unknown>;

function leafPaths(v: unknown, at: (string | number)[] = [], out: (string | number)[][] = []): (string | number)[][] {
  if (v !== null && typeof v === "object") {
    out.push(at);
    for (const [k, x] of Object.entries(v)) leafPaths(x, [...at, Array.isArray(v) ? Number(k) : k], out);
  } else out.push(at);
  return out;
}

const PATHS = leafPaths(demoConfig()).filter((p) => p.length > 0);

function setAt(root: Json, path: (string | number)[], value: unknown): void {
  let o = root as Json;
  for (const k of path.slice(0, -1)) o = o[k] as Json;
  o[path[path.length - 1]] = value;
}

const wellFormed = (d: { severity: string; code: string; path: string; message: string; hint: string }) =>
  ["error", "warning", "info"].includes(d.severity) && d.code in RULES && typeof d.path === "string" && d.message.length > 0 && d.hint.length > 0;

describe("validator robustness", () => {
  it("answers any JSON-like value without throwing", () => {
    fc.assert(
      fc.property(fc.anything(), (input) => {
        const { diagnostics } = validateConfig(input);
        expect(diagnostics.length).toBeGreaterThan(0);
        expect(diagnostics.every(wellFormed)).toBe(true);
      }),
      { numRuns: 200 },
    );
  });

  it("answers the demo with any one value replaced, including NaN, ids and numbers that pass the schema", () => {
    const value = fc.oneof(
      fc.constantFrom(NaN, Infinity, -1, 0, 1, 2, 7, 132, 4096, 1e9, "", "blade", "chamber", "crystal", "activation", "#ffffff", null, true, [], {}),
      fc.double(),
      fc.integer({ min: -5, max: 300 }),
      fc.string({ maxLength: 8 }),
    );
    fc.assert(
      fc.property(fc.constantFrom(...PATHS), value, (path, v) => {
        const c = demoConfig() as unknown as Json;
        setAt(c, path, v);
        const { diagnostics, power } = validateConfig(c);
        expect(diagnostics.every(wellFormed)).toBe(true);
        if (power) expect(power.presets.every((p) => Number.isFinite(p.peakAmps) && p.peakAmps >= 0)).toBe(true);
      }),
      { numRuns: 600 },
    );
  });
});
