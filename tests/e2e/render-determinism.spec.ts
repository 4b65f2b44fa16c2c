// A downloaded header follows the config, not the build row (decision 008): changing a build's
// status and notes on its overview leaves the render API's bytes unchanged; saving a changed
// config through the API moves the "saved:" line to the new config_saved_at.
import { test, expect, buildIdByName, BASE_URL } from "./fixtures";
import { keepingBuild } from "./template-helpers";

const savedLine = (h: string) => /^ \* saved: .*$/m.exec(h)?.[0];

test("status and notes leave a rendered header's bytes alone; a config save moves its saved line", async ({ page, signIn, sql }) => {
  const kestrel = await buildIdByName(sql, "Kestrel");
  const row = async () => (await sql.query("SELECT status, hilt_notes, updated_at, config_saved_at FROM builds WHERE id = $1", [kestrel])).rows[0];
  const before = await row();
  await keepingBuild(sql, kestrel, async () => {
    try {
      await signIn("demo-builder");
      const render = async () => {
        const r = await page.request.get(`/api/builds/${kestrel}/render?template=generic-header`);
        expect(r.status()).toBe(200);
        return r.text();
      };
      const first = await render();
      expect(savedLine(first)).toBeDefined();

      await page.goto(`/builds/${kestrel}`);
      await page.getByLabel("Status").selectOption(before.status === "intake" ? "configuring" : "intake");
      await page.getByLabel("Hilt notes").fill(`${before.hilt_notes} Emitter shroud polished.`);
      await page.getByRole("button", { name: "Save details" }).click();
      await expect(page.getByRole("status").filter({ hasText: "Saved." })).toBeVisible();
      const edited = await row();
      expect(edited.updated_at.getTime()).toBeGreaterThan(before.updated_at.getTime());
      expect(edited.config_saved_at).toEqual(before.config_saved_at);
      expect(await render()).toBe(first);

      const got = await (await page.request.get(`/api/builds/${kestrel}/config`)).json();
      got.config.rig.power.brightnessCap = got.config.rig.power.brightnessCap === 0.55 ? 0.6 : 0.55;
      const put = await page.request.put(`/api/builds/${kestrel}/config`, { data: { config: got.config, version: got.version }, headers: { Origin: BASE_URL } });
      expect(put.status(), await put.text()).toBe(200);
      const saved = await row();
      expect(saved.config_saved_at.getTime()).toBeGreaterThan(before.config_saved_at.getTime());
      const second = await render();
      expect(savedLine(second)).not.toBe(savedLine(first));
      expect(savedLine(second)).toContain(saved.config_saved_at.toISOString().slice(0, 19));
    } finally {
      await sql.query("UPDATE builds SET status = $2, hilt_notes = $3 WHERE id = $1", [kestrel, before.status, before.hilt_notes]);
    }
  });
});
