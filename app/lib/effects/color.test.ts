import { converter, formatHex as culoriHex } from "culori";
import { describe, expect, it } from "vitest";
import {
  contrastRatio,
  DECODE_BYTE,
  encodeToByteFloat,
  formatHex,
  hexToLinear,
  hslToRgb,
  hsvToRgb,
  parseHex,
  relativeLuminance,
  rgbToHsv,
  srgbDecode,
  srgbEncode,
} from "./color";

const toRgb = converter("rgb");

describe("sRGB transfer", () => {
  it("matches the IEC 61966-2-1 worked values", () => {
    // IEC 61966-2-1 transfer functions; values as listed in references.md (culori and colorjs.io agree to 6 places).
    expect(srgbDecode(0.5)).toBeCloseTo(0.214041, 6);
    expect(srgbEncode(0.5)).toBeCloseTo(0.735357, 6);
    expect(srgbDecode(128 / 255)).toBeCloseTo(0.215861, 6);
    expect(srgbEncode(0.18)).toBeCloseTo(0.461356, 6);
  });

  it("uses the linear segment below the IEC 61966-2-1 breakpoints", () => {
    // IEC 61966-2-1: c ≤ 0.04045 → c/12.92; l ≤ 0.0031308 → 12.92·l.
    expect(srgbDecode(0.04)).toBeCloseTo(0.04 / 12.92, 12);
    expect(srgbEncode(0.003)).toBeCloseTo(0.003 * 12.92, 12);
  });

  it("decode table and encode table round-trip every byte", () => {
    for (let b = 0; b < 256; b++) expect(Math.round(encodeToByteFloat(DECODE_BYTE[b]))).toBe(b);
  });

  it("encode table stays within a fifth of a byte of the formula, and clamps NaN and out-of-range", () => {
    for (let i = 0; i <= 1000; i++) {
      const l = i / 1000;
      expect(Math.abs(encodeToByteFloat(l) - srgbEncode(l) * 255)).toBeLessThan(0.2);
    }
    expect(encodeToByteFloat(NaN)).toBe(0);
    expect(encodeToByteFloat(-1)).toBe(0);
    expect(encodeToByteFloat(7)).toBeCloseTo(255, 4);
  });
});

describe("hex", () => {
  it("parses and formats", () => {
    expect(parseHex("#ff8000")).toEqual([255, 128, 0]);
    expect(parseHex("#A0b1C2")).toEqual([0xa0, 0xb1, 0xc2]);
    expect(formatHex(255, 128, 0)).toBe("#ff8000");
    expect(formatHex(-3, 300, 127.6)).toBe("#00ff80");
  });

  it("reads anything unreadable as black instead of throwing", () => {
    expect(parseHex("red")).toEqual([0, 0, 0]);
    expect(parseHex("#12345")).toEqual([0, 0, 0]);
    expect(parseHex(undefined as unknown as string)).toEqual([0, 0, 0]);
    expect(formatHex(NaN, 0, 0)).toBe("#000000");
  });

  it("agrees with culori on decoding to linear light", () => {
    // Oracle: culori's "lrgb" conversion.
    const toLrgb = converter("lrgb");
    for (const hex of ["#ff4a1c", "#7fd8ff", "#1450ff", "#010203", "#fefefe"]) {
      const c = toLrgb(hex)!;
      const [r, g, b] = hexToLinear(hex);
      expect(r).toBeCloseTo(c.r, 6);
      expect(g).toBeCloseTo(c.g, 6);
      expect(b).toBeCloseTo(c.b, 6);
    }
  });
});

describe("HSV and HSL", () => {
  it("matches the worked values in references.md", () => {
    // culori, colorjs.io and color-convert agree on these (references.md, Colour).
    expect(hsvToRgb(0, 1, 1)).toEqual([255, 0, 0]);
    hsvToRgb(210, 0.5, 0.8).forEach((v, i) => expect(v).toBeCloseTo([102, 153, 204][i], 6));
    hslToRgb(210, 0.5, 0.6).forEach((v, i) => expect(v).toBeCloseTo([102, 153, 204][i], 6));
    hslToRgb(120, 1, 0.25).forEach((v, i) => expect(v).toBeCloseTo([0, 127.5, 0][i], 6));
    const [h, s, v] = rgbToHsv(255, 128, 0);
    expect(h).toBeCloseTo(30.12, 2);
    expect(s).toBe(1);
    expect(v).toBe(1);
  });

  it("agrees with culori over a grid of hues, saturations and values", () => {
    // Oracle: culori converting { mode: "hsv" } and { mode: "hsl" } to rgb.
    for (let h = -30; h <= 390; h += 17) {
      for (const s of [0, 0.13, 0.5, 0.87, 1]) {
        for (const v of [0, 0.21, 0.5, 0.79, 1]) {
          const a = toRgb({ mode: "hsv", h, s, v })!;
          hsvToRgb(h, s, v).forEach((x, i) => expect(x / 255).toBeCloseTo([a.r, a.g, a.b][i], 9));
          const b = toRgb({ mode: "hsl", h, s, l: v })!;
          hslToRgb(h, s, v).forEach((x, i) => expect(x / 255).toBeCloseTo([b.r, b.g, b.b][i], 9));
        }
      }
    }
  });

  it("round-trips rgb → hsv → rgb against culori's hex", () => {
    // Oracle: culori formatHex of the same hsv colour.
    for (const hex of ["#ff8000", "#3a7bff", "#b3124a", "#777777"]) {
      const [r, g, b] = parseHex(hex);
      const [h, s, v] = rgbToHsv(r, g, b);
      expect(formatHex(...hsvToRgb(h, s, v))).toBe(culoriHex({ mode: "hsv", h, s, v }));
      expect(formatHex(...hsvToRgb(h, s, v))).toBe(hex);
    }
  });
});

describe("luminance", () => {
  it("matches WCAG 2.2 relative luminance and contrast", () => {
    // WCAG 2.2 relative luminance (BT.709 coefficients on IEC 61966-2-1 linear values), references.md.
    expect(relativeLuminance(128, 128, 128)).toBeCloseTo(0.215861, 6);
    // colorjs.io gives 0.212639 for red (references.md): tolerance 1e-4.
    expect(Math.abs(relativeLuminance(255, 0, 0) - 0.212639)).toBeLessThan(1e-4);
    // WCAG 2.2 contrast ratio: #777777 on white = 4.478 (references.md).
    expect(contrastRatio([0x77, 0x77, 0x77], [255, 255, 255])).toBeCloseTo(4.478, 3);
  });
});
