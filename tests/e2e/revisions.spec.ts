// Revisions as a person meets them: a save with a "what changed" message shows up in the
// revisions table; two revisions compared (the model diff in words, the text diff, the patch
// from the API); an old revision restored; two people saving the looks at once.
import { execFileSync } from "node:child_process";
import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import type { Page } from "@playwright/test";
import type pg from "pg";
import { demoConfig } from "../../app/lib/config/demo";
import { test, expect, signInAs, tokenFor, BASE_URL } from "./fixtures";

// Several pages, two browsers and renders per test: room for a busy machine.
test.describe.configure({ timeout: 120_000 });

/** A build of our own with revision 1, so other specs' edits of Kestrel do not meet ours. */
async function newBuild(sql: pg.Pool, name: string): Promise<string> {
  const ws = (await sql.query("SELECT workshop_id FROM builds WHERE name = 'Kestrel' LIMIT 1")).rows[0].workshop_id;
  const cfg = JSON.stringify(demoConfig());
  const b = (await sql.query("INSERT INTO builds (workshop_id, name, status, config) VALUES ($1, $2, 'configuring', $3) RETURNING id, config_saved_at", [ws, name, cfg])).rows[0];
  await sql.query("INSERT INTO config_revisions (build_id, workshop_id, number, config, created_at) VALUES ($1, $2, 1, $3, $4)", [b.id, ws, cfg, b.config_saved_at]);
  return b.id;
}

async function saveRig(page: Page, id: string, pixels: string, message: string) {
  await page.goto(`/builds/${id}/rig`);
  await page.getByRole("group", { name: "Channel 1" }).getByLabel("Pixels").fill(pixels);
  await page.getByLabel("What changed").fill(message);
  await page.getByRole("button", { name: "Save rig" }).click();
  await expect(page.getByRole("status")).toContainText("Rig saved as revision");
}

test("a save with a message shows in the revisions table; two revisions compared; an old one restored", async ({ page, signIn, sql }) => {
  const id = await newBuild(sql, `Peregrine ${Date.now()}`);
  await signIn("demo-builder");
  await saveRig(page, id, "128", "Shorter blade for the client's arm length");

  await page.getByRole("navigation", { name: "Build sections" }).getByRole("link", { name: "Revisions" }).click();
  const table = page.getByTestId("revisions-table");
  const two = table.locator("tr[data-revision='2']");
  await expect(two).toContainText("Shorter blade for the client's arm length");
  await expect(two).toContainText("Demo Builder");
  await expect(two).toContainText("current");
  await expect(two.getByRole("cell").nth(4)).toHaveText("—"); // review state: none yet

  // Compare 1 → 2: the model diff in words and the rendered text diff with the changed word.
  await two.getByRole("link", { name: "Changes in revision 2" }).click();
  await expect(page).toHaveURL(/compare\?from=1&to=2/);
  await expect(page.getByTestId("model-diff")).toHaveText(["~Channel Main blade: pixels 132 → 128"].map((t) => new RegExp(t.slice(1))));
  const unified = page.getByTestId("text-diff-unified");
  await expect(unified.locator("tr[data-kind='added']").first()).toBeVisible();
  await expect(unified.locator("[data-changed-word]").filter({ hasText: "128" }).first()).toBeVisible();
  await page.getByRole("link", { name: "Side by side" }).click();
  await expect(page.getByTestId("text-diff-side")).toBeVisible();

  // The API's patch turns revision 1's render into revision 2's (reference: the patch program).
  const token = await tokenFor(sql, "demo-builder", `rev-${Date.now()}`);
  const headers = { Authorization: `Bearer ${token}` };
  const r1 = await (await fetch(`${BASE_URL}/api/builds/${id}/revisions/1`, { headers })).json();
  expect(r1.number).toBe(1);
  const patchText = await (await fetch(`${BASE_URL}/api/builds/${id}/diff?from=1&to=2`, { headers: { ...headers, Accept: "text/x-diff" } })).text();
  const json = await (await fetch(`${BASE_URL}/api/builds/${id}/diff?from=1&to=2`, { headers })).json();
  expect(json.model.map((c: { text: string }) => c.text)).toEqual(["Channel Main blade: pixels 132 → 128"]);
  // `curl | patch`: the patch turns revision 1's render into revision 2's (reference: GNU patch).
  const dir = mkdtempSync(path.join(tmpdir(), "hb-rev-"));
  const file = path.join(dir, "peregrine.h");
  const render = async (n: number) => (await fetch(`${BASE_URL}/api/builds/${id}/render?revision=${n}`, { headers })).text();
  const [one, twoText] = [await render(1), await render(2)];
  expect(one).toContain("revision: 1");
  expect(await render(1)).toBe(one); // the same revision renders to the same bytes
  writeFileSync(file, one);
  execFileSync("patch", ["--quiet", file], { input: patchText });
  expect(readFileSync(file, "utf8")).toBe(twoText);
  // Backwards: from after to answers the reverse diff.
  const back = await (await fetch(`${BASE_URL}/api/builds/${id}/diff?from=2&to=1`, { headers })).json();
  expect(back.reversed).toBe(true);
  expect(back.model.map((c: { text: string }) => c.text)).toEqual(["Channel Main blade: pixels 128 → 132"]);
  // Bad input: a missing or non-numeric number, a revision that does not exist.
  expect((await fetch(`${BASE_URL}/api/builds/${id}/diff?from=1`, { headers })).status).toBe(400);
  const nonNumeric = await fetch(`${BASE_URL}/api/builds/${id}/diff?from=abc&to=2`, { headers });
  expect(nonNumeric.status).toBe(400);
  expect((await nonNumeric.json()).error).toMatch(/revision number of this build/);
  expect((await fetch(`${BASE_URL}/api/builds/${id}/diff?from=1&to=99`, { headers })).status).toBe(404);

  // Restore revision 1: a new revision 3 with revision 1's content.
  await page.goto(`/builds/${id}/revisions`);
  await page.getByRole("button", { name: "Restore revision 1" }).click();
  await expect(page.getByTestId("restore-message")).toContainText("Revision 1 restored as revision 3");
  await expect(table.locator("tr[data-revision='3']")).toContainText("Restored revision 1");
  const stored = (await sql.query("SELECT config FROM builds WHERE id = $1", [id])).rows[0].config;
  expect(stored.rig.channels[0].pixels).toBe(132);
  expect((await sql.query("SELECT count(*)::int AS n FROM config_revisions WHERE build_id = $1", [id])).rows[0].n).toBe(3);
});

