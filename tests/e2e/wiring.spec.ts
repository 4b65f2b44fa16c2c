import { test, expect, buildIdByName, tokenFor, BASE_URL } from "./fixtures";

test("the Rig tab draws the wiring picture with its connections in words, and says when the form stops making sense", async ({ page, signIn, sql }) => {
  await signIn("demo-builder");
  const id = await buildIdByName(sql, "Kestrel");
  await page.goto(`/builds/${id}/rig`);
  test.setTimeout(120_000);
  // Drawing starts when the picture comes into view; ELK's first layout in a fresh worker is slow on a busy machine.
  await page.getByRole("heading", { name: "Wiring picture" }).scrollIntoViewIfNeeded();
  const picture = page.getByTestId("wiring-svg");
  await expect(picture.locator("svg title")).toHaveText("Wiring of Kestrel", { timeout: 60_000 });
  await page.getByText("Connections in words").click();
  const words = page.getByTestId("wiring-connections");
  await expect(words).toContainText("Cell positive to the switch: 22 AWG");
  await expect(words).toContainText("Board pin 2 to Main blade · strip 1/2 data in.");

  // The picture follows the form as it changes, before anything is saved: the blade moves to pin 5.
  await page.locator('input[name="channels.0.pin"]').fill("5");
  await expect(words).toContainText("Board pin 5 to Main blade · strip 1/2 data in.", { timeout: 60_000 });
  await expect(words).not.toContainText("Board pin 2 to Main blade");
  await expect(picture.locator("svg")).toContainText("pin 5");

  // A field that does not parse keeps the last good picture and says so.
  await page.locator('input[name="channels.0.pixels"]').fill("");
  await expect(page.getByText("fix the fields marked above to redraw it")).toBeVisible({ timeout: 30_000 });

  // Nothing was saved: the stored picture has no conflict.
  const stored = await page.request.get(`/api/builds/${id}/wiring.svg`);
  expect(stored.status()).toBe(200);
  expect(await stored.text()).not.toContain("shared-data-pin");
});

test("a script fetches the wiring picture with a token; the same rig gives the same bytes", async ({ request, sql }) => {
  const token = await tokenFor(sql, "demo-builder");
  const id = await buildIdByName(sql, "Kestrel");
  const url = `${BASE_URL}/api/builds/${id}/wiring.svg`;
  const a = await request.get(url, { headers: { Authorization: `Bearer ${token}` } });
  expect(a.status()).toBe(200);
  expect(a.headers()["content-type"]).toContain("image/svg+xml");
  const b = await request.get(url, { headers: { Authorization: `Bearer ${token}` } });
  expect(await a.text()).toBe(await b.text());
  expect(await a.text()).toMatch(/^<svg xmlns="http:\/\/www.w3.org\/2000\/svg"/);
  const anonymous = await request.get(url, { headers: { Cookie: "" } });
  expect(anonymous.status()).toBe(401);
});

test("the wiring picture prints alone on one page, with its cautions", async ({ page, signIn, sql }) => {
  test.setTimeout(120_000);
  await signIn("demo-builder");
  const id = await buildIdByName(sql, "Kestrel");
  await page.goto(`/builds/${id}/rig`);
  await page.getByRole("heading", { name: "Wiring picture" }).scrollIntoViewIfNeeded();
  await expect(page.getByTestId("wiring-svg").locator("svg title")).toHaveText("Wiring of Kestrel", { timeout: 60_000 });

  await page.emulateMedia({ media: "print" });
  // The form, the navigation and the download link are out of the printed page; the picture and the cautions are in it.
  await expect(page.getByRole("button", { name: "Save rig" })).toBeHidden();
  await expect(page.locator('input[name="board.profile"]')).toBeHidden();
  await expect(page.getByRole("link", { name: "Download SVG" })).toBeHidden();
  await expect(page.getByTestId("wiring-svg").locator("svg")).toBeVisible();
  await expect(page.getByTestId("safety-cautions")).toBeVisible();

  // The drawing takes the page's width and stays large enough to read.
  const box = await page.getByTestId("wiring-svg").locator("svg").boundingBox();
  expect(box!.height).toBeGreaterThan(250);
  // Chromium's own PDF of the page: one page (each page object is "/Type /Page", the tree "/Type /Pages").
  const pdf = (await page.pdf({ preferCSSPageSize: true, printBackground: true })).toString("latin1");
  expect(pdf.match(/\/Type\s*\/Page(?![s\w])/g)?.length).toBe(1);
  await page.emulateMedia({ media: "screen" });
});
