// The release as people do it: a builder asks for a review, the reviewer approves; the builder
// opens the Release tab (the approved revision is chosen), ticks every bench-check item (the
// first by keyboard), releases with a note, sees the release in the history with its SHA-256,
// downloads the bundle and its SHA-256 is the recorded one; the client's e-mail is in the dev
// mailbox with a link to their handoff page. Then refusals: unknown item, wrong revision, an
// unapproved revision, a reviewer or client ticking or releasing — 4xx and nothing stored.
import { createHash } from "node:crypto";
import { readFileSync } from "node:fs";
import type { Page } from "@playwright/test";
import type pg from "pg";
import { demoConfigSmall } from "../../app/lib/config/demo";
import { test, expect, BASE_URL, signInRequest } from "./fixtures";

async function newBuild(sql: pg.Pool, name: string): Promise<string> {
  const cfg = JSON.stringify(demoConfigSmall());
  const r = await sql.query(
    `INSERT INTO builds (workshop_id, name, client_name, client_user_id, status, config, config_saved_at)
     SELECT workshop_id, $1, 'Client One', (SELECT id FROM users WHERE email = 'client-one@example.test'), 'configuring', $2, now() FROM builds WHERE name = 'Kestrel' ORDER BY created_at LIMIT 1 RETURNING id`,
    [name, cfg],
  );
  const id = r.rows[0].id;
  await sql.query("INSERT INTO config_revisions (build_id, workshop_id, number, config, created_at) SELECT id, workshop_id, config_version, config, config_saved_at FROM builds WHERE id = $1", [id]);
  return id;
}

async function switchTo(page: Page, signIn: (login: string) => Promise<void>, login: string) {
  await page.context().clearCookies();
  await signIn(login);
}

const stored = async (sql: pg.Pool, id: string) =>
  (
    await sql.query(
      "SELECT (SELECT count(*)::int FROM bench_check_ticks WHERE build_id = $1) AS ticks, (SELECT count(*)::int FROM releases WHERE build_id = $1) AS releases, (SELECT status FROM builds WHERE id = $1) AS status",
      [id],
    )
  ).rows[0];

