// The look editor from the keyboard alone: every step below is a key press (Tab to reach a
// control, Enter or Space to use it, typing, Alt+arrows, Ctrl+Z / Ctrl+S); no clicks, no focus()
// calls. The stored config shows it worked.
import type { Locator, Page } from "@playwright/test";
import type { Config } from "../../app/lib/config/schema";
import { test, expect, buildIdByName } from "./fixtures";

/** Presses Tab until `target` has the focus (it must be reachable that way), at most `max` times. */
async function tabTo(page: Page, target: Locator, max = 250) {
  for (let i = 0; i < max; i++) {
    if (await target.evaluate((el) => el === document.activeElement).catch(() => false)) return;
    await page.keyboard.press("Tab");
  }
  throw new Error(`${target} was not reached with ${max} presses of Tab`);
}

test("a builder edits looks with the keyboard alone", async ({ page, signIn, sql }) => {
  test.slow(); // a few hundred key presses
  const id = await buildIdByName(sql, "Kestrel");
  const before = (await sql.query("SELECT config FROM builds WHERE id = $1", [id])).rows[0].config as Config;
  try {
    await signIn("demo-builder");
    await page.goto(`/builds/${id}/looks`);
    const order = () => page.getByTestId("preset").evaluateAll((els) => els.map((e) => e.getAttribute("data-preset-id")));

    // Choose the second preset, then move it to the top.
    const glasswind = page.locator("#preset-glasswind");
    await tabTo(page, glasswind);
    await page.keyboard.press("Enter");
    await expect(glasswind).toHaveAttribute("aria-current", "true");
    await page.keyboard.press("Alt+ArrowUp");
    await expect.poll(order).toEqual(["glasswind", "ashfall", "tidebreak", "emberdusk", "northlight"]);
    await expect(glasswind).toBeFocused();

    // Hold lockup in the preview with Space, and let go.
    const lockup = page.getByRole("group", { name: "Events" }).getByRole("button", { name: "Lockup" });
    await tabTo(page, lockup);
    await page.keyboard.down("Space");
    await expect(lockup).toHaveAttribute("aria-pressed", "true");
    await page.keyboard.up("Space");
    await expect(lockup).toHaveAttribute("aria-pressed", "false");

    // Open the blade's first layer and type a new opacity.
    const first = page.getByTestId("look-blade").getByTestId("layer").first();
    const opener = first.getByRole("button", { name: /^\w+ layer 1:/ });
    await tabTo(page, opener);
    await page.keyboard.press("Enter");
    await expect(opener).toHaveAttribute("aria-expanded", "true");
    const opacity = first.getByRole("textbox", { name: /^Opacity/ });
    await tabTo(page, opacity);
    await page.keyboard.press("Control+a");
    await page.keyboard.type("40");
    await expect(opacity).toHaveValue("40");

    // Add a breathe layer to the chamber window: choose the kind by typing, then the button.
    const chamber = page.getByTestId("look-chamber");
    const layers = await chamber.getByTestId("layer").count();
    const kind = chamber.getByLabel("New layer");
    await tabTo(page, kind);
    await page.keyboard.type("Breathe");
    await expect(kind).toHaveValue("breathe");
    await page.keyboard.press("Tab");
    await expect(chamber.getByRole("button", { name: "Add to Chamber window" })).toBeFocused();
    await page.keyboard.press("Enter");
    await expect(chamber.getByTestId("layer")).toHaveCount(layers + 1);
    await expect(chamber.getByTestId("layer").last()).toHaveAttribute("data-kind", "breathe");

    // Undo the new layer and redo it, then save, all with the page's shortcuts.
    await page.keyboard.press("Control+z");
    await expect(chamber.getByTestId("layer")).toHaveCount(layers);
    await page.keyboard.press("Control+Shift+z");
    await expect(chamber.getByTestId("layer")).toHaveCount(layers + 1);
    await page.keyboard.press("Control+s");
    await expect(page.getByTestId("save-message")).toContainText("Saved as revision");

    const stored = (await sql.query("SELECT config FROM builds WHERE id = $1", [id])).rows[0].config as Config;
    expect(stored.presets.map((p) => p.id)).toEqual(["glasswind", "ashfall", "tidebreak", "emberdusk", "northlight"]);
    expect(stored.presets[0].looks.blade.layers[0].opacity).toBeCloseTo(0.4, 6);
    expect(stored.presets[0].looks.chamber.layers.at(-1)?.kind).toBe("breathe");
  } finally {
    await sql.query("UPDATE builds SET config = $2, config_version = config_version + 1 WHERE id = $1", [id, JSON.stringify(before)]);
  }
});
