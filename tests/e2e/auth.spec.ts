import { test, expect } from "./fixtures";

test("a builder signs in by clicking through the local GitHub page and signs out", async ({ page, pageErrors }) => {
  void pageErrors;
  await page.goto("/builds");
  await expect(page).toHaveURL(/\/login\?next=%2Fbuilds/);
  await page.getByRole("button", { name: "Sign in with GitHub" }).click();
  await expect(page.getByRole("heading", { name: "Local GitHub sign-in" })).toBeVisible();
  await page.getByRole("button", { name: "Continue as demo-builder" }).click();
  await expect(page).toHaveURL(/\/builds$/);
  await expect(page.getByTestId("who")).toHaveText(/Demo Builder · builder/);
  await expect(page.getByRole("link", { name: "Kestrel" })).toBeVisible();
  await page.getByRole("button", { name: "Sign out" }).click();
  await expect(page).toHaveURL(/\/$/);
  await page.goto("/builds");
  await expect(page).toHaveURL(/\/login/);
});

test("the owner sees every build, can create builds and manage members", async ({ page, signIn }) => {
  await signIn("demo-owner");
  await page.goto("/builds");
  await expect(page.getByTestId("who")).toHaveText(/Demo Owner · owner/);
  await expect(page.getByRole("link", { name: "Kestrel" })).toBeVisible();
  await expect(page.getByRole("link", { name: "Harrier" })).toBeVisible();
  await expect(page.getByRole("link", { name: "New build" })).toBeVisible();
  await page.getByRole("link", { name: "Workshop" }).click();
  await expect(page.getByRole("heading", { name: "Ember & Anvil Props" })).toBeVisible();
  await expect(page.getByRole("button", { name: "Invite" })).toBeVisible();
});

test("a reviewer sees builds and rigs but cannot edit them", async ({ page, signIn }) => {
  await signIn("demo-reviewer");
  await page.goto("/builds");
  await expect(page.getByTestId("who")).toHaveText(/reviewer/);
  await expect(page.getByRole("link", { name: "New build" })).toHaveCount(0);
  await page.getByRole("link", { name: "Kestrel" }).click();
  await page.getByRole("link", { name: "Rig" }).click();
  await expect(page.getByLabel("Board profile")).toBeDisabled();
  await expect(page.getByRole("button", { name: "Save rig" })).toHaveCount(0);
  await page.getByRole("link", { name: "Workshop" }).click();
  await expect(page.getByTestId("members")).toContainText("demo-owner");
  await expect(page.getByRole("button", { name: "Invite" })).toHaveCount(0);
});

test("a client sees only the builds they are the client of", async ({ page, signIn }) => {
  await signIn("client-one");
  await page.goto("/builds");
  // The workshop's table sends a client to their own list (decision 023).
  await expect(page).toHaveURL(/\/handoff$/);
  await expect(page.getByTestId("who")).toHaveText("Client One");
  await expect(page.getByRole("link", { name: "Kestrel" })).toBeVisible();
  await expect(page.getByRole("link", { name: "Harrier" })).toHaveCount(0);
  await expect(page.getByRole("link", { name: "Workshop" })).toHaveCount(0);
  const r = await page.goto("/workshop");
  expect(r?.status()).toBe(403);
});

test("someone who is not a member is told so", async ({ page, signIn }) => {
  await signIn("passer-by");
  const r = await page.goto("/builds");
  expect(r?.status()).toBe(403);
  await expect(page.getByTestId("error-message")).toContainText("not a member of any workshop");
});
