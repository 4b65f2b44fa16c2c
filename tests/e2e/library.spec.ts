// The preset library as people use it: a builder saves a build's preset to the library, finds it
// in the Library table, and adds it to another build (looks by role, scaled); a builder sees
// "update available" on a build whose preset is a version behind, reads the library's changes,
// picks a side of a collision and applies it; the owner compares versions, is refused deleting a
// version builds use, dry-runs the newest version across builds and applies it to the clean
// ones (a released build untouched); a preset file is exported and imported, a bad one refused.
import { createHash, randomBytes } from "node:crypto";
import type pg from "pg";
import { demoConfig } from "../../app/lib/config/demo";
import { bodyFromBuildPreset } from "../../app/lib/library/adapt";
import { checkApiAnswer } from "../api-contract";
import { test, expect, tokenFor, BASE_URL } from "./fixtures";

test.describe.configure({ timeout: 120_000 });

const stamp = () => `${Date.now()}`.slice(-7);

/** A build of our own with revision 1 (other specs edit the seeded ones). */
async function newBuild(sql: pg.Pool, name: string, opts: { pixels?: number; status?: string; config?: unknown } = {}): Promise<string> {
  const ws = (await sql.query("SELECT workshop_id FROM builds WHERE name = 'Kestrel' LIMIT 1")).rows[0].workshop_id;
  const c = (opts.config as ReturnType<typeof demoConfig>) ?? demoConfig();
  if (opts.pixels) c.rig.channels[0].pixels = opts.pixels;
  const cfg = JSON.stringify(c);
  const b = (await sql.query("INSERT INTO builds (workshop_id, name, status, config) VALUES ($1, $2, $3, $4) RETURNING id, config_saved_at", [ws, name, opts.status ?? "configuring", cfg])).rows[0];
  await sql.query("INSERT INTO config_revisions (build_id, workshop_id, number, config, created_at) VALUES ($1, $2, 1, $3, $4)", [b.id, ws, cfg, b.config_saved_at]);
  return b.id;
}

async function api(token: string, method: string, path: string, body?: unknown) {
  const r = await fetch(`${BASE_URL}${path}`, { method, headers: { Authorization: `Bearer ${token}`, "Content-Type": "application/json" }, body: body === undefined ? undefined : JSON.stringify(body) });
  await checkApiAnswer(BASE_URL, method, r); // the answer as /api/openapi.json documents it
  return { status: r.status, body: (await r.json()) as Record<string, unknown> };
}

test("save a build's preset to the library, find it in the Library, add it to another build", async ({ page, signIn, sql }) => {
  const s = stamp();
  const from = await newBuild(sql, `Gyrfalcon ${s}`);
  const to = await newBuild(sql, `Hobby ${s}`, { pixels: 100 });
  await signIn("demo-builder");

  await page.goto(`/builds/${from}/looks`);
  const row = page.getByTestId("preset-origin-emberdusk");
  await row.getByText("Save Emberdusk to library…").click();
  await row.getByLabel("Name in the library").fill(`Dusk glow ${s}`);
  await row.getByLabel("Tags (comma-separated)").fill("warm, e2e");
  await row.getByLabel("Changelog (one line)").fill("From the Gyrfalcon");
  await row.getByRole("button", { name: "Publish to library" }).click();
  await expect(page.getByTestId("library-ok")).toContainText("Published to the library as version 1");
  await expect(page.getByTestId("preset-origin-emberdusk")).toContainText(`Dusk glow ${s} v1`);

  await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Library" }).click();
  await expect(page).toHaveURL(/\/library$/);
  await expect(page.getByRole("heading", { level: 1 })).toHaveText("Preset library");
  await page.getByLabel("Name", { exact: true }).fill(`Dusk glow ${s}`);
  await page.getByLabel("Tag", { exact: true }).selectOption("e2e");
  await page.getByRole("button", { name: "Filter" }).click();
  const table = page.getByTestId("library-table");
  await expect(table.locator("tbody tr")).toHaveCount(1);
  await expect(table.locator("tbody tr")).toContainText(["warm, e2e"]);
  await expect(table.locator("tbody tr")).toContainText(`Gyrfalcon ${s}`);
  await table.getByRole("link", { name: `Dusk glow ${s}` }).click();
  await expect(page.getByTestId("versions-table")).toContainText("From the Gyrfalcon");
  await expect(page.getByTestId("builds-using")).toContainText(`Gyrfalcon ${s}`);

  // Add it to a build with a 100-pixel blade, with the Ashfall font.
  await page.goto(`/builds/${to}/looks`);
  const panel = page.getByTestId("library-panel");
  await panel.getByLabel("Library preset and version").selectOption({ label: `Dusk glow ${s}, latest (v1)` });
  await panel.getByLabel("Font", { exact: true }).selectOption({ label: "Ashfall" });
  await panel.getByRole("button", { name: "Add to this build" }).click();
  await expect(page.getByTestId("library-ok")).toContainText("Added from the library");
  const cfg = (await sql.query("SELECT config FROM builds WHERE id = $1", [to])).rows[0].config;
  const added = cfg.presets.at(-1);
  expect(added.name).toBe(`Dusk glow ${s}`);
  expect(added.fontId).toBe("ashfall");
  // Scaled to the 100-pixel blade: the lockup's 22 px of 132 become 17.
  expect(added.looks.blade.layers.find((l: { kind: string; event?: string }) => l.kind === "hold" && l.event === "lockup").widthPixels).toBe(17);
  await expect(page.getByTestId(`preset-origin-${added.id}`)).toContainText(`Dusk glow ${s} v1`);
});