test("approve, tick the bench check (by keyboard too), release, download the recorded bundle, the client is e-mailed", async ({ page, signIn, sql, playwright }) => {
  test.setTimeout(150_000);
  const name = `Wren ${Date.now()}`;
  const id = await newBuild(sql, name);
  try {
    // Nothing approved yet: the tab says so and points to Reviews.
    await signIn("demo-builder");
    await page.goto(`/builds/${id}/release`);
    await expect(page.getByTestId("release-none-approved")).toContainText("No revision of this build is approved yet");
    await expect(page.getByTestId("release-none-approved").getByRole("link", { name: /Reviews tab/ })).toBeVisible();

    // Refusals before approval change nothing.
    const before = await stored(sql, id);
    const api = await playwright.request.newContext({ baseURL: BASE_URL, extraHTTPHeaders: { Origin: BASE_URL } });
    await signInRequest(api, "demo-builder");
    const notApproved = await api.post(`/api/builds/${id}/releases`, { data: { revision: 1 } });
    expect(notApproved.status()).toBe(409);
    expect((await notApproved.json()).error).toMatch(/Revision 1 is not approved/);
    const unknown = await api.put(`/api/builds/${id}/revisions/1/bench-check`, { data: { item: "preset:nope:clash", ticked: true } });
    expect(unknown.status()).toBe(422);
    expect((await unknown.json()).error).toMatch(/no item 'preset:nope:clash'/);
    expect((await api.put(`/api/builds/${id}/revisions/7/bench-check`, { data: { item: "card:matches", ticked: true } })).status()).toBe(404);
    expect((await api.put(`/api/builds/${id}/revisions/x/bench-check`, { data: { item: "card:matches", ticked: true } })).status()).toBe(400);
    expect((await api.put(`/api/builds/${id}/revisions/1/bench-check`, { data: { item: "card:matches", ticked: "yes" } })).status()).toBe(400);
    for (const who of ["demo-reviewer", "client-one"]) {
      const other = await playwright.request.newContext({ baseURL: BASE_URL, extraHTTPHeaders: { Origin: BASE_URL } });
      await signInRequest(other, who);
      expect((await other.put(`/api/builds/${id}/revisions/1/bench-check`, { data: { item: "card:matches", ticked: true } })).status(), who).toBe(403);
      expect((await other.post(`/api/builds/${id}/releases`, { data: { revision: 1 } })).status(), who).toBe(403);
      await other.dispose();
    }
    expect(await stored(sql, id)).toEqual(before);

    // The builder asks for a review; the reviewer approves.
    await page.goto(`/builds/${id}/reviews`);
    await page.getByLabel(/Demo Reviewer/).check();
    await page.getByRole("button", { name: "Ask for review of revision 1" }).click();
    await expect(page.getByTestId("request-state")).toHaveText("In review");
    const reviewUrl = page.url();
    await switchTo(page, signIn, "demo-reviewer");
    await page.goto(reviewUrl);
    await page.getByRole("button", { name: "Approve revision 1" }).click();
    await expect(page.getByTestId("build-status")).toHaveText("Approved");
    // The reviewer reads the Release tab but cannot tick or release.
    await page.getByRole("navigation", { name: "Build sections" }).getByRole("link", { name: "Release" }).click();
    await expect(page.getByRole("heading", { name: "Bench check of revision 1" })).toBeVisible();
    await expect(page.getByRole("button", { name: "Release" })).toHaveCount(0);
    await expect(page.getByTestId("bench-item").first().getByRole("button")).toHaveCount(0);

    // The builder cannot mark the approved build released by hand on the overview.
    await switchTo(page, signIn, "demo-builder");
    await page.goto(`/builds/${id}`);
    await page.getByLabel("Status").selectOption("released");
    await page.getByRole("button", { name: "Save details" }).click();
    await expect(page.locator(".field-error").filter({ hasText: "released from its Release tab, after the bench check" })).toBeVisible();
    expect((await stored(sql, id)).status).toBe("approved");

    // The builder opens the Release tab: revision 1 is chosen, nothing is ticked, the button waits.
    await page.getByRole("navigation", { name: "Build sections" }).getByRole("link", { name: "Release" }).click();
    await expect(page.getByLabel("Revision", { exact: true })).toHaveValue("1");
    const items = page.getByTestId("bench-item");
    const total = await items.count();
    expect(total).toBeGreaterThan(20);
    const progress = page.getByTestId("bench-progress");
    await expect(progress).toHaveText(`0 of ${total} ticked`);
    const release = page.getByRole("button", { name: "Release", exact: true });
    await expect(release).toBeDisabled();
    await expect(page.getByTestId("release-blocked")).toContainText(`${total} of ${total} bench-check items are not ticked yet`);

    // The first item by keyboard: Tab reaches it, Space ticks it, and it saves at once.
    const first = items.first().getByRole("button");
    await first.focus();
    await page.keyboard.press("Space");
    await expect(first).toHaveAttribute("aria-pressed", "true");
    await expect(progress).toHaveText(`1 of ${total} ticked`);
    await expect(items.first()).toContainText("Ticked by Demo Builder");
    // Space on a ticked item unticks it; ticked again with Enter.
    await page.keyboard.press("Space");
    await expect(progress).toHaveText(`0 of ${total} ticked`);
    await page.keyboard.press("Enter");
    await expect(progress).toHaveText(`1 of ${total} ticked`);
    for (let i = 1; i < total; i++) {
      await items.nth(i).getByRole("button").click();
      await expect(progress).toHaveText(`${i + 1} of ${total} ticked`);
    }
    // A reload shows the ticks were saved.
    await page.reload();
    await expect(progress).toHaveText(`${total} of ${total} ticked`);

    // Release with a note.
    await expect(release).toBeEnabled();
    await page.getByLabel(/^Note/).fill("First handoff: two presets.");
    await release.click();
    await expect(page.getByTestId("release-done")).toContainText("Released as release 1");
    await expect(page.getByTestId("build-status")).toHaveText("Released");
    const row = page.getByTestId("release-row").first();
    await expect(row).toContainText("First handoff: two presets.");
    await expect(row).toContainText("Demo Builder");
    const recorded = (await row.getByTestId("release-sha256").textContent())!.trim();
    expect(recorded).toMatch(/^[0-9a-f]{64}$/);
    expect((await sql.query("SELECT bundle_sha256 FROM releases WHERE build_id = $1 AND number = 1", [id])).rows[0].bundle_sha256).toBe(recorded);

    // The download is the recorded bundle, byte for byte.
    const downloading = page.waitForEvent("download");
    await row.getByTestId("release-download").click();
    const download = await downloading;
    const bytes = readFileSync((await download.path())!);
    expect(createHash("sha256").update(bytes).digest("hex")).toBe(recorded);

    // The client's e-mail is in the development mailbox, with the link to their handoff page.
    await page.goto(`/dev/mailbox?to=${encodeURIComponent("client-one@example.test")}`);
    await expect
      .poll(
        async () => {
          await page.reload();
          return page.getByRole("link", { name: `Your saber is ready: ${name}` }).count();
        },
        { timeout: 20_000 },
      )
      .toBeGreaterThan(0);
    await page.getByRole("link", { name: `Your saber is ready: ${name}` }).first().click();
    await expect(page.getByTestId("mail-text")).toContainText("First handoff: two presets.");
    await expect(page.getByTestId("mail-text")).toContainText(`/handoff/${id}`);

    // The same bundle is not released twice: the button waits, and says why.
    await page.goto(`/builds/${id}/release`);
    await expect(page.getByTestId("release-blocked")).toContainText("already released with these choices, as release 1");
    await expect(page.getByRole("button", { name: "Release", exact: true })).toBeDisabled();

    // Releases are listed for scripts too.
    const list = await (await api.get(`/api/builds/${id}/releases`)).json();
    expect(list.releases).toHaveLength(1);
    expect(list.releases[0]).toMatchObject({ number: 1, revision: 1, sha256: recorded, bytes: bytes.length });
    await api.dispose();
  } finally {
    await sql.query("DELETE FROM builds WHERE id = $1", [id]);
  }
});

