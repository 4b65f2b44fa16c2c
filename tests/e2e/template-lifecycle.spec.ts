// Templates over their life: comparing versions, templates used as partials (and a cycle),
// deleting one after typing its name, and the refusals (409 while something depends on it,
// 403/404 for those who may not) that leave stored data as it was.
import { readFile } from "node:fs/promises";
import type pg from "pg";
import { test, expect, buildIdByName, signInAs, BASE_URL } from "./fixtures";
import { insertTemplate, keepingBuild, replaceSource, uniq } from "./template-helpers";

const versionCount = async (sql: pg.Pool, id: string) => (await sql.query("SELECT count(*)::int AS n FROM template_versions WHERE template_id = $1", [id])).rows[0].n as number;

test("a reviewer compares two versions of a template, line by line, and downloads the patch", async ({ page, signIn, sql }) => {
  const name = `cmp-${uniq()}`;
  const id = await insertTemplate(sql, name, ["one\ntwo\nthree\n", "one\ntwo\nthree\n", "one\n2\nthree\nfour\n"]);
  await signIn("demo-reviewer");
  await page.goto(`/templates/${id}`);
  await page.getByRole("link", { name: "Compare versions" }).click();
  await expect(page).toHaveURL(new RegExp(`/templates/${id}\\?compare=2\\.\\.3`));
  const cmp = page.getByTestId("compare");
  await expect(cmp.getByRole("heading", { name: "Changes from version 2 to version 3" })).toBeVisible();
  await expect(page.getByTestId("compare-summary")).toHaveText("2 lines added, 1 line removed.");
  const rows = cmp.locator("tbody tr[data-kind]");
  await expect(rows).toHaveText([/^1\s*1\s*one$/, /^2\s*−\s*removed\s*two$/, /^2\s*\+\s*added\s*2$/, /^3\s*3\s*three$/, /^4\s*\+\s*added\s*four$/]);

  const download = page.waitForEvent("download");
  await cmp.getByRole("link", { name: "Download .patch" }).click();
  const file = await download;
  expect(file.suggestedFilename()).toBe(`${name}-v2-to-v3.patch`);
  expect(await readFile((await file.path())!, "utf8")).toBe(`--- ${name}@v2\n+++ ${name}@v3\n@@ -1,3 +1,4 @@\n one\n-two\n+2\n three\n+four\n`);

  await page.getByLabel("From version", { exact: true }).selectOption("v1");
  await page.getByLabel("To version", { exact: true }).selectOption("v2");
  await cmp.getByRole("button", { name: "Compare" }).click();
  await expect(page).toHaveURL(/compare=1\.\.2$/);
  await expect(page.getByTestId("compare-summary")).toHaveText(`No changes: version 1 and version 2 of ${name} are identical.`);
  await cmp.getByRole("link", { name: "Close comparison" }).click();
  await expect(page.getByTestId("compare")).toHaveCount(0);

  // Bad addresses get a message, not a crash.
  for (const [q, status, message] of [
    ["compare=abc", 400, "'compare' must be two version numbers like 1..2, not 'abc'."],
    ["compare=1..9", 404, "This template has no version 9; its versions are 1 to 3."],
    ["compare=0..2", 400, "'compare' must be two version numbers like 1..2"],
  ] as const) {
    const res = await page.goto(`/templates/${id}?${q}`);
    expect(res?.status()).toBe(status);
    await expect(page.getByTestId("error-message")).toContainText(message);
  }
  const builtin = await page.goto("/templates/generic-header?compare=1..1");
  expect(builtin?.status()).toBe(400);
  const patch404 = await page.request.get(`/templates/${id}/compare.patch?compare=3..4`);
  expect(patch404.status()).toBe(404);
  expect(await patch404.text()).toContain("no version 4");

  // Another workshop's template is not found, compared or not.
  const ws = (await sql.query("INSERT INTO workshops (name, slug) VALUES ('Other Bench', 'other-' || substr(md5(random()::text), 1, 8)) RETURNING id")).rows[0].id;
  const theirs = await insertTemplate(sql, name, ["a", "b"], ws);
  expect((await page.goto(`/templates/${theirs}?compare=1..2`))?.status()).toBe(404);
  expect((await page.request.get(`/templates/${theirs}/compare.patch?compare=1..2`)).status()).toBe(404);
});

