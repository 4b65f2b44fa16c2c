// What a person sees when a page cannot be shown: inside the app's frame, the status, what went
// wrong in words, what to do about it (404, 403 and the rest each differently), and a way back
// that works from the keyboard. And a rig edit the validator refuses, shown at its field.
import { test, expect, buildIdByName } from "./fixtures";

const NO_SUCH_ID = "00000000-0000-4000-8000-000000000000";

test("a missing template or build says so, suggests what to do and leads back, from the keyboard", async ({ page, signIn }) => {
  await signIn("demo-builder");
  const r = await page.goto(`/templates/${NO_SUCH_ID}`);
  expect(r?.status()).toBe(404);
  const error = page.getByTestId("error-page");
  await expect(error.getByRole("heading", { name: "Not found" })).toBeFocused();
  await expect(error.getByTestId("error-message")).toHaveText("No template with this id in your workshop.");
  await expect(error.getByTestId("error-advice")).toContainText("Go back to the list");
  await expect(page).toHaveTitle("Not found · Hiltbench");
  // The app's frame is still there: the boundary is the template page's, not the root's.
  await expect(page.getByRole("link", { name: "Templates" }).first()).toBeVisible();
  await page.keyboard.press("Tab");
  await expect(error.getByRole("link", { name: "Back to templates" })).toBeFocused();
  await page.keyboard.press("Enter");
  await expect(page).toHaveURL(/\/templates$/);
  await expect(page.getByRole("heading", { name: "Templates", level: 1 })).toBeVisible();

  expect((await page.goto(`/builds/${NO_SUCH_ID}/checks`))?.status()).toBe(404);
  await expect(page.getByTestId("error-message")).toHaveText("No build with this id in your workshop.");
  await expect(page.getByTestId("error-page").getByRole("link")).toHaveText(["Back to builds"]);
  await expect(page).toHaveTitle("Not found · Hiltbench");
});

test("a page the role does not allow says whom to ask", async ({ page, signIn }) => {
  await signIn("client-one");
  expect((await page.goto("/templates"))?.status()).toBe(403);
  const error = page.getByTestId("error-page");
  await expect(error.getByRole("heading", { name: "Not allowed" })).toBeVisible();
  await expect(error.getByTestId("error-message")).toHaveText("Your role (client) does not allow this.");
  await expect(error.getByTestId("error-advice")).toContainText("Ask the workshop's owner");
  await expect(error.getByRole("link", { name: "Back to builds" })).toBeVisible();
});

test("a rig edit that gives the config a new error is refused at its field and stores nothing", async ({ page, signIn, sql }) => {
  const id = await buildIdByName(sql, "Kestrel");
  const before = (await sql.query("SELECT config, config_version FROM builds WHERE id = $1", [id])).rows[0];
  await signIn("demo-builder");
  await page.goto(`/builds/${id}/rig`);
  await page.locator('input[name="channels.0.pin"]').fill("99");
  await page.getByRole("button", { name: "Save rig" }).click();
  // The save validates the new config and the stored one with the effect engine (decision 003): allow for a busy machine.
  await expect(page.getByRole("alert")).toContainText("nothing was saved", { timeout: 30_000 });
  await expect(page.getByText(/is on pin 99/)).toBeVisible();
  const after = (await sql.query("SELECT config, config_version FROM builds WHERE id = $1", [id])).rows[0];
  expect(after).toEqual(before);
});
