// The SD card bundle as a builder meets it: the Bundle tab lists the card's files with sizes and
// SHA-256, reports names that clash in 8.3 mode (never merged) and blocks the download, picks an
// earlier revision, downloads the zip with a progress bar (read back here with JSZip against its
// manifest); then a card is checked in the browser: missing, extra and changed files, and a
// folder that matches. Every file is made here (synthesized sounds, zips built in the test).
import { createHash } from "node:crypto";
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import JSZip from "jszip";
import type pg from "pg";
import { synthFont } from "../../app/lib/audio/synth";
import { demoConfig } from "../../app/lib/config/demo";
import { buildZip } from "../../app/lib/fonts/zip-build";
import { expectAccessible } from "./a11y";
import { test, expect, A11Y_CHECK, BASE_URL } from "./fixtures";

test.describe.configure({ timeout: 120_000 });
const sha = (b: Uint8Array) => createHash("sha256").update(b).digest("hex");

/** A build of our own with revision 1 (other specs' edits of Kestrel do not meet ours), then Northlight's files as revision 2. */
async function buildWithFont(sql: pg.Pool, playwright: import("@playwright/test").PlaywrightWorkerArgs["playwright"], storageState: Awaited<ReturnType<import("@playwright/test").BrowserContext["storageState"]>>, name: string) {
  const ws = (await sql.query("SELECT workshop_id FROM builds WHERE name = 'Kestrel' LIMIT 1")).rows[0].workshop_id;
  const cfg = JSON.stringify(demoConfig());
  const b = (await sql.query("INSERT INTO builds (workshop_id, name, status, config) VALUES ($1, $2, 'configuring', $3) RETURNING id, config_saved_at", [ws, name, cfg])).rows[0];
  await sql.query("INSERT INTO config_revisions (build_id, workshop_id, number, config, created_at) VALUES ($1, $2, 1, $3, $4)", [b.id, ws, cfg, b.config_saved_at]);
  const sounds = synthFont(["hum", "ignite", "swing"], 98);
  const zip = buildZip([
    { name: "hum.wav", data: sounds[0].bytes },
    { name: "ignite.wav", data: sounds[1].bytes },
    // Two long names in a cue folder: both become LOWPITCH.WAV as 8.3 short names.
    { name: "swing/lowpitched-a.wav", data: sounds[2].bytes },
    { name: "swing/lowpitched-b.wav", data: sounds[3].bytes },
  ]);
  const api = await playwright.request.newContext({ baseURL: BASE_URL, extraHTTPHeaders: { Origin: BASE_URL }, storageState });
  const res = await api.post(`/api/builds/${b.id}/fonts/northlight/files`, { multipart: { files: { name: "northlight.zip", mimeType: "application/zip", buffer: Buffer.from(zip) } } });
  expect(res.status(), await res.text()).toBe(200);
  await api.dispose();
  return b.id as string;
}

