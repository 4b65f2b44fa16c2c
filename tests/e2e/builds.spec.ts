import { test, expect, buildIdByName } from "./fixtures";

test("a builder creates a build, edits it and its rig, and archives it", async ({ page, signIn }) => {
  await signIn("demo-builder");
  await page.goto("/builds");
  await page.getByRole("link", { name: "New build" }).click();
  await page.getByRole("button", { name: "Create build" }).click();
  await expect(page.getByText("Give the build a name.")).toBeVisible();

  await page.getByLabel("Build name").fill("Peregrine");
  await page.getByLabel("Client account (for the handoff sheet)").selectOption({ label: "Client Two (client-two@example.test)" });
  await page.getByLabel("Hilt notes").fill("Two-tone grip, chamber window at the pommel end.");
  await page.getByRole("button", { name: "Create build" }).click();
  await expect(page.getByRole("heading", { name: "Peregrine" })).toBeVisible();
  await expect(page.getByText("Client Two", { exact: true }).first()).toBeVisible();

  await page.getByLabel("Status").selectOption("configuring");
  await page.getByRole("button", { name: "Save details" }).click();
  await expect(page.getByRole("status")).toHaveText("Saved.");

  await page.getByRole("link", { name: "Rig" }).click();
  const bladePixels = page.locator('input[name="channels.0.pixels"]');
  await bladePixels.fill("-5");
  await page.getByRole("button", { name: "Save rig" }).click();
  await expect(page.getByRole("alert")).toContainText("nothing was saved");
  await expect(page.getByText("must be at least 1")).toBeVisible();
  await page.reload();
  await expect(bladePixels).toHaveValue("132");

  await bladePixels.fill("144");
  await page.getByLabel("Brightness cap").fill("0.5");
  await page.getByRole("button", { name: "Save rig" }).click();
  await expect(page.getByRole("status")).toHaveText(/^Rig saved as revision \d+\.$/);
  await page.reload();
  await expect(bladePixels).toHaveValue("144");

  await page.getByRole("button", { name: "Add channel" }).click();
  await page.locator('input[name="channels.3.id"]').fill("emitter");
  await page.locator('input[name="channels.3.name"]').fill("Emitter ring");
  await page.locator('input[name="channels.3.pixels"]').fill("12");
  await page.locator('input[name="channels.3.pin"]').fill("5");
  await page.getByRole("button", { name: "Save rig" }).click();
  await expect(page.getByRole("status")).toHaveText(/^Rig saved as revision \d+\.$/);
  await expect(page.locator('input[name="channels.3.name"]')).toHaveValue("Emitter ring");

  await page.getByRole("link", { name: "Overview" }).click();
  await page.getByRole("button", { name: "Archive build" }).click();
  await expect(page.getByText("This build is hidden from the main list.")).toBeVisible();
  await page.goto("/builds");
  await expect(page.getByRole("link", { name: "Peregrine" })).toHaveCount(0);
  await page.getByLabel("Archived").check();
  await page.getByRole("button", { name: "Apply" }).click();
  await expect(page.getByRole("link", { name: "Peregrine" })).toBeVisible();
});

test("the builds table searches, filters and sorts on the server", async ({ page, signIn }) => {
  await signIn("demo-owner");
  await page.goto("/builds");
  await page.getByLabel("Search").fill("harr");
  await page.getByRole("button", { name: "Apply" }).click();
  const table = page.getByTestId("builds-table");
  await expect(table.getByRole("link", { name: "Harrier" })).toBeVisible();
  await expect(table.getByRole("link", { name: "Kestrel" })).toHaveCount(0);

  await page.goto("/builds?status=configuring");
  await expect(table.getByRole("link", { name: "Kestrel" })).toBeVisible();
  await expect(table.getByRole("link", { name: "Harrier" })).toHaveCount(0);

  await page.goto("/builds");
  await table.getByRole("link", { name: /^Build/ }).click();
  await expect(page).toHaveURL(/sort=name&dir=asc/);
  const names = await table.locator("tbody tr td:first-child").allTextContents();
  expect(names).toEqual([...names].sort((a, b) => a.localeCompare(b, undefined, { sensitivity: "base" })));
  await table.getByRole("link", { name: /^Build/ }).click();
  await expect(page).toHaveURL(/sort=name&dir=desc/);
});

test("a stale rig save is refused and the newer save is kept", async ({ browser, sql }) => {
  const { signInAs } = await import("./fixtures");
  const a = await browser.newPage();
  const b = await browser.newPage();
  await signInAs(a, "demo-owner");
  await signInAs(b, "demo-builder");
  const id = await buildIdByName(sql, "Harrier");
  await a.goto(`/builds/${id}/rig`);
  await b.goto(`/builds/${id}/rig`);
  await a.getByLabel("Wire gauge").fill("20");
  await a.getByRole("button", { name: "Save rig" }).click();
  await expect(a.getByRole("status")).toHaveText(/^Rig saved as revision \d+\.$/);
  await b.getByLabel("Wire gauge").fill("24");
  await b.getByRole("button", { name: "Save rig" }).click();
  await expect(b.getByRole("alert")).toContainText("Someone saved this build since you opened it");
  const r = await sql.query("SELECT config->'rig'->'power'->>'wireGaugeAwg' AS g FROM builds WHERE id = $1", [id]);
  expect(r.rows[0].g).toBe("20");
  await a.close();
  await b.close();
});