test("a builder uses one template inside another, sees the latest version, and a cycle is pointed at", async ({ page, signIn, sql }) => {
  test.setTimeout(90_000);
  const a = `part-a-${uniq()}`;
  const b = `part-b-${uniq()}`;
  await signIn("demo-builder");
  const create = async (name: string, source: string) => {
    await page.goto("/templates");
    await page.getByLabel("Name").fill(name);
    await page.getByLabel("Start from a copy of").selectOption("readable-copy");
    await page.getByRole("button", { name: "Create template" }).click();
    await expect(page).toHaveTitle(`${name} · Templates · Hiltbench`);
    await page.getByLabel("Preview with build").selectOption({ label: "Kestrel" });
    await expect(page).toHaveURL(/build=/);
    await replaceSource(page, source);
    await expect(page.getByTestId("problems-none")).toBeVisible();
    await page.getByRole("button", { name: "Save as version 2" }).click();
    await expect(page.getByTestId("save-status")).toHaveText("Saved version 2.");
    return page.url();
  };
  const aUrl = await create(a, "[from A, first] @( meta.buildName )@\n");
  const bUrl = await create(b, `B starts\n@[ use "${a}" ]@\nB ends\n`);
  const preview = page.getByTestId("preview");
  await expect(preview).toHaveText("B starts\n[from A, first] Kestrel\nB ends\n");

  // A new version of A: B picks it up without being saved again.
  await page.goto(aUrl);
  await replaceSource(page, "[from A, second] @( meta.buildName )@\n");
  await page.getByRole("button", { name: "Save as version 3" }).click();
  await expect(page.getByTestId("save-status")).toHaveText("Saved version 3.");
  await page.goto(bUrl);
  await expect(preview).toHaveText("B starts\n[from A, second] Kestrel\nB ends\n");

  // A uses B, which uses A: an error at A's 'use', in the list and underlined in the editor.
  await page.goto(aUrl);
  await replaceSource(page, `A again\n@[ use "${b}" ]@\n`);
  await expect(page.getByTestId("problems")).toContainText(`2:1 error (check): in template "${a}" at 2:1: partial cycle: "${b}" → "${a}" → "${b}"`);
  await expect(page.locator("[data-testid=template-editor] .cm-lintRange-error")).toContainText(`use "${b}"`);
  await expect(page.getByTestId("preview-failed")).toBeVisible();
  await page.getByRole("button", { name: "Save as version 4" }).click();
  await expect(page.getByTestId("save-status")).toContainText("The template has 1 error; nothing was saved.");
  const ids = (await sql.query("SELECT id, name FROM templates WHERE name = ANY($1)", [[a, b]])).rows;
  expect(await versionCount(sql, ids.find((r) => r.name === a).id)).toBe(3);
  await sql.query("DELETE FROM templates WHERE name = ANY($1)", [[a, b]]);
});

test("a builder deletes a template after typing its name, and it is gone with its versions", async ({ page, signIn, sql }) => {
  const name = `scrap-${uniq()}`;
  const id = await insertTemplate(sql, name, ["first", "second"]);
  await signIn("demo-builder");
  await page.goto(`/templates/${id}`);
  const section = page.getByRole("region", { name: "Delete this template" });
  await expect(section).toContainText("No build uses it.");
  await section.getByRole("button", { name: "Delete template…" }).click();
  const confirm = section.getByRole("button", { name: `Delete ${name} and its 2 versions` });
  await expect(confirm).toBeDisabled();
  await section.getByLabel(`Type ${name} to confirm`).fill(`${name}x`);
  await expect(confirm).toBeDisabled();
  // Cancel changes nothing; start again.
  await section.getByRole("button", { name: "Cancel" }).click();
  await section.getByRole("button", { name: "Delete template…" }).click();
  await section.getByLabel(`Type ${name} to confirm`).fill(name);
  await confirm.click();
  await expect(page).toHaveURL(/\/templates\?deleted=/);
  await expect(page.getByTestId("templates-notice")).toHaveText(`Deleted the template ${name} and its 2 versions.`);
  await expect(page.getByRole("link", { name })).toHaveCount(0);
  expect((await sql.query("SELECT count(*)::int AS n FROM templates WHERE id = $1", [id])).rows[0].n).toBe(0);
  expect(await versionCount(sql, id)).toBe(0);
  const gone = await page.goto(`/templates/${id}`);
  expect(gone?.status()).toBe(404);
  await expect(page.getByTestId("error-message")).toHaveText("No template with this id in your workshop.");
});