test("without JavaScript each tick is a plain form that posts and comes back; a release posted too early is refused with its reason", async ({ browser, sql }) => {
  const id = await newBuild(sql, `Wren no-js ${Date.now()}`);
  const context = await browser.newContext({ javaScriptEnabled: false, baseURL: BASE_URL });
  try {
    await sql.query("INSERT INTO review_requests (build_id, workshop_id, revision, template_label, rendered, state) SELECT id, workshop_id, 1, 'e2e', 'x', 'approved' FROM builds WHERE id = $1", [id]);
    await signInRequest(context.request, "demo-builder");
    const page = await context.newPage();
    await page.goto(`/builds/${id}/release`);
    const progress = page.getByTestId("bench-progress");
    const total = await page.getByTestId("bench-item").count();
    await expect(progress).toHaveText(`0 of ${total} ticked`);
    await page.getByTestId("bench-item").nth(2).getByRole("button").click();
    await expect(progress).toHaveText(`1 of ${total} ticked`);
    await expect(page.getByTestId("bench-item").nth(2)).toHaveAttribute("data-ticked", "1");
    // The Release button waits; a release posted anyway is refused with the reason, and nothing is stored.
    await expect(page.getByRole("button", { name: "Release", exact: true })).toBeDisabled();
    const r = await context.request.post(`/builds/${id}/release`, { form: { intent: "release", revision: "1" }, headers: { Origin: BASE_URL } });
    expect(r.status()).toBe(409);
    expect(await r.text()).toContain(`${total - 1} of ${total} bench-check items are not ticked yet`);
    expect((await sql.query("SELECT count(*)::int AS n FROM releases WHERE build_id = $1", [id])).rows[0].n).toBe(0);
  } finally {
    await context.close();
    await sql.query("DELETE FROM builds WHERE id = $1", [id]);
  }
});
