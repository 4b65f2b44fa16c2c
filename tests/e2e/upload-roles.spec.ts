// A client (and a reviewer, in fonts.spec.ts) may see a build's fonts but not send files: the page
// offers no upload, and the API refuses a real multipart upload with 403 before reading it, so
// nothing is stored and the build's config does not move.
import { synthFont } from "../../app/lib/audio/synth";
import { buildZip } from "../../app/lib/fonts/zip-build";
import { test, expect, BASE_URL, buildIdByName } from "./fixtures";

test("a client cannot upload a font's files: no picker, and the API answers 403 with nothing stored", async ({ page, signIn, sql, playwright }) => {
  const id = await buildIdByName(sql, "Kestrel");
  const state = async () => ({
    version: (await sql.query("SELECT config_version FROM builds WHERE id = $1", [id])).rows[0].config_version,
    uploads: (await sql.query("SELECT count(*)::int AS n FROM font_uploads WHERE build_id = $1", [id])).rows[0].n,
    stored: (await sql.query("SELECT count(*)::int AS n FROM stored_files")).rows[0].n,
  });
  const before = await state();
  await signIn("client-one");
  await page.goto(`/builds/${id}/fonts`);
  await expect(page.getByTestId("font-northlight")).toBeVisible();
  await expect(page.getByLabel("Font files for Northlight")).toHaveCount(0);

  const api = await playwright.request.newContext({ baseURL: BASE_URL, extraHTTPHeaders: { Origin: BASE_URL }, storageState: await page.context().storageState() });
  const sounds = synthFont(["hum", "clash"], 87.3);
  const zip = buildZip(sounds.map((s) => ({ name: `Northlight/${s.name}`, data: s.bytes, deflate: true })));
  for (const files of [
    { name: "northlight.zip", mimeType: "application/zip", buffer: zip },
    { name: "hum.wav", mimeType: "audio/wav", buffer: Buffer.from(sounds[0].bytes) },
  ]) {
    const res = await api.post(`/api/builds/${id}/fonts/northlight/files`, { multipart: { files } });
    expect(res.status()).toBe(403);
    expect((await res.json()).error).toMatch(/Your role \(client\) does not allow this/);
  }
  await api.dispose();
  expect(await state()).toEqual(before);
});
