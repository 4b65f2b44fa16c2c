// Templates as a builder uses them (create from a built-in, edit with live diagnostics and
// preview, save versions, pin one on a build's Render view, download, move to a newer version),
// a reviewer's read-only view, reading a hand-edited header back, and the render API as a script
// uses it with a personal token. Everything that changes Kestrel is put back afterwards.
import { readFile } from "node:fs/promises";
import http from "node:http";
import { test, expect, buildIdByName, BASE_URL, tokenFor } from "./fixtures";
import { insertTemplate, keepingBuild, typeAtStart, uniq } from "./template-helpers";


/**
 * POST a large body and take the answer as soon as it arrives: the server refuses an oversized
 * body from its Content-Length and closes the connection, so the rest of the upload may fail
 * to write (EPIPE) after the answer is already here.
 */
function postUntilAnswered(path: string, token: string, body: string): Promise<{ status: number; body: string }> {
  return new Promise((resolve, reject) => {
    const bytes = Buffer.from(body);
    const req = http.request(new URL(path, BASE_URL), {
      method: "POST",
      headers: { Authorization: `Bearer ${token}`, "Content-Type": "application/json", "Content-Length": bytes.length },
    });
    let answered = false;
    req.on("response", (res) => {
      answered = true;
      const chunks: Buffer[] = [];
      res.on("data", (c: Buffer) => chunks.push(c));
      res.on("end", () => resolve({ status: res.statusCode ?? 0, body: Buffer.concat(chunks).toString("utf8") }));
      res.on("error", reject);
    });
    req.on("error", (e) => {
      if (!answered) setTimeout(() => (answered ? undefined : reject(e)), 2000);
    });
    req.end(bytes);
  });
}

