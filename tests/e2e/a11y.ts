// The accessibility check every browser test runs (decision 016): axe-core with the WCAG 2.0 and
// 2.1 level A and AA rules, on each page a test opens with `page.goto` (once per address and
// test), on each other page of the app it navigates to (opened again at the end of the test,
// once per run), and on the page's state when the test ends. A violation fails the test with one
// block per rule: the rule, each element's selector and axe's summary of what is wrong.
import AxeBuilder from "@axe-core/playwright";
import type { Page } from "@playwright/test";
import type { Result } from "axe-core";

export const A11Y_TAGS = ["wcag2a", "wcag2aa", "wcag21a", "wcag21aa"];

/**
 * The WCAG A/AA violations axe finds in the page as it is now. Legacy mode runs axe in the page
 * alone instead of finishing in a second, blank page (that is for cross-origin frames, which the
 * app has none of); measured 2–3 times faster here. Only violations are collected.
 */
export async function a11yViolations(page: Page): Promise<Result[]> {
  const results = await new AxeBuilder({ page }).withTags(A11Y_TAGS).options({ resultTypes: ["violations"] }).setLegacyMode(true).analyze();
  return results.violations;
}

/** One block per rule: id, impact and help, then each element's selector and axe's summary of the failure. */
export function describeViolations(violations: Result[]): string {
  return violations
    .map((v) => {
      const nodes = v.nodes.map((n) => {
        const summary = (n.failureSummary ?? "").replace(/\s*\n\s*/g, " ").trim();
        return `    ${n.target.join(" ")}\n      ${summary}`;
      });
      return `  ${v.id} (${v.impact ?? "?"}): ${v.help} [${v.nodes.length} element${v.nodes.length === 1 ? "" : "s"}]\n${nodes.join("\n")}`;
    })
    .join("\n");
}

export class A11yError extends Error {
  constructor(
    readonly where: string,
    readonly violations: Result[],
  ) {
    super(`Accessibility (WCAG 2.x A/AA, axe-core) violations ${where}:\n${describeViolations(violations)}`);
    this.name = "A11yError";
  }
}

/** Throws an A11yError listing the violations, if there are any. */
export async function expectAccessible(page: Page, where = `on ${page.url()}`): Promise<void> {
  const violations = await a11yViolations(page);
  if (violations.length > 0) throw new A11yError(where, violations);
}

/** Whether the page shows an HTML document (a JSON or plain-text answer has nothing to check). */
export async function showsHtml(page: Page): Promise<boolean> {
  if (page.isClosed()) return false;
  const url = page.url();
  if (!url.startsWith("http")) return false;
  return page.evaluate(() => document.contentType === "text/html").catch(() => false);
}