test("a builder reads the card's files and findings, picks a revision and downloads the zip", async ({ page, signIn, sql, playwright }) => {
  await signIn("demo-builder");
  const id = await buildWithFont(sql, playwright, await page.context().storageState(), `Merlin ${Date.now()}`);
  await page.goto(`/builds/${id}`);
  await page.getByRole("navigation", { name: "Build sections" }).getByRole("link", { name: "Bundle" }).click();
  await expect(page).toHaveURL(new RegExp(`/builds/${id}/bundle$`));
  await expect(page.getByTestId("bundle-summary")).toContainText("2 (today's config)");
  const table = page.getByTestId("bundle-files");
  for (const f of ["northlight/hum.wav", "northlight/swing/lowpitched-a.wav", "wiring.svg", "handoff.html", "MANIFEST.txt"]) await expect(table.getByRole("cell", { name: f, exact: true })).toBeVisible();

  // 8.3 names: the two swing files clash after sanitising; reported, and the download waits.
  await page.getByLabel("Names on the card").selectOption("8.3");
  await page.getByRole("button", { name: "Show the card" }).click();
  await expect(page).toHaveURL(/names=8\.3/);
  const clash = page.getByTestId("bundle-findings").locator("li[data-code='name-clash']");
  await expect(clash).toContainText('both become "NORTHLIG/SWING/LOWPITCH.WAV"');
  await expect(page.getByRole("button", { name: "Download the card zip" })).toBeDisabled();
  await expect(page.locator("#bundle-blocked")).toContainText("cannot be built until this error is fixed");
  await page.getByText(/notes: names written differently on the card/).click();
  if (A11Y_CHECK) await expectAccessible(page, "with the 8.3 findings and notes open");

  // Revision 1 had no Northlight files yet.
  await page.getByLabel("Names on the card").selectOption("long");
  await page.getByLabel("Revision").selectOption("1");
  await page.getByRole("button", { name: "Show the card" }).click();
  await expect(page.getByTestId("bundle-summary")).toContainText("Revision1");
  await expect(table.getByRole("cell", { name: "northlight/hum.wav" })).toHaveCount(0);
  await expect(page.getByTestId("bundle-findings").locator("li[data-code='font-not-arrived']")).toContainText("Northlight");

  // Back to today's config on a 1 GB card, and download it with the progress bar.
  await page.getByLabel("Revision").selectOption("");
  await page.getByLabel("Card size").selectOption("1");
  await page.getByRole("button", { name: "Show the card" }).click();
  await expect(page.getByTestId("bundle-summary")).toContainText("of 1 GB (1,000,000,000 bytes, decimal as cards are sold)");
  // On a slow link the progress bar shows, and a cancelled download says so.
  const cdp = await page.context().newCDPSession(page);
  await cdp.send("Network.emulateNetworkConditions", { offline: false, latency: 20, downloadThroughput: 40 * 1024, uploadThroughput: -1 });
  await page.getByRole("button", { name: "Download the card zip" }).click();
  await expect(page.getByRole("progressbar", { name: "Downloading the card zip" })).toBeVisible();
  await page.getByRole("button", { name: "Cancel" }).click();
  await expect(page.getByRole("alert")).toHaveText("Download cancelled.");
  await cdp.send("Network.emulateNetworkConditions", { offline: false, latency: 0, downloadThroughput: -1, uploadThroughput: -1 });

  const listed = await table.locator("tbody tr").evaluateAll((rows) => rows.map((r) => [...r.querySelectorAll("td")].map((td) => td.textContent!.trim())));
  const downloading = page.waitForEvent("download");
  await page.getByRole("button", { name: "Download the card zip" }).click();
  const download = await downloading;
  expect(download.suggestedFilename()).toMatch(/^merlin-\d+-r2-card\.zip$/);
  await expect(page.getByRole("status").filter({ hasText: "Downloaded" })).toBeVisible();
  const bytes = readFileSync((await download.path())!);
  await expect(page.getByTestId("zip-sha256")).toHaveText(sha(bytes));

  // JSZip reads what we made: the page's list is the zip's list, and the manifest's hashes are right.
  const zip = await JSZip.loadAsync(bytes);
  const inZip = Object.values(zip.files).filter((f) => !f.dir).map((f) => f.name);
  expect(inZip).toEqual(listed.map((r) => r[0]));
  const manifest = (await zip.file("MANIFEST.txt")!.async("string")).trim().split("\n");
  expect(manifest[0]).toMatch(/^# Merlin \d+, revision 2, template generic-header v\d+: every file/);
  for (const line of manifest.slice(1)) {
    const [hash, size, name] = line.split("  ");
    const data = await zip.file(name)!.async("uint8array");
    expect([name, data.length, sha(data)]).toEqual([name, Number(size), hash]);
    const row = listed.find((r) => r[0] === name)!;
    expect([row[1], row[2]]).toEqual([Number(size).toLocaleString("en"), hash]);
  }
  expect(await zip.file("handoff.html")!.async("string")).toContain("Charging and the battery");
});

test("a card is checked in the browser: missing, extra and changed files; a matching folder", async ({ page, signIn, sql, playwright }) => {
  await signIn("demo-builder");
  const id = await buildWithFont(sql, playwright, await page.context().storageState(), `Hobby ${Date.now()}`);
  const zipRes = await page.request.get(`/api/builds/${id}/bundle`);
  expect(zipRes.status()).toBe(200);
  const bundle = await JSZip.loadAsync(await zipRes.body());
  const files = new Map<string, Uint8Array>();
  for (const f of Object.values(bundle.files)) if (!f.dir) files.set(f.name, await f.async("uint8array"));

  await page.goto(`/builds/${id}/bundle`);
  await page.getByRole("link", { name: "Check a card against this bundle" }).click();
  await expect(page).toHaveURL(new RegExp(`/builds/${id}/bundle/check\\?`));
  await expect(page.getByTestId("check-against")).toContainText(`revision 2, template generic-header`);
  // No request leaves the page while the card is read: the files stay on this computer.
  const sent: string[] = [];
  page.on("request", (r) => sent.push(r.url()));

  // A card as a zip: the readable copy is missing, notes.txt is extra, the hum's bytes changed
  // (same size) and the ignite sound was cut short (other size).
  const card = new JSZip();
  for (const [name, data] of files) {
    if (name === "readable-config.txt") continue;
    if (name === "northlight/hum.wav") {
      const changed = data.slice();
      changed[changed.length - 1] ^= 0xff;
      card.file(name, changed);
    } else if (name === "northlight/ignite.wav") card.file(name, data.slice(0, data.length - 100));
    else card.file(name, data);
  }
  card.file("notes.txt", "bring spare cell");
  card.file(".Trashes/501/old.wav", "x");
  // Deflated, so the page inflates entries with the browser's own DecompressionStream.
  const cardZip = await card.generateAsync({ type: "nodebuffer", compression: "DEFLATE" });
  await page.getByLabel("The card's files or a zip of them").setInputFiles({ name: "card.zip", mimeType: "application/zip", buffer: cardZip });
  const result = page.getByTestId("card-result");
  await expect(page.getByTestId("card-verdict")).toHaveText(`1 missing · 1 extra · 2 changed · ${files.size - 3} the same`);
  await expect(result.getByTestId("card-missing")).toContainText("readable-config.txt");
  await expect(result.getByTestId("card-extra")).toHaveText(/^notes\.txt/);
  const changed = result.getByTestId("card-changed");
  await expect(changed.getByRole("listitem").filter({ hasText: "northlight/hum.wav" })).toContainText("has the same size but other content");
  await expect(changed.getByRole("listitem").filter({ hasText: "northlight/ignite.wav" })).toContainText("bytes; the bundle's is");
  await expect(result).toContainText("Left out: 1 file(s) computers add to cards by themselves.");
  if (A11Y_CHECK) await expectAccessible(page, "with a card's differences listed");

  // Not a zip at all (a picture named .zip): said plainly, nothing crashes.
  const png = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13, 0x49, 0x48, 0x44, 0x52]);
  await page.getByLabel("The card's files or a zip of them").setInputFiles({ name: "card.zip", mimeType: "application/zip", buffer: png });
  await expect(page.getByRole("alert")).toContainText("Could not read the card's files: it is not a zip archive");

  // The same zip dragged from the desktop onto the drop area reads the same.
  const dropped = await page.evaluateHandle((bytes) => {
    const dt = new DataTransfer();
    dt.items.add(new File([new Uint8Array(bytes)], "card.zip", { type: "application/zip" }));
    return dt;
  }, [...cardZip]);
  await page.getByTestId("card-drop").dispatchEvent("dragover", { dataTransfer: dropped });
  await page.getByTestId("card-drop").dispatchEvent("drop", { dataTransfer: dropped });
  await expect(page.getByTestId("card-verdict")).toHaveText(`1 missing · 1 extra · 2 changed · ${files.size - 3} the same`);

  // The card's folder as the computer shows it (its own top folder name), every file intact.
  const dir = mkdtempSync(path.join(tmpdir(), "hb-card-"));
  try {
    const root = path.join(dir, "SDCARD");
    for (const [name, data] of files) {
      mkdirSync(path.dirname(path.join(root, name)), { recursive: true });
      writeFileSync(path.join(root, name), data);
    }
    await page.getByLabel("The card's folder").setInputFiles(root);
    await expect(page.getByTestId("card-verdict")).toHaveText(`The card matches the bundle: all ${files.size} files are there and the same.`);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
  expect(sent.filter((u) => u.startsWith(BASE_URL) && !/\.(js|css|woff2?)(\?|$)/.test(u))).toEqual([]);
});
