// A build pinned to a template version keeps its bytes when a template it uses is edited: the
// version renders with the partial versions it recorded when it was saved. The editor's preview
// shows the latest; saving again and moving the pin takes the newer partial in.
import { test, expect, buildIdByName } from "./fixtures";
import { insertTemplate, keepingBuild, replaceSource, uniq } from "./template-helpers";

test("editing a partial leaves a pinned build's output alone until the template is saved again and the pin moved", async ({ page, signIn, sql }) => {
  test.setTimeout(90_000);
  const part = `part-${uniq()}`;
  const outer = `outer-${uniq()}`;
  const partId = await insertTemplate(sql, part, ["[part one]"]);
  const outerId = await insertTemplate(sql, outer, [`A @[ use "${part}" ]@ Z\n`]);
  const kestrel = await buildIdByName(sql, "Kestrel");
  const output = page.locator("[data-testid=render-output] .cm-content");
  const used = page.getByTestId("render-template-uses");
  await keepingBuild(sql, kestrel, async () => {
    await signIn("demo-builder");
    await page.goto(`/builds/${kestrel}/render`);
    await page.getByLabel("Template", { exact: true }).selectOption({ label: `${outer} (v1)` });
    await expect(output).toHaveText("A [part one] Z");
    await expect(used).toHaveText(`Uses, as they were when version 1 was saved: ${part} v1`);
    await page.getByRole("button", { name: `Use ${outer} v1 for this build` }).click();
    await expect(page.getByTestId("render-template-used")).toContainText("this build's template");

    // A new version of the partial, saved in the editor.
    await page.goto(`/templates/${partId}`);
    await replaceSource(page, "[part two]");
    await page.getByRole("button", { name: "Save as version 2" }).click();
    await expect(page.getByTestId("save-status")).toHaveText("Saved version 2.");

    // Kestrel's output has not moved, in the page and through the API.
    await page.goto(`/builds/${kestrel}/render`);
    await expect(output).toHaveText("A [part one] Z");
    await expect(used).toContainText(`${part} v1`);
    const api = await page.request.get(`/api/builds/${kestrel}/render`);
    expect(api.status()).toBe(200);
    expect(await api.text()).toBe("A [part one] Z\n");

    // The editor previews with the latest partial; saving the same source records it.
    await page.goto(`/templates/${outerId}`);
    await page.getByLabel("Preview with build").selectOption({ label: "Kestrel" });
    await expect(page.getByTestId("preview")).toHaveText("A [part two] Z\n");
    await expect(page.getByTestId("newer-partials")).toContainText(`Newer versions of templates this one uses: ${part} v2 (version 1 renders with v1).`);
    await page.getByRole("button", { name: "Save as version 2" }).click();
    await expect(page.getByTestId("save-status")).toHaveText("Saved version 2.");
    await expect(page.getByTestId("newer-partials")).toHaveCount(0);

    await page.goto(`/builds/${kestrel}/render`);
    await expect(output).toHaveText("A [part one] Z");
    await page.getByRole("button", { name: "Move to version 2" }).click();
    await expect(output).toHaveText("A [part two] Z");
    await expect(used).toHaveText(`Uses, as they were when version 2 was saved: ${part} v2`);
    const recorded = await sql.query("SELECT version, uses FROM template_versions WHERE template_id = $1 ORDER BY version", [outerId]);
    expect(recorded.rows.map((r) => [r.version, r.uses[part].version])).toEqual([
      [1, 1],
      [2, 2],
    ]);
  });
  // Kestrel is unpinned again by keepingBuild; the two templates can go.
  await sql.query("DELETE FROM templates WHERE id = ANY($1)", [[outerId, partId]]);
});
