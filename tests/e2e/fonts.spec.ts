// A builder receives a client's font: picks a zip of WAVs on the Fonts tab, watches the progress
// bar, reads the report and listens to a cue; a hostile zip and a cancelled upload change nothing.
// The files are generated here (synthesized sounds, zips built byte by byte).
import { synthFont } from "../../app/lib/audio/synth";
import { buildZip } from "../../app/lib/fonts/zip-build";
import { test, expect, BASE_URL } from "./fixtures";

// Uploads go through a throttled link on purpose (to see the progress bar); give them room.
test.describe.configure({ timeout: 90_000 });

async function freshBuild(sql: import("pg").Pool, name: string) {
  const src = await sql.query("SELECT workshop_id, config FROM builds WHERE name = 'Kestrel' ORDER BY created_at LIMIT 1");
  const r = await sql.query("INSERT INTO builds (workshop_id, name, status, config) VALUES ($1, $2, 'configuring', $3) RETURNING id", [src.rows[0].workshop_id, name, JSON.stringify(src.rows[0].config)]);
  return r.rows[0].id as string;
}

const state = async (sql: import("pg").Pool, id: string) => {
  const b = await sql.query("SELECT config_version, config FROM builds WHERE id = $1", [id]);
  const u = await sql.query("SELECT count(*)::int AS n FROM font_uploads WHERE build_id = $1", [id]);
  return { version: b.rows[0].config_version, northlight: b.rows[0].config.fonts.find((f: { id: string }) => f.id === "northlight"), uploads: u.rows[0].n };
};

test("a builder uploads a zip of WAVs with progress, reads the report and plays a cue", async ({ page, signIn, sql }) => {
  const id = await freshBuild(sql, `Cinderhawk ${Date.now()}`);
  await signIn("demo-builder");
  await page.goto(`/builds/${id}`);
  await expect(page.getByTestId("arrival-Northlight")).toContainText("promised, still to come");
  await page.getByRole("link", { name: "Fonts", exact: true }).first().click();
  await expect(page).toHaveURL(new RegExp(`/builds/${id}/fonts$`));
  const section = page.getByTestId("font-northlight");
  await expect(section.getByText("Promised")).toBeVisible();

  // About 1.5 MB of sound, sent through a throttled link so the progress bar can be seen.
  const files = synthFont(["hum", "swing", "clash", "blast", "ignite", "retract", "lockup", "drag"], 130.8);
  const zip = buildZip(files.map((f) => ({ name: `Northlight/${f.name}`, data: f.bytes, deflate: true })));
  const cdp = await page.context().newCDPSession(page);
  await cdp.send("Network.emulateNetworkConditions", { offline: false, latency: 20, downloadThroughput: -1, uploadThroughput: 400 * 1024 });
  await section.getByLabel("Font files for Northlight").setInputFiles({ name: "northlight.zip", mimeType: "application/zip", buffer: zip });
  await expect(section.getByRole("progressbar", { name: "Uploading Northlight" })).toBeVisible();
  await expect(section.getByRole("status")).toHaveText("Stored and checked.", { timeout: 30_000 });
  await cdp.send("Network.emulateNetworkConditions", { offline: false, latency: 0, downloadThroughput: -1, uploadThroughput: -1 });

  await expect(section.getByText("Arrived", { exact: true })).toBeVisible();
  await expect(section.getByTestId("cue-swing")).toHaveText("swing ×2");
  await expect(section.getByText("Missing: boot, name")).toBeVisible();
  await expect(section.getByRole("row", { name: /ignite\.wav.*0\.80 s.*44\.1 kHz · 16-bit · mono/ })).toBeVisible();
  expect((await state(sql, id)).northlight).toMatchObject({ status: "received", igniteMs: 800 });

  // Listen: the player streams the file through the authorised route, with ranges.
  const player = section.getByLabel("Play ignite.wav");
  const played = await player.evaluate(async (a: HTMLAudioElement) => {
    a.muted = true;
    await a.play();
    await new Promise((r) => setTimeout(r, 300));
    return a.currentTime;
  });
  expect(played).toBeGreaterThan(0);
  const src = await player.getAttribute("src");
  const part = await page.request.get(src!, { headers: { Range: "bytes=0-11" } });
  expect(part.status()).toBe(206);
  expect(part.headers()["content-range"]).toMatch(/^bytes 0-11\/\d+$/);
  expect((await part.body()).toString("latin1")).toMatch(/^RIFF....WAVE$/s);

  await page.goto(`/builds/${id}`);
  await expect(page.getByTestId("arrival-Northlight")).toContainText("arrived");

  // The card zip holds the new font's files, and the same inputs give the same bytes.
  const first = await page.request.get(`/api/builds/${id}/bundle`);
  expect(first.status()).toBe(200);
  expect(first.headers()["content-type"]).toBe("application/zip");
  const again = await page.request.get(`/api/builds/${id}/bundle`);
  expect((await again.body()).equals(await first.body())).toBe(true);
  const plan = await (await page.request.get(`/api/builds/${id}/bundle?check=1`)).json();
  expect(plan.files.map((f: { path: string }) => f.path)).toContain("northlight/ignite.wav");
});

