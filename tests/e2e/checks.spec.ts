// The Checks page as a builder uses it (diagnostics, power, cautions, links, import, export),
// and the JSON API as a script uses it with a personal token. Every test that changes Kestrel's
// config puts the original back, so later specs see the seeded build.
import { readFile } from "node:fs/promises";
import type pg from "pg";
import { test, expect, buildIdByName, signInRequest, BASE_URL, tokenFor } from "./fixtures";

async function storedConfig(sql: pg.Pool, id: string): Promise<{ config: Record<string, any>; version: number }> {
  const r = await sql.query("SELECT config, config_version FROM builds WHERE id = $1", [id]);
  return { config: r.rows[0].config, version: r.rows[0].config_version };
}

/** Runs `body` and then puts Kestrel's config back as it was (version moves on, as after any save). */
async function keepingConfig(sql: pg.Pool, id: string, body: (original: { config: Record<string, any>; version: number }) => Promise<void>) {
  const original = await storedConfig(sql, id);
  try {
    await body(original);
  } finally {
    await sql.query("UPDATE builds SET config = $2, config_version = config_version + 1 WHERE id = $1", [id, JSON.stringify(original.config)]);
  }
}


test("a builder reads Kestrel's checks, power and cautions, and follows a diagnostic to the rig field", async ({ page, signIn, sql }) => {
  const id = await buildIdByName(sql, "Kestrel");
  await keepingConfig(sql, id, async ({ config }) => {
    // A wrong data pin on the blade, so there is an error pointing into the rig.
    const broken = structuredClone(config);
    broken.rig.channels[0].pin = 99;
    await sql.query("UPDATE builds SET config = $2, config_version = config_version + 1 WHERE id = $1", [id, JSON.stringify(broken)]);

    await signIn("demo-builder");
    await page.goto("/builds");
    await page.getByRole("link", { name: "Kestrel" }).click();
    await page.getByRole("navigation", { name: "Build sections" }).getByRole("link", { name: "Checks" }).click();
    await expect(page).toHaveURL(new RegExp(`/builds/${id}/checks$`));
    await expect(page).toHaveTitle(/Checks · Kestrel/);

    const errors = page.getByTestId("checks-error");
    await expect(errors.getByText(/Channel "[^"]+" is on pin 99/)).toBeVisible();
    await expect(errors.getByText("unknown-data-pin")).toBeVisible();
    const warnings = page.getByTestId("checks-warning");
    await expect(warnings.getByText(/Preset "Northlight" uses font "Northlight"/)).toBeVisible();
    await expect(warnings.getByText("Ask the client for the font")).toBeVisible();
    await expect(warnings.getByRole("link", { name: "presets[4].fontId" })).toHaveAttribute("href", `/builds/${id}/looks?preset=northlight`);

    const power = page.getByTestId("power-card");
    await expect(power.getByRole("heading", { name: "Power" })).toBeVisible();
    for (const label of ["Peak", "Typical", "Runtime", "Energy", "Wire drop at peak", "Wire heat at peak", "Suggested cap"]) await expect(power.locator("dt").getByText(label, { exact: true })).toBeVisible();
    // The figures shown are the API's for the same config (the page's own session does the asking).
    const figures = (await (await page.request.post("/api/validate", { data: { config: broken } })).json()).power.overall;
    const figure = (label: string) => power.locator("dl > div").filter({ has: page.locator("dt", { hasText: new RegExp(`^${label}$`) }) }).locator("dd").first();
    await expect(figure("Peak")).toHaveText(`${figures.peakAmps.toFixed(2)} A`);
    await expect(figure("Energy")).toHaveText(`${figures.energyWh.toFixed(1)} Wh`);
    await expect(figure("Wire drop at peak")).toHaveText(`${figures.wireDropVolts.toFixed(2)} V`);
    await expect(figure("Suggested cap")).toHaveText(`${Math.round(figures.suggestedBrightnessCap * 100)} %`);
    await expect(power.getByRole("table", { name: "Power by preset" }).getByRole("row")).toHaveCount(1 + config.presets.length);
    await expect(power.getByRole("row", { name: /Northlight/ })).toBeVisible();

    const cautions = page.getByTestId("safety-cautions");
    await expect(cautions.getByText(/between 0 °C and 40 °C/)).toBeVisible();
    await expect(cautions.getByText(/smells, changes colour/)).toBeVisible();
    await expect(cautions.getByText(/never put them in the bin/)).toBeVisible();
    await expect(cautions.getByText(/heat thin wiring/)).toBeVisible();
    await expect(cautions.getByRole("listitem").filter({ hasText: /poor solder joint/ })).toBeVisible();
    await expect(cautions.getByText(/data sheet, local rules and a qualified person come before any figure/)).toBeVisible();

    await errors.getByRole("link", { name: "rig.channels[0].pin" }).click();
    await expect(page).toHaveURL(new RegExp(`/builds/${id}/rig#f-channels-0-pin$`));
    await expect(page.locator("#f-channels-0-pin")).toHaveValue("99");
    await expect(page.locator("#f-channels-0-pin")).toBeInViewport();
  });
});

test("importing a broken file lists the problems and stores nothing; a valid one is stored; export matches", async ({ page, signIn, sql }) => {
  const id = await buildIdByName(sql, "Kestrel");
  await keepingConfig(sql, id, async (before) => {
    await signIn("demo-builder");
    await page.goto(`/builds/${id}/checks`);

    const broken = structuredClone(before.config);
    broken.rig.channels[0].pixels = -5;
    broken.presets[0].looks.blade.layers[0].color = "#12345g";
    broken.presets[0].looks.blade.layers.push({ kind: "sparkle" });
    await page.getByLabel(/Config file/).setInputFiles({ name: "kestrel-broken.json", mimeType: "application/json", buffer: Buffer.from(JSON.stringify(broken)) });
    await page.getByRole("button", { name: "Import" }).click();
    const result = page.getByTestId("import-result");
    await expect(result.getByText(/"kestrel-broken.json" was not imported: The config has 3 errors/)).toBeVisible();
    await expect(result.getByText("invalid-color")).toBeVisible();
    await expect(result.getByText("unknown-layer-kind")).toBeVisible();
    await expect(result.getByText("rig.channels[0].pixels", { exact: true })).toBeVisible();
    expect(await storedConfig(sql, id)).toEqual(before);

    await page.getByLabel(/Config file/).setInputFiles({ name: "not-json.json", mimeType: "application/json", buffer: Buffer.from("{ this is not json") });
    await page.getByRole("button", { name: "Import" }).click();
    await expect(result.getByText(/"not-json.json" is not valid JSON/)).toBeVisible();
    expect(await storedConfig(sql, id)).toEqual(before);

    const edited = structuredClone(before.config);
    edited.rig.power.brightnessCap = 0.5;
    edited.presets[0].name = "Ashfall (dimmer)";
    await page.getByLabel(/Config file/).setInputFiles({ name: "kestrel-edited.json", mimeType: "application/json", buffer: Buffer.from(JSON.stringify(edited)) });
    await page.getByRole("button", { name: "Import" }).click();
    await expect(result.getByText(`Imported "kestrel-edited.json" as version ${before.version + 1}.`)).toBeVisible();
    const after = await storedConfig(sql, id);
    expect(after).toEqual({ config: edited, version: before.version + 1 });
    await expect(page.getByTestId("power-card").getByRole("row", { name: /Ashfall \(dimmer\)/ })).toBeVisible();

    const download = page.waitForEvent("download");
    await page.getByRole("link", { name: "Export Kestrel as JSON" }).click();
    const file = await download;
    expect(file.suggestedFilename()).toBe("kestrel.hiltbench.json");
    expect(JSON.parse(await readFile((await file.path())!, "utf8"))).toEqual(after.config);
  });
});

test("an old hiltbench.config/1 file imports: its layers get ids, and the export is the /2 form", async ({ page, signIn, sql }) => {
  const id = await buildIdByName(sql, "Kestrel");
  await keepingConfig(sql, id, async (before) => {
    await signIn("demo-builder");
    await page.goto(`/builds/${id}/checks`);
    // What an export from before layer ids looks like: format /1, layers without "id".
    const old = structuredClone(before.config);
    old.format = "hiltbench.config/1";
    for (const p of old.presets) for (const look of Object.values(p.looks) as { layers: Record<string, unknown>[] }[]) for (const l of look.layers) delete l.id;
    old.presets[0].name = "Ashfall (kept)";
    await page.getByLabel(/Config file/).setInputFiles({ name: "kestrel-old.json", mimeType: "application/json", buffer: Buffer.from(JSON.stringify(old)) });
    await page.getByRole("button", { name: "Import" }).click();
    const result = page.getByTestId("import-result");
    await expect(result.getByText(`Imported "kestrel-old.json" as version ${before.version + 1}.`)).toBeVisible();
    const after = await storedConfig(sql, id);
    expect(after.config.format).toBe("hiltbench.config/2");
    expect(after.config.presets[0].name).toBe("Ashfall (kept)");
    const ids = after.config.presets[0].looks.blade.layers.map((l: { id: string }) => l.id);
    for (const x of ids) expect(x).toMatch(/^l-[0-9a-z]{6}$/);
    expect(new Set(ids).size).toBe(ids.length);

    const download = page.waitForEvent("download");
    await page.getByRole("link", { name: "Export Kestrel as JSON" }).click();
    expect(JSON.parse(await readFile((await (await download).path())!, "utf8"))).toEqual(after.config);
  });
});

test("the import refuses an oversized file with a message and a reviewer cannot import", async ({ page, signIn, sql, playwright }) => {
  const id = await buildIdByName(sql, "Kestrel");
  const before = await storedConfig(sql, id);
  await signIn("demo-builder");
  await page.goto(`/builds/${id}/checks`);
  await page.getByLabel(/Config file/).setInputFiles({ name: "huge.json", mimeType: "application/json", buffer: Buffer.from(JSON.stringify({ pad: "x".repeat(2_200_000) })) });
  await page.getByRole("button", { name: "Import" }).click();
  await expect(page.getByTestId("import-result").getByText(/larger than/)).toBeVisible();
  expect(await storedConfig(sql, id)).toEqual(before);

  const reviewer = await playwright.request.newContext({ baseURL: BASE_URL, extraHTTPHeaders: { Origin: BASE_URL } });
  await signInRequest(reviewer, "demo-reviewer");
  const page2 = await reviewer.get(`/builds/${id}/checks`);
  expect(page2.status()).toBe(200);
  expect(await page2.text()).toContain("can export the config but not import");
  const refused = await reviewer.post(`/builds/${id}/checks`, { multipart: { version: String(before.version), file: { name: "k.json", mimeType: "application/json", buffer: Buffer.from(JSON.stringify(before.config)) } }, maxRedirects: 0 });
  expect(refused.status()).toBe(403);
  expect(await storedConfig(sql, id)).toEqual(before);
  await reviewer.dispose();
});

test("the API validates, reads and replaces a config with a token, refusing bad input without storing", async ({ playwright, sql }) => {
  const id = await buildIdByName(sql, "Kestrel");
  const token = await tokenFor(sql, "demo-builder", "checks e2e");
  const api = await playwright.request.newContext({ baseURL: BASE_URL, extraHTTPHeaders: { Authorization: `Bearer ${token}` } });
  await keepingConfig(sql, id, async (before) => {
    // validate: a good config gives its warnings and engine power figures
    const ok = await api.post("/api/validate", { data: { config: before.config } });
    expect(ok.status()).toBe(200);
    const okBody = await ok.json();
    expect(okBody.diagnostics.map((d: { code: string }) => d.code)).toEqual(["font-promised"]);
    expect(okBody.powerSource).toBe("engine");
    expect(okBody.power.overall.peakAmps).toBeGreaterThan(0);
    expect(okBody.power.presets).toHaveLength(before.config.presets.length);

    // validate: wrong types, a bad colour, an unknown layer kind, negative and absurd counts, a 10,000-layer look
    const bad = structuredClone(before.config);
    bad.rig.channels[0].pixels = -3;
    bad.rig.channels[1].parallelStrips = 1e9;
    bad.rig.power.cellCapacityMah = "lots";
    bad.presets[0].looks.blade.layers[0].color = "#12345g";
    bad.presets[1].looks.blade.layers = Array.from({ length: 10_000 }, () => ({ kind: "fill", enabled: true, opacity: 1, blend: "normal", when: "always", color: "#ff0000" }));
    bad.presets[2].looks.blade.layers.push({ kind: "sparkle" });
    let started = Date.now();
    const checked = await api.post("/api/validate", { data: { config: bad } });
    expect(Date.now() - started).toBeLessThan(5000);
    expect(checked.status()).toBe(200);
    const checkedBody = await checked.json();
    const codes = checkedBody.diagnostics.map((d: { code: string }) => d.code);
    for (const code of ["out-of-range", "wrong-type", "invalid-color", "too-many-items", "unknown-layer-kind", "semantic-rules-skipped"]) expect(codes).toContain(code);
    expect(checkedBody.power).toBeNull();
    for (const d of checkedBody.diagnostics) expect(d).toEqual({ severity: expect.any(String), code: expect.any(String), path: expect.any(String), message: expect.any(String), hint: expect.any(String) });

    // validate: bodies that are not a request
    const notJson = await api.post("/api/validate", { headers: { "Content-Type": "application/json" }, data: Buffer.from("{ nope") });
    expect(notJson.status()).toBe(400);
    expect((await notJson.json()).error).toMatch(/not valid JSON/);
    const noConfig = await api.post("/api/validate", { data: { rig: {} } });
    expect(noConfig.status()).toBe(400);
    expect((await noConfig.json()).error).toBe('The body has no "config" field.');
    const huge = await api.post("/api/validate", { headers: { "Content-Type": "application/json" }, data: Buffer.from(JSON.stringify({ config: { pad: "x".repeat(3 * 1024 * 1024) } })) });
    expect(huge.status()).toBe(413);
    expect((await huge.json()).error).toMatch(/larger than 2 MB/);
    started = Date.now();
    const deep = await api.post("/api/validate", { headers: { "Content-Type": "application/json" }, data: Buffer.from(`{"config":${"[".repeat(100_000)}${"]".repeat(100_000)}}`) });
    expect(deep.status()).toBe(400);
    expect((await deep.json()).error).toMatch(/nests deeper/);
    expect(Date.now() - started).toBeLessThan(5000);

    // read
    const got = await api.get(`/api/builds/${id}/config`);
    expect(got.status()).toBe(200);
    expect(await got.json()).toEqual({ config: before.config, version: before.version });

    // replace: errors → 422, nothing stored
    const refused = await api.put(`/api/builds/${id}/config`, { data: { config: bad, version: before.version } });
    expect(refused.status()).toBe(422);
    const refusedBody = await refused.json();
    expect(refusedBody.error).toMatch(/nothing was stored/);
    expect(refusedBody.diagnostics.length).toBeGreaterThan(3);
    expect(await storedConfig(sql, id)).toEqual(before);

    // replace: no version → 400; stale version → 409; nothing stored either time
    const noVersion = await api.put(`/api/builds/${id}/config`, { data: { config: before.config } });
    expect(noVersion.status()).toBe(400);
    expect((await noVersion.json()).error).toMatch(/"version"/);
    const edited = structuredClone(before.config);
    edited.rig.power.brightnessCap = 0.6;
    const stale = await api.put(`/api/builds/${id}/config`, { data: { config: edited, version: before.version - 1 } });
    expect(stale.status()).toBe(409);
    expect((await stale.json()).error).toMatch(/changed since version/);
    expect(await storedConfig(sql, id)).toEqual(before);

    // replace: success → the new version and the warnings
    const saved = await api.put(`/api/builds/${id}/config`, { data: { config: edited, version: before.version } });
    expect(saved.status()).toBe(200);
    const savedBody = await saved.json();
    expect(savedBody.version).toBe(before.version + 1);
    expect(savedBody.diagnostics.map((d: { code: string }) => d.code)).toEqual(["font-promised"]);
    expect(await storedConfig(sql, id)).toEqual({ config: edited, version: before.version + 1 });
  });

  // a reviewer's token reads but cannot replace
  const reviewerApi = await playwright.request.newContext({ baseURL: BASE_URL, extraHTTPHeaders: { Authorization: `Bearer ${await tokenFor(sql, "demo-reviewer", "checks e2e")}` } });
  const current = await storedConfig(sql, id);
  expect((await reviewerApi.get(`/api/builds/${id}/config`)).status()).toBe(200);
  const forbidden = await reviewerApi.put(`/api/builds/${id}/config`, { data: { config: current.config, version: current.version } });
  expect(forbidden.status()).toBe(403);
  expect(await storedConfig(sql, id)).toEqual(current);
  await reviewerApi.dispose();
  await api.dispose();
});