async function openLooks(page: Page, id: string) {
  await page.goto(`/builds/${id}/looks`);
  await expect(page.getByTestId("check-status")).toContainText(/warning|No problems|error/);
}
async function choosePreset(page: Page, presetId: string) {
  await page.locator(`[data-testid='preset'][data-preset-id='${presetId}'] button`).first().click();
}

test("two people edit different presets at once: the second puts their change on top and both are saved", async ({ browser, sql }) => {
  const id = await newBuild(sql, `Hobby ${Date.now()}`);
  const a = await (await browser.newContext({ baseURL: BASE_URL })).newPage();
  const b = await (await browser.newContext({ baseURL: BASE_URL })).newPage();
  await signInAs(a, "demo-builder");
  await signInAs(b, "demo-owner");
  await openLooks(a, id);
  await openLooks(b, id);
  await a.getByLabel("Preset name").fill("Ashfall at dusk");
  await choosePreset(b, "glasswind");
  await b.getByLabel("Preset name").fill("Glasswind bright");
  await a.getByRole("button", { name: "Save", exact: true }).click();
  await expect(a.getByTestId("save-message")).toContainText("Saved as revision 2");

  await b.getByRole("button", { name: "Save", exact: true }).click();
  const panel = b.getByTestId("conflict-panel");
  await expect(panel).toBeVisible();
  await expect(panel.getByTestId("their-changes")).toContainText("Preset Ashfall: name Ashfall → Ashfall at dusk");
  await expect(panel).toContainText("touch different things");
  await panel.getByRole("button", { name: "Put my changes on top" }).click();
  await b.getByRole("button", { name: "Save", exact: true }).click();
  await expect(b.getByTestId("save-message")).toContainText("Saved as revision 3");
  const stored = (await sql.query("SELECT config FROM builds WHERE id = $1", [id])).rows[0].config;
  expect(stored.presets.map((p: { name: string }) => p.name).slice(0, 2)).toEqual(["Ashfall at dusk", "Glasswind bright"]);
});

test("two people change the same layer's colour: the second is asked which to keep", async ({ browser, sql }) => {
  const id = await newBuild(sql, `Kite ${Date.now()}`);
  const a = await (await browser.newContext({ baseURL: BASE_URL })).newPage();
  const b = await (await browser.newContext({ baseURL: BASE_URL })).newPage();
  await signInAs(a, "demo-builder");
  await signInAs(b, "demo-owner");
  for (const [page, colour] of [[a, "#112233"], [b, "#445566"]] as const) {
    await openLooks(page, id);
    const layer = page.getByTestId("look-blade").getByTestId("layer").first();
    await layer.getByRole("button", { expanded: false }).first().click();
    await layer.getByRole("textbox", { name: "Colour", exact: true }).fill(colour);
  }
  await a.getByRole("button", { name: "Save", exact: true }).click();
  await expect(a.getByTestId("save-message")).toContainText("Saved as revision 2");
  await b.getByRole("button", { name: "Save", exact: true }).click();
  const panel = b.getByTestId("conflict-panel");
  const conflict = panel.getByTestId("conflicts").getByRole("group");
  await expect(conflict).toHaveCount(1);
  await expect(conflict).toContainText("Preset Ashfall › Main blade › layer 1 (fill): colour");
  await expect(conflict).toContainText("#445566");
  await expect(conflict).toContainText("#112233");
  await expect(panel.getByRole("button", { name: "Put my changes on top" })).toBeDisabled();
  await conflict.getByLabel(/Yours/).check();
  await panel.getByRole("button", { name: "Put my changes on top" }).click();
  await b.getByRole("button", { name: "Save", exact: true }).click();
  await expect(b.getByTestId("save-message")).toContainText("Saved as revision 3");
  const stored = (await sql.query("SELECT config FROM builds WHERE id = $1", [id])).rows[0].config;
  expect(stored.presets[0].looks.blade.layers[0].color).toBe("#445566");
});
