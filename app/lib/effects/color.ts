// Colour arithmetic shared by the effect engine, the preview and the tests. Config colours are
// sRGB-encoded #rrggbb; the engine mixes light in linear values (see
// docs/decisions/002-blending-space.md), so decoding and encoding sit on the hot path and get
// lookup tables.

export type Rgb = readonly [number, number, number];

const HEX = /^#?([0-9a-fA-F]{6})$/;

/** "#rrggbb" → [r, g, b] in 0–255; anything unreadable is black so a render never throws. */
export function parseHex(hex: string): [number, number, number] {
  const m = HEX.exec(typeof hex === "string" ? hex.trim() : "");
  if (!m) return [0, 0, 0];
  const n = parseInt(m[1], 16);
  return [(n >> 16) & 255, (n >> 8) & 255, n & 255];
}

function byte(v: number): number {
  return Number.isFinite(v) ? Math.min(255, Math.max(0, Math.round(v))) : 0;
}

/** [r, g, b] in 0–255 (rounded and clamped) → "#rrggbb". */
export function formatHex(r: number, g: number, b: number): string {
  return "#" + ((1 << 24) | (byte(r) << 16) | (byte(g) << 8) | byte(b)).toString(16).slice(1);
}

/** IEC 61966-2-1 decoding: encoded value 0–1 → linear light 0–1. */
export function srgbDecode(c: number): number {
  return c <= 0.04045 ? c / 12.92 : Math.pow((c + 0.055) / 1.055, 2.4);
}

/** IEC 61966-2-1 encoding: linear light 0–1 → encoded value 0–1. */
export function srgbEncode(l: number): number {
  return l <= 0.0031308 ? 12.92 * l : 1.055 * Math.pow(l, 1 / 2.4) - 0.055;
}

/** Linear light of each 8-bit encoded value. */
export const DECODE_BYTE = new Float32Array(256);
for (let i = 0; i < 256; i++) DECODE_BYTE[i] = srgbDecode(i / 255);

// 16384 steps keep the table's error under 0.2 of a byte even in the steep dark end (slope 12.92),
// so every byte survives decode → encode unchanged; a Math.pow per colour per pixel would not
// meet the frame budget.
const ENCODE_STEPS = 16383;
const ENCODE_TABLE = new Float32Array(ENCODE_STEPS + 1);
for (let i = 0; i <= ENCODE_STEPS; i++) ENCODE_TABLE[i] = srgbEncode(i / ENCODE_STEPS) * 255;

/** Linear light 0–1 → encoded value 0–255 (unrounded); out of range and NaN clamp. */
export function encodeToByteFloat(l: number): number {
  // `l > 0` is false for NaN, so NaN lands on 0.
  const i = l > 0 ? (l >= 1 ? ENCODE_STEPS : (l * ENCODE_STEPS + 0.5) | 0) : 0;
  return ENCODE_TABLE[i];
}

/** "#rrggbb" → linear light [r, g, b] in 0–1. */
export function hexToLinear(hex: string): [number, number, number] {
  const [r, g, b] = parseHex(hex);
  return [DECODE_BYTE[r], DECODE_BYTE[g], DECODE_BYTE[b]];
}

function clamp01(v: number): number {
  return v > 0 ? (v < 1 ? v : 1) : 0;
}

function normHue(h: number): number {
  if (!Number.isFinite(h)) return 0;
  const r = h % 360;
  return r < 0 ? r + 360 : r;
}

/** HSV (hue in degrees, s and v in 0–1) → [r, g, b] as unrounded 0–255 values. */
export function hsvToRgb(h: number, s: number, v: number): [number, number, number] {
  const hh = normHue(h) / 60;
  const ss = clamp01(s);
  const vv = clamp01(v);
  const f = (n: number) => {
    const k = (n + hh) % 6;
    return vv - vv * ss * Math.max(0, Math.min(k, 4 - k, 1));
  };
  return [f(5) * 255, f(3) * 255, f(1) * 255];
}

/** HSL (hue in degrees, s and l in 0–1) → [r, g, b] as unrounded 0–255 values. */
export function hslToRgb(h: number, s: number, l: number): [number, number, number] {
  const hh = normHue(h) / 30;
  const ss = clamp01(s);
  const ll = clamp01(l);
  const a = ss * Math.min(ll, 1 - ll);
  const f = (n: number) => {
    const k = (n + hh) % 12;
    return ll - a * Math.max(-1, Math.min(k - 3, 9 - k, 1));
  };
  return [f(0) * 255, f(8) * 255, f(4) * 255];
}

/** [r, g, b] 0–255 → HSV (hue in degrees, 0 for greys; s and v in 0–1). */
export function rgbToHsv(r: number, g: number, b: number): [number, number, number] {
  const rr = r / 255, gg = g / 255, bb = b / 255;
  const max = Math.max(rr, gg, bb);
  const d = max - Math.min(rr, gg, bb);
  let h = 0;
  if (d > 0) {
    if (max === rr) h = ((gg - bb) / d) % 6;
    else if (max === gg) h = (bb - rr) / d + 2;
    else h = (rr - gg) / d + 4;
    h = normHue(h * 60);
  }
  return [h, max === 0 ? 0 : d / max, max];
}

/** WCAG 2.2 / ITU-R BT.709 relative luminance of 8-bit sRGB values, 0–1. */
export function relativeLuminance(r: number, g: number, b: number): number {
  return 0.2126 * srgbDecode(r / 255) + 0.7152 * srgbDecode(g / 255) + 0.0722 * srgbDecode(b / 255);
}

/** WCAG 2.2 contrast ratio between two colours, 1–21. */
export function contrastRatio(a: Rgb, b: Rgb): number {
  const la = relativeLuminance(a[0], a[1], a[2]);
  const lb = relativeLuminance(b[0], b[1], b[2]);
  return (Math.max(la, lb) + 0.05) / (Math.min(la, lb) + 0.05);
}