test("a builder makes a template from the generic header, edits it live, saves versions, pins one on Kestrel and moves it on", async ({ page, signIn, sql }) => {
  test.setTimeout(90_000);
  const kestrel = await buildIdByName(sql, "Kestrel");
  const name = `shop-header-${uniq()}`;
  await keepingBuild(sql, kestrel, async () => {
    await signIn("demo-builder");
    await page.goto("/builds");
    await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Templates" }).click();
    await expect(page).toHaveTitle("Templates · Hiltbench");

    await page.getByLabel("Name").fill(name);
    await page.getByLabel("Start from a copy of").selectOption("generic-header");
    await page.getByRole("button", { name: "Create template" }).click();
    await expect(page).toHaveURL(/\/templates\/[0-9a-f-]{36}$/);
    await expect(page).toHaveTitle(`${name} · Templates · Hiltbench`);
    await expect(page.getByTestId("template-version")).toHaveText("version 1");

    await page.getByLabel("Preview with build").selectOption({ label: "Kestrel" });
    await expect(page).toHaveURL(new RegExp(`build=${kestrel}`));
    const preview = page.getByTestId("preview");
    await expect(preview).toContainText("Hiltbench configuration header");
    await expect(preview).toContainText("build:    Kestrel");
    await expect(page.getByTestId("problems-none")).toBeVisible();

    // A misspelt field: a live diagnostic with its suggestion, underlined in the editor.
    await typeAtStart(page, "// first channel: @( config.rig.channels[0].pixles )@ pixels\n");
    await expect(page.getByTestId("problems")).toContainText("1:45 error (check): unknown field 'pixles' on channel — did you mean 'pixels'?");
    await expect(page.locator("[data-testid=template-editor] .cm-lintRange-error")).toHaveText("pixles");
    await expect(page.getByTestId("preview-failed")).toBeVisible();

    // Fix it by retyping the line: the diagnostic goes and the preview shows the value.
    await page.keyboard.press("Control+Home");
    await page.keyboard.press("Shift+End");
    await page.keyboard.insertText("// first channel: @( config.rig.channels[0].pixels )@ pixels");
    await expect(page.getByTestId("problems-none")).toBeVisible();
    await expect(preview).toContainText("// first channel: 132 pixels");

    await page.getByRole("button", { name: "Save as version 2" }).click();
    await expect(page.getByTestId("save-status")).toHaveText("Saved version 2.");
    await expect(page.getByTestId("template-version")).toHaveText("version 2");
    const stored = await sql.query("SELECT v.version, v.source FROM template_versions v JOIN templates t ON t.id = v.template_id WHERE t.name = $1 ORDER BY v.version", [name]);
    expect(stored.rows.map((r) => r.version)).toEqual([1, 2]);
    expect(stored.rows[1].source.startsWith("// first channel: @( config.rig.channels[0].pixels )@ pixels\n@# generic-header")).toBe(true);

    // A source that does not compile is refused, and nothing is stored.
    await typeAtStart(page, "@( config.nope )@");
    await expect(page.getByTestId("problems")).toContainText("unknown field 'nope'");
    await page.getByRole("button", { name: "Save as version 3" }).click();
    await expect(page.getByTestId("save-status")).toContainText("The template has 1 error; nothing was saved.");
    expect((await sql.query("SELECT count(*)::int AS n FROM template_versions v JOIN templates t ON t.id = v.template_id WHERE t.name = $1", [name])).rows[0].n).toBe(2);
    await page.locator("[data-testid=template-editor] .cm-content").click();
    await page.keyboard.press("Control+Home");
    for (let i = 0; i < "@( config.nope )@".length; i++) await page.keyboard.press("Delete");
    await expect(page.getByTestId("problems-none")).toBeVisible();
    const editorUrl = page.url();

    // Pin version 2 on Kestrel's Render view.
    await page.goto(`/builds/${kestrel}`);
    await page.getByRole("navigation", { name: "Build sections" }).getByRole("link", { name: "Render" }).click();
    await expect(page).toHaveTitle("Render · Kestrel · Hiltbench");
    await expect(page.getByTestId("render-template-used")).toContainText("Rendered with generic-header version 2");
    await page.getByLabel("Template", { exact: true }).selectOption({ label: `${name} (v2)` });
    await expect(page.getByTestId("render-template-used")).toContainText(`Rendered with ${name} version 2`);
    await expect(page.locator("[data-testid=render-output] .cm-content")).toContainText("// first channel: 132 pixels");
    await page.getByRole("button", { name: `Use ${name} v2 for this build` }).click();
    await expect(page.getByTestId("render-template-used")).toContainText("this build's template");
    const pin = await sql.query("SELECT pinned_template_version FROM builds WHERE id = $1", [kestrel]);
    expect(pin.rows[0].pinned_template_version).toBe(2);

    // Download: the file is the rendered output, and says which template made it.
    const download = page.waitForEvent("download");
    await page.getByRole("link", { name: "Download" }).click();
    const file = await download;
    expect(file.suggestedFilename()).toBe(`kestrel-${name}.h`);
    const text = await readFile((await file.path())!, "utf8");
    expect(text.startsWith("// first channel: 132 pixels\n")).toBe(true);
    expect(text).toContain(` * template: ${name} v2`);
    expect(text).toContain(" * build:    Kestrel");

    // A third version; Kestrel stays on version 2 until someone moves it.
    await page.goto(editorUrl);
    await typeAtStart(page, "// third\n");
    await page.getByRole("button", { name: "Save as version 3" }).click();
    await expect(page.getByTestId("save-status")).toHaveText("Saved version 3.");
    await page.goto(`/builds/${kestrel}/render`);
    await expect(page.getByTestId("render-template-used")).toContainText(`Rendered with ${name} version 2`);
    await expect(page.getByText("(version 3 exists)")).toBeVisible();
    await page.getByRole("button", { name: "Move to version 3" }).click();
    await expect(page.getByTestId("render-template-used")).toContainText(`Rendered with ${name} version 3`);
    await expect(page.locator("[data-testid=render-output] .cm-content")).toContainText("// third");
    await expect(page.getByRole("button", { name: /Move to version/ })).toHaveCount(0);
    expect((await sql.query("SELECT pinned_template_version FROM builds WHERE id = $1", [kestrel])).rows[0].pinned_template_version).toBe(3);
  });
});