test("update available: read the library's changes, pick a side of the collision, apply", async ({ page, signIn, sql }) => {
  const s = stamp();
  const c = demoConfig();
  // This build changed the clash decay locally; the library's v2 changed it too.
  (c.presets[0].looks.blade.layers.find((l) => l.kind === "spark" && l.event === "clash") as { decayMs: number }).decayMs = 120;
  const id = await newBuild(sql, `Merlin ${s}`, { config: c });
  const lib = (await sql.query("SELECT id FROM library_presets WHERE name = 'Ashfall embers'")).rows[0].id;
  await sql.query("INSERT INTO build_preset_origins (build_id, preset_id, workshop_id, library_preset_id, library_version) SELECT $1, 'ashfall', workshop_id, $2, 1 FROM builds WHERE id = $1", [id, lib]);
  await signIn("demo-builder");

  await page.goto(`/builds/${id}`);
  await expect(page.getByTestId("overview-updates")).toContainText("Ashfall: Ashfall embers v1 → v2");
  await page.getByTestId("overview-updates").getByRole("link", { name: "See the changes on Looks" }).click();
  await expect(page.getByTestId("build-update-badge")).toContainText("Update available from the library (1 preset)");
  const update = page.getByTestId("update-available");
  await expect(update).toContainText("Update available: Ashfall — Ashfall embers v1 → v2");
  await expect(update.getByTestId("library-changes")).toContainText("layer 2 (drift) added");
  const conflicts = update.getByTestId("update-conflicts");
  await expect(conflicts.locator("fieldset")).toHaveCount(1);
  await conflicts.getByLabel(/This build's/).check();
  await update.getByRole("button", { name: "Apply v2 to Ashfall" }).click();
  await expect(page.getByTestId("library-ok")).toContainText("Updated to library version 2");
  await expect(page.getByTestId("update-available")).toHaveCount(0);
  const blade = (await sql.query("SELECT config FROM builds WHERE id = $1", [id])).rows[0].config.presets[0].looks.blade.layers;
  expect(blade.find((l: { kind: string }) => l.kind === "drift")).toMatchObject({ bandPixels: 18 });
  expect(blade.find((l: { kind: string; event?: string }) => l.kind === "spark" && l.event === "clash").decayMs).toBe(120);
  const rev = (await sql.query("SELECT message FROM config_revisions WHERE build_id = $1 ORDER BY number DESC LIMIT 1", [id])).rows[0];
  expect(rev.message).toMatch(/Ashfall embers v2/);
});

test("the owner compares versions, cannot delete a used one, dry-runs across builds and applies to the clean ones", async ({ page, signIn, sql }) => {
  const s = stamp();
  const token = await tokenFor(sql, "demo-owner", `lib-${s}`);
  const body = { ...bodyFromBuildPreset(demoConfig(), "glasswind")!.body, name: `Glass tide ${s}`, tags: ["cool"] };
  const made = await api(token, "POST", "/api/presets", { changelog: "First", preset: body });
  expect(made.status).toBe(201);
  const lib = made.body.presetId as string;
  const clean = await newBuild(sql, `Kite ${s}`);
  const released = await newBuild(sql, `Osprey ${s}`);
  for (const b of [clean, released]) expect((await api(token, "POST", `/api/builds/${b}/presets`, { libraryPresetId: lib, fontId: "glasswind", configVersion: 1 })).status).toBe(201);
  await sql.query("UPDATE builds SET status = 'released' WHERE id = $1", [released]);
  const v2 = structuredClone(body);
  (v2.looks["main-blade"].layers.find((l) => l.kind === "drift") as { speedPixelsPerSecond: number }).speedPixelsPerSecond = 12;
  expect((await api(token, "POST", `/api/presets/${lib}/versions`, { baseVersion: 1, changelog: "Slower drift", preset: v2 })).status).toBe(201);
  // A script reads the version back (its body is what it would publish again) and what changed.
  const read = await api(token, "GET", `/api/presets/${lib}/versions/2`);
  expect(read.body).toMatchObject({ version: 2, previousVersion: 1, changelog: "Slower drift", body: { name: body.name } });
  expect(read.body.changes).toContain("Main blade › layer 2 (drift): speed 30 → 12 px/s");
  // A stale publish and a preset with errors change nothing.
  expect((await api(token, "POST", `/api/presets/${lib}/versions`, { baseVersion: 1, changelog: "Stale", preset: v2 })).status).toBe(409);
  const bad = await api(token, "POST", `/api/presets/${lib}/versions`, { baseVersion: 2, changelog: "Bad", preset: { ...v2, looks: { "main-blade": { pixels: 0, layers: [] } } } });
  expect(bad.status).toBe(422);
  expect(Array.isArray(bad.body.diagnostics)).toBe(true);

  await signIn("demo-owner");
  await page.goto(`/library/${lib}`);
  await expect(page.getByTestId("version-changes")).toContainText("Main blade › layer 2 (drift): speed 30 → 12 px/s");
  await page.getByLabel("From", { exact: true }).selectOption("v2");
  await page.getByLabel("To", { exact: true }).selectOption("v1");
  await page.getByRole("button", { name: "Compare" }).click();
  await expect(page.getByTestId("version-changes")).toContainText("speed 12 → 30 px/s");

  await page.getByRole("button", { name: "Delete v1" }).click();
  await expect(page.getByTestId("preset-error")).toContainText(`Version 1 is used by Kite ${s}, Osprey ${s}`);

  await page.getByRole("button", { name: "Dry run" }).click();
  const report = page.getByTestId("rollout-report");
  await expect(report.getByRole("row", { name: new RegExp(`Kite ${s}`) })).toContainText("merges cleanly");
  await expect(report.getByRole("row", { name: new RegExp(`Osprey ${s}`) })).toContainText("released: never changed");
  await page.getByRole("button", { name: "Apply to the 1 clean build" }).click();
  await expect(page.getByTestId("rollout-report").getByRole("row", { name: new RegExp(`Kite ${s}`) })).toContainText("updated to v2");
  const versions = (await sql.query("SELECT b.name, o.library_version, b.config_version FROM build_preset_origins o JOIN builds b ON b.id = o.build_id WHERE o.library_preset_id = $1 ORDER BY b.name", [lib])).rows;
  expect(versions).toEqual([
    { name: `Kite ${s}`, library_version: 2, config_version: 3 },
    { name: `Osprey ${s}`, library_version: 1, config_version: 2 },
  ]);
});

test("export a preset file and import it; a file of another format is refused with its reason", async ({ page, signIn, sql }) => {
  const s = stamp();
  const token = await tokenFor(sql, "demo-builder", `lib-x-${s}`);
  const lib = (await sql.query("SELECT id FROM library_presets WHERE name = 'Tidebreak swell'")).rows[0].id;
  const doc = (await api(token, "GET", `/api/presets/${lib}/export`)).body;
  expect(doc.format).toBe("hiltbench.preset/1");
  await signIn("demo-builder");
  await page.goto("/library");
  await page.getByLabel("Preset file", { exact: true }).setInputFiles({ name: "swell.preset.json", mimeType: "application/json", buffer: Buffer.from(JSON.stringify({ ...doc, format: "hiltbench.preset/7" })) });
  await page.getByRole("button", { name: "Import" }).click();
  await expect(page.getByTestId("import-error")).toContainText('"hiltbench.preset/7"');
  await page.getByLabel("Preset file", { exact: true }).setInputFiles({ name: "swell.preset.json", mimeType: "application/json", buffer: Buffer.from(JSON.stringify({ ...doc, name: `Swell copy ${s}` })) });
  await page.getByRole("button", { name: "Import" }).click();
  await expect(page.getByTestId("import-ok")).toContainText(`Swell copy ${s}`);
  await page.getByTestId("import-ok").getByRole("link").click();
  await expect(page.getByRole("heading", { level: 1 })).toHaveText(`Swell copy ${s}`);
});

test("a library preset in the look editor on a stand-in rig: choose the pixels, edit, publish a version", async ({ page, signIn, sql }) => {
  const s = stamp();
  const token = await tokenFor(sql, "demo-builder", `lib-e-${s}`);
  const body = { ...bodyFromBuildPreset(demoConfig(), "ashfall")!.body, name: `Forge ${s}` };
  const made = await api(token, "POST", "/api/presets", { changelog: "First", preset: body });
  expect(made.status).toBe(201);
  const lib = made.body.presetId as string;
  await signIn("demo-builder");
  await page.goto(`/library/${lib}`);
  await page.getByRole("link", { name: "Edit in the look editor" }).click();
  await expect(page.getByRole("heading", { level: 1 })).toHaveText(`Edit Forge ${s}`);
  await page.getByLabel("Pixels, main blade (made on 132)").fill("100");
  await page.getByRole("button", { name: "Change the stand-in rig" }).click();
  await expect(page).toHaveURL(/px\.main-blade=100/);
  await expect(page.getByRole("region", { name: `Live preview of Forge ${s}` })).toBeVisible();
  // One preset only: nothing here could add a preset that publishing would then leave out.
  await expect(page.getByText("A library preset is one preset")).toBeVisible();
  for (const name of ["Add preset", "Duplicate", "Delete preset"]) await expect(page.getByRole("button", { name, exact: true })).toHaveCount(0);
  await page.getByLabel("Preset name").fill(`Forge ${s} II`);
  await page.getByLabel("What changed").fill("Renamed, made on a 100-pixel blade");
  await page.getByRole("button", { name: "Save", exact: true }).click();
  await expect(page.getByTestId("save-message")).toContainText("Published as version 2");
  const v2 = (await sql.query("SELECT body, changelog FROM library_versions WHERE preset_id = $1 AND version = 2", [lib])).rows[0];
  expect(v2.changelog).toBe("Renamed, made on a 100-pixel blade");
  expect(v2.body.name).toBe(`Forge ${s} II`);
  expect(v2.body.looks["main-blade"].pixels).toBe(100);
  expect(v2.body.looks["main-blade"].layers.find((l: { kind: string; event?: string }) => l.kind === "hold" && l.event === "lockup").widthPixels).toBe(17);
  // A second save from the same page builds on version 2; a stale one would be refused.
  await page.getByLabel("Preset name").fill(`Forge ${s} III`);
  await page.getByLabel("What changed").fill("Renamed again");
  await page.getByRole("button", { name: "Save", exact: true }).click();
  await expect(page.getByTestId("save-message")).toContainText("Published as version 3");
});

test("bad input at the library's API: oversized, hostile and newer files, a released build, a client; 4xx and nothing changed", async ({ sql }) => {
  const s = stamp();
  const builder = await tokenFor(sql, "demo-builder", `lib-b-${s}`);
  // Clients sign in by e-mail (no GitHub login): their token is stored as the app stores tokens.
  const client = `hbt_${randomBytes(32).toString("base64url")}`;
  await sql.query("INSERT INTO api_tokens (user_id, name, token_hash, prefix) SELECT id, $2, $3, $4 FROM users WHERE email = $1", [
    "client-one@example.test",
    `lib-c-${s}`,
    createHash("sha256").update(client).digest("hex"),
    client.slice(0, 10),
  ]);
  const count = async () => (await sql.query("SELECT (SELECT count(*) FROM library_presets)::int AS p, (SELECT count(*) FROM library_versions)::int AS v, (SELECT count(*) FROM build_preset_origins)::int AS o")).rows[0];
  const before = await count();
  const lib = (await sql.query("SELECT id FROM library_presets WHERE name = 'Tidebreak swell'")).rows[0].id;
  const doc = (await api(builder, "GET", `/api/presets/${lib}/export`)).body;

  const huge = await fetch(`${BASE_URL}/api/presets`, { method: "POST", headers: { Authorization: `Bearer ${builder}`, "Content-Type": "application/json" }, body: JSON.stringify({ ...doc, name: "Huge", notes: "x".repeat(1_100_000) }) });
  expect(huge.status).toBe(413);
  expect((await api(builder, "POST", "/api/presets", { ...doc, name: "Newer", format: "hiltbench.preset/2" })).status).toBe(422);
  const nul = await api(builder, "POST", "/api/presets", { ...doc, name: "Bad\u0000name" });
  expect(nul.status).toBe(400);
  expect(String(nul.body.error)).toMatch(/name/);
  const deep = await api(builder, "POST", "/api/presets", JSON.parse(`${"[".repeat(100)}${"]".repeat(100)}`));
  expect(deep.status).toBe(400);
  // A released build takes nothing from the library.
  const released = await newBuild(sql, `Osprey ${s}`, { status: "released" });
  const add = await api(builder, "POST", `/api/builds/${released}/presets`, { libraryPresetId: lib, fontId: "tidebreak", configVersion: 1 });
  expect(add.status).toBe(409);
  expect(String(add.body.error)).toMatch(/released/);
  // A client sees nothing of the library, whichever route.
  for (const [method, path] of [
    ["GET", "/api/presets"],
    ["GET", `/api/presets/${lib}`],
    ["GET", `/api/presets/${lib}/export`],
    ["GET", `/api/presets/${lib}/versions/1`],
    ["DELETE", `/api/presets/${lib}/versions/1`],
    ["POST", `/api/presets/${lib}/versions`],
    ["POST", `/api/presets/${lib}/rollout`],
  ] as const) {
    const r = await api(client, method, path, method === "GET" ? undefined : {});
    expect(r.status, `${method} ${path}`).toBe(403);
  }
  expect(await count()).toEqual(before);
});
