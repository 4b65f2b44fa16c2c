import { test, expect, signInAs } from "./fixtures";

test("the owner invites a builder by GitHub login, changes their role and removes them", async ({ page, browser, signIn }) => {
  await signIn("demo-owner");
  await page.goto("/workshop");
  await page.getByLabel("GitHub login or e-mail").fill("not a login!");
  await page.getByRole("button", { name: "Invite" }).click();
  await expect(page.getByText("A GitHub login has 1–39 letters")).toBeVisible();

  await page.getByLabel("GitHub login or e-mail").fill("new-hand");
  await page.getByLabel("Role", { exact: true }).selectOption("builder");
  await page.getByRole("button", { name: "Invite" }).click();
  await expect(page.getByRole("status")).toContainText("Invitation recorded");
  await expect(page.getByText("new-hand · builder · pending")).toBeVisible();

  const other = await browser.newPage();
  await signInAs(other, "new-hand");
  await other.goto("/builds");
  await expect(other.getByTestId("who")).toHaveText(/new-hand · builder/);
  await expect(other.getByRole("link", { name: "New build" })).toBeVisible();

  await page.reload();
  await page.getByLabel("Role of new-hand").selectOption("reviewer");
  await page.getByLabel("Role of new-hand").locator("..").getByRole("button", { name: "Change" }).click();
  await expect(page.getByRole("status")).toHaveText("Role changed.");
  await other.goto("/builds");
  await expect(other.getByTestId("who")).toHaveText(/reviewer/);

  await page.getByRole("button", { name: "Remove new-hand" }).click();
  await expect(page.getByRole("status")).toHaveText("Member removed.");
  const r = await other.goto("/builds");
  expect(r?.status()).toBe(403);
  await other.close();
});

test("the last owner cannot be demoted or removed", async ({ page, signIn }) => {
  await signIn("demo-owner");
  await page.goto("/workshop");
  await page.getByLabel("Role of Demo Owner").selectOption("builder");
  await page.getByLabel("Role of Demo Owner").locator("..").getByRole("button", { name: "Change" }).click();
  await expect(page.getByRole("alert")).toHaveText(/The last owner cannot be demoted/);
  await page.getByRole("button", { name: "Remove Demo Owner" }).click();
  await expect(page.getByRole("alert")).toHaveText(/The last owner cannot be removed/);
  await page.reload();
  await expect(page.getByLabel("Role of Demo Owner")).toHaveValue("owner");
});

test("a client invited by e-mail joins when they sign in", async ({ page, browser, signIn }) => {
  await signIn("demo-owner");
  await page.goto("/workshop");
  await page.getByLabel("GitHub login or e-mail").fill("late-client@example.test");
  await page.getByLabel("Role", { exact: true }).selectOption("client");
  await page.getByRole("button", { name: "Invite" }).click();
  await expect(page.getByRole("status")).toContainText("Invitation recorded");
  const other = await browser.newPage();
  await signInAs(other, "late-client"); // the fake gives login@example.test as the verified e-mail
  await other.goto("/account");
  await expect(other.getByTestId("who")).toHaveText(/client/);
  await other.goto("/builds");
  await expect(other).toHaveURL(/\/handoff$/);
  await expect(other.getByText("There is no build for you yet.")).toBeVisible();
  await other.close();
});