test("a reviewer sees a template and the Render view but cannot save or pin", async ({ page, signIn, sql }) => {
  const name = `review-${uniq()}`;
  const id = await insertTemplate(sql, name, ["/* @( meta.buildName )@ */\n"]);
  const harrier = await buildIdByName(sql, "Harrier");
  await signIn("demo-reviewer");
  await page.goto(`/templates/${id}?build=${harrier}`);
  await expect(page.getByText("Read-only for your role.")).toBeVisible();
  await expect(page.getByRole("button", { name: /Save as version/ })).toHaveCount(0);
  await expect(page.locator("[data-testid=template-editor] .cm-content")).toHaveAttribute("contenteditable", "false");
  // The preview is rendered in a Web Worker in the page; a busy machine can take a while.
  await expect(page.getByTestId("preview")).toContainText("/* Harrier */", { timeout: 20_000 });
  const res = await page.request.post(`/templates/${id}`, { form: { source: "changed", latest: "1" }, headers: { Origin: BASE_URL } });
  expect(res.status()).toBe(403);
  expect((await sql.query("SELECT count(*)::int AS n FROM template_versions WHERE template_id = $1", [id])).rows[0].n).toBe(1);

  await page.goto("/templates");
  await expect(page.getByRole("button", { name: "Create template" })).toHaveCount(0);
  await expect(page.getByRole("link", { name })).toBeVisible();

  const kestrel = await buildIdByName(sql, "Kestrel");
  await page.goto(`/builds/${kestrel}/render?template=${id}`);
  await expect(page.getByTestId("render-template-used")).toContainText(`Rendered with ${name} version 1`);
  await expect(page.getByRole("button", { name: /Use .* for this build/ })).toHaveCount(0);
  const pin = await page.request.post(`/builds/${kestrel}/render`, { form: { intent: "pin", template: id, version: "1" }, headers: { Origin: BASE_URL } });
  expect(pin.status()).toBe(403);
});

