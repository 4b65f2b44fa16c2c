import { blend } from "culori";
import { describe, expect, it } from "vitest";
import { BLEND_MODES } from "~/lib/config/schema";
import { compositeOver, compositeSpan, createPlanes, overPremultiplied, type BlendMode } from "./composite";

const RED = [1, 0, 0] as const;
const BLUE = [0, 0, 1] as const;

function close3(actual: readonly number[], expected: readonly number[], digits = 4) {
  actual.forEach((v, i) => expect(v).toBeCloseTo(expected[i], digits));
}

describe("Porter & Duff over", () => {
  it("red α0.5 over opaque blue", () => {
    // Porter & Duff 1984 / W3C Compositing §9.1.4, worked example in references.md: (0.5, 0, 0.5), α 1.
    const o = compositeOver(RED, 0.5, BLUE, 1);
    close3(o.rgb, [0.5, 0, 0.5]);
    expect(o.alpha).toBe(1);
  });

  it("red α0.5 over blue α0.5", () => {
    // Porter & Duff 1984, straight alpha: αo = αs + αb(1 − αs) = 0.75; Co = (0.6667, 0, 0.3333) (references.md).
    const o = compositeOver(RED, 0.5, BLUE, 0.5);
    expect(o.alpha).toBeCloseTo(0.75, 10);
    close3(o.rgb, [0.6667, 0, 0.3333]);
  });

  it("white α0.25 over opaque (0.2, 0.4, 0.6)", () => {
    // Porter & Duff 1984 worked example in references.md: (0.4, 0.55, 0.7).
    close3(compositeOver([1, 1, 1], 0.25, [0.2, 0.4, 0.6], 1).rgb, [0.4, 0.55, 0.7]);
  });

  it("premultiplied form gives the same result", () => {
    // Porter & Duff 1984, premultiplied: co = cs + cb(1 − αs).
    const o = overPremultiplied([0.5, 0, 0], 0.5, [0, 0, 0.5], 0.5);
    expect(o.alpha).toBeCloseTo(0.75, 10);
    close3(o.rgb.map((c) => c / o.alpha), [0.6667, 0, 0.3333]);
  });
});

// Oracle: culori's blend() (W3C Compositing formula), run in culori's "lrgb" space because Hiltbench
// blends linear light (decision 002). culori has no "add"; it accepts the blend function instead.
const culoriMode = (mode: BlendMode) => (mode === "add" ? (b: number, s: number) => Math.min(1, b + s) : mode);

describe("blend modes against culori", () => {
  const samples: [number, number, number][] = [
    [0.9, 0.2, 0.05],
    [0.1, 0.6, 0.95],
    [0.5, 0.5, 0.5],
    [0, 1, 0.3],
  ];
  for (const mode of BLEND_MODES) {
    it(mode, () => {
      for (const s of samples) {
        for (const b of samples) {
          for (const [as, ab] of [[1, 1], [0.5, 1], [0.3, 0.6], [0.8, 0.25]]) {
            const ours = compositeOver(s, as, b, ab, mode);
            const theirs = blend(
              [
                { mode: "lrgb", r: b[0], g: b[1], b: b[2], alpha: ab },
                { mode: "lrgb", r: s[0], g: s[1], b: s[2], alpha: as },
              ],
              culoriMode(mode) as "normal",
              "lrgb",
            );
            expect(ours.alpha).toBeCloseTo(theirs.alpha!, 9);
            close3(ours.rgb, [theirs.r, theirs.g, theirs.b], 9);
          }
        }
      }
    });
  }
});

describe("compositeSpan", () => {
  it("equals compositeOver on an opaque backdrop for every mode, only inside the span", () => {
    for (const mode of BLEND_MODES) {
      const dst = createPlanes(4);
      const src = createPlanes(4);
      const alpha = new Float32Array([0.4, 0.7, 1, 0.9]);
      for (let i = 0; i < 4; i++) {
        dst.r[i] = 0.2 * i; dst.g[i] = 0.5; dst.b[i] = 0.9 - 0.2 * i;
        src.r[i] = 0.8; src.g[i] = 0.1 * i; src.b[i] = 0.6;
      }
      const before = [dst.r[3], dst.g[3], dst.b[3]];
      const expected = [0, 1, 2].map((i) => compositeOver([src.r[i], src.g[i], src.b[i]], alpha[i], [dst.r[i], dst.g[i], dst.b[i]], 1, mode).rgb);
      compositeSpan(dst, src, alpha, mode, 0, 3);
      for (let i = 0; i < 3; i++) close3([dst.r[i], dst.g[i], dst.b[i]], expected[i], 6);
      close3([dst.r[3], dst.g[3], dst.b[3]], before, 6);
    }
  });

  it("skips NaN coverage rather than spreading it", () => {
    const dst = createPlanes(1);
    const src = createPlanes(1);
    dst.r[0] = 0.5;
    src.r[0] = 1;
    compositeSpan(dst, src, new Float32Array([NaN]), "normal", 0, 1);
    expect(dst.r[0]).toBe(0.5);
  });
});
