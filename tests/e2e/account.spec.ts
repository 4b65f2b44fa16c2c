import { test, expect } from "./fixtures";

test("a builder creates an API token, uses it, and revokes it", async ({ page, signIn, playwright }) => {
  await signIn("demo-builder");
  await page.goto("/account");
  await page.getByRole("button", { name: "Create token" }).click();
  await expect(page.getByText("Name the token")).toBeVisible();
  await page.getByLabel("Token name").fill("bench script");
  await page.getByRole("button", { name: "Create token" }).click();
  const token = (await page.getByTestId("new-token").textContent())!.trim();
  expect(token).toMatch(/^hbt_/);

  const api = await playwright.request.newContext({ baseURL: process.env.BASE_URL });
  const me = await api.get("/api/me", { headers: { Authorization: `Bearer ${token}` } });
  expect(me.status()).toBe(200);
  expect((await me.json()).role).toBe("builder");
  const list = await api.get("/api/builds?sort=name&dir=asc", { headers: { Authorization: `Bearer ${token}` } });
  const names = (await list.json()).builds.map((b: { name: string }) => b.name);
  expect(names).toContain("Kestrel");

  await page.reload();
  await expect(page.getByTestId("new-token")).toHaveCount(0);
  await page.getByRole("button", { name: "Revoke bench script" }).first().click();
  await expect(page.getByText("revoked").first()).toBeVisible();
  const after = await api.get("/api/me", { headers: { Authorization: `Bearer ${token}` } });
  expect(after.status()).toBe(401);
  expect((await after.json()).error).toContain("not valid");
  await api.dispose();
});
