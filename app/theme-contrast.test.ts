// The theme's text colours against the backgrounds they are drawn on, computed with the WCAG 2.x
// contrast ratio (W3C, "Web Content Accessibility Guidelines 2.1", definitions "contrast ratio"
// and "relative luminance"; success criterion 1.4.3 asks 4.5:1 for normal text at level AA) as
// implemented by culori's wcagContrast. Values are read from app/app.css itself, so changing a
// token re-runs the check. Decision 016 records the ratios.
import { readFileSync } from "node:fs";
import { wcagContrast } from "culori";
import { describe, expect, it } from "vitest";
import { CODE_BACKGROUNDS, CODE_COLOURS } from "./components/templates/codeTheme";

const css = readFileSync(new URL("./app.css", import.meta.url), "utf8");
const themeBlock = css.slice(css.indexOf("@theme"), css.indexOf("}", css.indexOf("@theme")));
const tokens = Object.fromEntries([...themeBlock.matchAll(/--color-([\w-]+):\s*(#[0-9a-f]{3,8})/gi)].map((m) => [m[1], m[2]]));
const colour = (name: string) => {
  if (name === "white") return "#ffffff";
  const hex = tokens[name];
  if (!hex) throw new Error(`no --color-${name} in app.css @theme`);
  return hex;
};

const AA = 4.5;
const SURFACES = ["soot-950", "soot-900", "soot-800"];

/** [text, background, what it is]: the pairs the pages draw. */
const PAIRS: [string, string, string][] = [
  ["white", "ember-600", "primary button"],
  ["white", "ember-700", "primary button, hovered"],
  ...["iron-100", "iron-300", "iron-400", "brass-300", "ember-400", "signal-error", "signal-warning", "signal-info", "signal-ok"].flatMap((fg) =>
    SURFACES.map((bg): [string, string, string] => [fg, bg, "text on a surface"]),
  ),
  ["iron-100", "soot-700", "active navigation link"],
  ["brass-300", "soot-700", "held preview button"],
  ...Object.entries(CODE_COLOURS).flatMap(([role, fg]) =>
    Object.entries(CODE_BACKGROUNDS).map(([where, bg]): [string, string, string] => [fg, bg, `code view: ${role} on ${where}`]),
  ),
];

describe("theme contrast (WCAG 2.x AA, 1.4.3)", () => {
  it.each(PAIRS)("%s on %s (%s) is at least 4.5:1", (fg, bg) => {
    expect(wcagContrast(colour(fg), colour(bg))).toBeGreaterThanOrEqual(AA);
  });

  it("the primary button's ember keeps the ratios decision 016 records", () => {
    expect(wcagContrast("#ffffff", colour("ember-600"))).toBeCloseTo(4.84, 2);
    expect(wcagContrast("#ffffff", colour("ember-700"))).toBeCloseTo(5.91, 2);
    // The value it replaced, as axe-core measured it on the pages: 4.29:1.
    expect(wcagContrast("#ffffff", "#d9481c")).toBeCloseTo(4.29, 2);
  });

  it("culori's ratio is the WCAG 2.x formula, (L1 + 0.05) / (L2 + 0.05) over sRGB relative luminance", () => {
    const channel = (c: number) => (c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4);
    const luminance = (hex: string) => {
      const [r, g, b] = [1, 3, 5].map((i) => channel(parseInt(hex.slice(i, i + 2), 16) / 255));
      return 0.2126 * r + 0.7152 * g + 0.0722 * b;
    };
    const ratio = (a: string, b: string) => {
      const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x);
      return (hi + 0.05) / (lo + 0.05);
    };
    for (const [fg, bg] of PAIRS) expect(wcagContrast(colour(fg), colour(bg))).toBeCloseTo(ratio(colour(fg), colour(bg)), 6);
  });
});