test("a hostile zip is refused with its reason and a cancelled upload stores nothing", async ({ page, signIn, sql }) => {
  const id = await freshBuild(sql, `Emberkite ${Date.now()}`);
  const before = await state(sql, id);
  await signIn("demo-builder");
  await page.goto(`/builds/${id}/fonts`);
  const section = page.getByTestId("font-northlight");

  const hum = synthFont(["hum"], 120)[0].bytes;
  const evil = buildZip([
    { name: "hum.wav", data: hum },
    { name: "../../escape.wav", data: hum },
  ]);
  await section.getByLabel("Font files for Northlight").setInputFiles({ name: "northlight.zip", mimeType: "application/zip", buffer: evil });
  await expect(section.getByRole("alert")).toContainText('climbs out of its folder with ".."');
  expect(await state(sql, id)).toEqual(before);

  const big = buildZip(Array.from({ length: 6 }, (_, i) => ({ name: `hum-${i}.wav`, data: synthFont(["hum"], 100 + i * 7)[0].bytes })));
  const cdp = await page.context().newCDPSession(page);
  await cdp.send("Network.emulateNetworkConditions", { offline: false, latency: 20, downloadThroughput: -1, uploadThroughput: 50 * 1024 });
  await section.getByLabel("Font files for Northlight").setInputFiles({ name: "northlight.zip", mimeType: "application/zip", buffer: big });
  await expect(section.getByRole("progressbar")).toBeVisible();
  await section.getByRole("button", { name: "Cancel" }).click();
  await expect(section.getByRole("alert")).toHaveText("Upload cancelled; nothing was stored.");
  await cdp.send("Network.emulateNetworkConditions", { offline: false, latency: 0, downloadThroughput: -1, uploadThroughput: -1 });
  await page.waitForTimeout(500);
  expect(await state(sql, id)).toEqual(before);
});

test("a reviewer sees the fonts but cannot upload; the API refuses with 403", async ({ page, signIn, sql, playwright }) => {
  const id = await freshBuild(sql, `Ashwing ${Date.now()}`);
  await signIn("demo-reviewer");
  await page.goto(`/builds/${id}/fonts`);
  await expect(page.getByTestId("font-ashfall")).toBeVisible();
  await expect(page.getByLabel("Font files for Northlight")).toHaveCount(0);
  const api = await playwright.request.newContext({ baseURL: BASE_URL, extraHTTPHeaders: { Origin: BASE_URL }, storageState: await page.context().storageState() });
  const res = await api.post(`/api/builds/${id}/fonts/northlight/files`, { multipart: { files: { name: "hum.wav", mimeType: "audio/wav", buffer: Buffer.from(synthFont(["hum"], 120)[0].bytes) } } });
  expect(res.status()).toBe(403);
  await api.dispose();
  expect((await state(sql, id)).uploads).toBe(0);
});

test("a builder drags WAV files onto a font and they are stored and checked", async ({ page, signIn, sql }) => {
  const id = await freshBuild(sql, `Cinderhawk drop ${Date.now()}`);
  await signIn("demo-builder");
  await page.goto(`/builds/${id}/fonts`);
  const section = page.getByTestId("font-northlight");
  const files = synthFont(["hum", "swing", "clash", "ignite", "retract"], 130.8);
  // What the browser hands the page when files from the desktop are dropped: a DataTransfer.
  const data = await page.evaluateHandle(
    (list) => {
      const dt = new DataTransfer();
      for (const f of list) dt.items.add(new File([new Uint8Array(f.bytes)], f.name, { type: "audio/wav" }));
      return dt;
    },
    files.map((f) => ({ name: f.name, bytes: [...f.bytes] })),
  );
  const zone = section.getByTestId("drop-northlight");
  await zone.dispatchEvent("dragover", { dataTransfer: data });
  await zone.dispatchEvent("drop", { dataTransfer: data });
  await expect(section.getByRole("status")).toHaveText("Stored and checked.", { timeout: 30_000 });
  await expect(section.getByText("Arrived", { exact: true })).toBeVisible();
  await expect(section.getByTestId("cue-swing")).toHaveText("swing ×2");
  expect(await state(sql, id)).toMatchObject({ uploads: 1, northlight: { status: "received" } });
});