test("a template that a build or another template depends on is not deleted (409), and nothing changes", async ({ page, signIn, sql }) => {
  const base = `base-${uniq()}`;
  const user = `user-${uniq()}`;
  const raced = `raced-${uniq()}`;
  const baseId = await insertTemplate(sql, base, ["BASE"]);
  const userId = await insertTemplate(sql, user, [`@[ use "${base}" ]@`]);
  const racedId = await insertTemplate(sql, raced, ["R1"]);
  const kestrel = await buildIdByName(sql, "Kestrel");
  await signIn("demo-builder");

  // The page says what depends on it and offers no delete button.
  await page.goto(`/templates/${baseId}`);
  const section = page.getByRole("region", { name: "Delete this template" });
  await expect(section.getByTestId("template-dependents")).toHaveText(`Template ${user} uses it as a partial.`);
  await expect(section.getByRole("button", { name: /Delete/ })).toHaveCount(0);
  const direct = await page.request.post(`/templates/${baseId}`, { form: { intent: "delete", confirm: base }, headers: { Origin: BASE_URL } });
  expect(direct.status()).toBe(409);
  expect(await versionCount(sql, baseId)).toBe(1);

  // Kestrel gets pinned to it after the page was loaded: the server refuses, and says why.
  await keepingBuild(sql, kestrel, async () => {
    await page.goto(`/templates/${racedId}`);
    const s = page.getByRole("region", { name: "Delete this template" });
    await s.getByRole("button", { name: "Delete template…" }).click();
    await s.getByLabel(`Type ${raced} to confirm`).fill(raced);
    await sql.query("UPDATE builds SET pinned_template_id = $2, pinned_template_version = 1 WHERE id = $1", [kestrel, racedId]);
    await s.getByRole("button", { name: `Delete ${raced} and its 1 version` }).click();
    await expect(page.getByTestId("delete-error")).toContainText(`'${raced}' cannot be deleted: build Kestrel (v1) is pinned to it. Nothing was deleted.`);
    await expect(page.getByTestId("delete-error").getByRole("link", { name: "Kestrel" })).toHaveAttribute("href", `/builds/${kestrel}/render`);
    await expect(page).toHaveURL(new RegExp(`/templates/${racedId}$`));
    expect(await versionCount(sql, racedId)).toBe(1);
    expect((await sql.query("SELECT pinned_template_id FROM builds WHERE id = $1", [kestrel])).rows[0].pinned_template_id).toBe(racedId);
  });
  await sql.query("DELETE FROM templates WHERE id = ANY($1)", [[userId, baseId, racedId]]);
});

test("reviewers and clients cannot delete templates, built-ins cannot be deleted, and another workshop's are not found", async ({ page, signIn, sql, browser }) => {
  const name = `keep-${uniq()}`;
  const id = await insertTemplate(sql, name, ["kept"]);
  await signIn("demo-reviewer");
  await page.goto(`/templates/${id}`);
  await expect(page.getByText("Read-only for your role.")).toBeVisible();
  await expect(page.getByRole("region", { name: "Delete this template" })).toHaveCount(0);
  const asReviewer = await page.request.post(`/templates/${id}`, { form: { intent: "delete", confirm: name }, headers: { Origin: BASE_URL } });
  expect(asReviewer.status()).toBe(403);

  const clientContext = await browser.newContext({ baseURL: BASE_URL });
  const client = await clientContext.newPage();
  await signInAs(client, "client-one");
  const asClient = await client.request.post(`/templates/${id}`, { form: { intent: "delete", confirm: name }, headers: { Origin: BASE_URL } });
  expect(asClient.status()).toBe(403);
  await clientContext.close();
  expect(await versionCount(sql, id)).toBe(1);

  const builderContext = await browser.newContext({ baseURL: BASE_URL });
  const builder = await builderContext.newPage();
  await signInAs(builder, "demo-builder");
  const builtin = await builder.request.post("/templates/generic-header", { form: { intent: "delete", confirm: "generic-header" }, headers: { Origin: BASE_URL } });
  expect(builtin.status()).toBe(403);
  const ws = (await sql.query("INSERT INTO workshops (name, slug) VALUES ('Other Bench', 'other-' || substr(md5(random()::text), 1, 8)) RETURNING id")).rows[0].id;
  const theirs = await insertTemplate(sql, name, ["theirs"], ws);
  const foreign = await builder.request.post(`/templates/${theirs}`, { form: { intent: "delete", confirm: name }, headers: { Origin: BASE_URL } });
  expect(foreign.status()).toBe(404);
  const noName = await builder.request.post(`/templates/${id}`, { form: { intent: "delete", confirm: "" }, headers: { Origin: BASE_URL } });
  expect(noName.status()).toBe(400);
  await builderContext.close();
  expect(await versionCount(sql, theirs)).toBe(1);
  expect(await versionCount(sql, id)).toBe(1);
  await sql.query("DELETE FROM templates WHERE id = ANY($1)", [[id, theirs]]);
});