test("a hand-edited header reads back on the Render view, with errors at their lines, and becomes Kestrel's config", async ({ page, signIn, sql }) => {
  const kestrel = await buildIdByName(sql, "Kestrel");
  await keepingBuild(sql, kestrel, async () => {
    await signIn("demo-builder");
    const rendered = await (await page.request.get(`/api/builds/${kestrel}/render?template=generic-header`)).text();
    await page.goto(`/builds/${kestrel}/render`);
    const box = page.getByLabel("Header text");

    const broken = rendered.replace(/\.pixels = (\d+)/, ".pixels = = $1");
    const line = broken.split("\n").findIndex((l) => l.includes(".pixels = = ")) + 1;
    await box.fill(broken);
    await page.getByRole("button", { name: "Read and check" }).click();
    await expect(page.getByTestId("readback-result")).toContainText(`line ${line}, column`);
    await expect(page.getByTestId("readback-result")).toContainText("unexpected '=' in an initializer");
    await expect(page.getByRole("button", { name: "Make this the build's config" })).toHaveCount(0);

    // Reads back, but the validator finds an error: it cannot become the config.
    await box.fill(rendered.replace(/(\/\* #0 \*\/ \{ \.id = "blade".*?\.pin = )\d+/, "$199"));
    await page.getByRole("button", { name: "Read and check" }).click();
    await expect(page.getByTestId("readback-result")).toContainText("The header reads back");
    await expect(page.getByTestId("readback-result")).toContainText("Fix the errors before it can become the build's config.");
    await expect(page.getByRole("button", { name: "Make this the build's config" })).toHaveCount(0);

    // A clean hand edit: the chamber strip renamed.
    const before = (await sql.query("SELECT config_version FROM builds WHERE id = $1", [kestrel])).rows[0].config_version;
    await box.fill(rendered.replace('.name = "Chamber window"', '.name = "Chamber glass"'));
    await page.getByRole("button", { name: "Read and check" }).click();
    await expect(page.getByTestId("readback-result")).toContainText("The header reads back");
    await page.getByRole("button", { name: "Make this the build's config" }).click();
    await expect(page.getByText(`The header is now the build's config (version ${before + 1}).`)).toBeVisible();
    const after = (await sql.query("SELECT config FROM builds WHERE id = $1", [kestrel])).rows[0].config;
    expect(after.rig.channels[1].name).toBe("Chamber glass");

    // A header written by version 1 of the generic header (C's `[n] = { … }`) still reads back.
    const v1 = await page.request.get(`/api/builds/${kestrel}/render?template=generic-header&version=1`);
    const v1Text = await v1.text();
    expect(v1Text).toContain('  [1] = { .id = "chamber", .name = "Chamber glass"');
    await box.fill(v1Text.replace('.name = "Chamber glass"', '.name = "Chamber pane"'));
    await page.getByRole("button", { name: "Read and check" }).click();
    await expect(page.getByTestId("readback-result")).toContainText("The header reads back");
  });
});

test("the render API answers text, 422 with positions for a broken or runaway template, and 413 for a huge one", async ({ playwright, sql }) => {
  const token = await tokenFor(sql, "demo-builder", "templates e2e");
  const kestrel = await buildIdByName(sql, "Kestrel");
  const api = await playwright.request.newContext({ baseURL: BASE_URL, extraHTTPHeaders: { Authorization: `Bearer ${token}` } });

  const ok = await api.post("/api/render", { data: { buildId: kestrel, template: { builtin: "generic-header" } } });
  expect(ok.status()).toBe(200);
  expect(ok.headers()["content-type"]).toContain("text/plain");
  const header = await ok.text();
  expect(header).toContain(" * build:    Kestrel");
  // Deterministic: the same build renders to the same bytes through either route.
  const again = await api.get(`/api/builds/${kestrel}/render?template=generic-header`);
  expect(await again.text()).toBe(header);
  // The built-ins are at version 2 (C and C++ alike); version 1 is still there, byte for byte.
  expect(again.headers()["x-template"]).toBe("generic-header@2");
  expect(header).toContain(" * template: generic-header v2\n");
  expect(header).toContain('  /* #0 */ { .id = "blade",');
  const v1 = await api.get(`/api/builds/${kestrel}/render?template=generic-header&version=1`);
  expect(v1.status()).toBe(200);
  expect(v1.headers()["x-template"]).toBe("generic-header@1");
  const v1Text = await v1.text();
  expect(v1Text).toContain(" * template: generic-header v1\n");
  expect(v1Text).toContain('  [0] = { .id = "blade",');
  const v3 = await api.get(`/api/builds/${kestrel}/render?template=generic-header&version=3`);
  expect(v3.status()).toBe(404);
  expect(await v3.text()).toContain("The built-in 'generic-header' has versions 1 to 2.");

  const config = (await sql.query("SELECT config FROM builds WHERE id = $1", [kestrel])).rows[0].config;
  const fromConfig = await api.post("/api/render", { data: { config, template: { source: "@( config.rig.channels |> count )@ channels" } } });
  expect(fromConfig.status()).toBe(200);
  expect(await fromConfig.text()).toBe(`${config.rig.channels.length} channels`);

  const broken = await api.post("/api/render", { data: { config, template: { source: "line one\n  @( config.rig.chanels )@" } } });
  expect(broken.status()).toBe(422);
  const errs = (await broken.json()).errors;
  expect(errs[0]).toMatchObject({ stage: "check", line: 2, column: 17 });
  expect(errs[0].message).toContain("did you mean 'channels'?");

  const loop = "@[ over config.presets[0].looks.blade.layers as a ]@".repeat(9) + "x" + "@[ /over ]@".repeat(9);
  const t0 = Date.now();
  const [runaway, health] = await Promise.all([
    api.post("/api/render", { data: { config, template: { source: loop } } }),
    new Promise((r) => setTimeout(r, 50)).then(() => api.get("/healthz")),
  ]);
  expect(runaway.status()).toBe(422);
  expect((await runaway.json()).errors[0].message).toMatch(/limit of (1000000 steps|500 ms)/);
  expect(Date.now() - t0).toBeLessThan(5000);
  expect(health.status()).toBe(200);

  const huge = await postUntilAnswered("/api/render", token, JSON.stringify({ config, template: { source: "x".repeat(5 * 1024 * 1024) } }));
  expect(huge.status).toBe(413);
  expect(JSON.parse(huge.body).error).toContain("larger than 1 MB");

  const big = await api.post("/api/render", { data: { config, template: { source: "y".repeat(300 * 1024) } } });
  expect(big.status()).toBe(422);
  expect((await big.json()).errors[0].message).toContain("over the limit of 262144");

  const missing = await api.post("/api/render", { data: { config, template: { id: "00000000-0000-4000-8000-000000000000" } } });
  expect(missing.status()).toBe(404);
  await api.dispose();
});

test("the language reference renders as a page", async ({ page, signIn }) => {
  await signIn("demo-reviewer");
  await page.goto("/templates");
  await page.getByRole("link", { name: "Language reference" }).click();
  await expect(page).toHaveTitle("Template language reference · Hiltbench");
  await expect(page.getByRole("heading", { name: "Hiltbench template language — reference", level: 1 })).toBeVisible();
  await expect(page.getByRole("heading", { name: "Filters", exact: true })).toBeVisible();
  await expect(page.locator("pre").first()).toContainText("@[ over config.rig.channels as ch, n ]@");
});
