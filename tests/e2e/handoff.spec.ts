// The client's side as a client does it (decision 023): sign in on /login with an e-mailed code
// read in the development mailbox, land on their builds, open one; before a release it says
// where the build is; after one (a release row made here from the builder's real download) it
// shows the controls, the presets with a moving preview, the cell cautions, and the card zip,
// whose SHA-256 is the page's. Another client finds nothing; the one-time link signs in; a wrong
// code is refused with its reason.
import { createHash } from "node:crypto";
import { readFile } from "node:fs/promises";
import type { Page } from "@playwright/test";
import type pg from "pg";
import { test, expect, BASE_URL, signInRequest } from "./fixtures";

const CLIENT = "client-one@example.test";

/** A build of client one's of its own (a copy of the Kestrel), so its release disturbs no other spec. */
async function clientBuild(sql: pg.Pool, name: string): Promise<string> {
  const r = await sql.query(
    `INSERT INTO builds (workshop_id, name, client_name, client_user_id, status, config, config_saved_at)
     SELECT workshop_id, $1, 'Client One', (SELECT id FROM users WHERE email = $2), 'configuring', config, now() FROM builds WHERE name = 'Kestrel' ORDER BY created_at LIMIT 1 RETURNING id`,
    [name, CLIENT],
  );
  const id = r.rows[0].id;
  await sql.query("INSERT INTO config_revisions (build_id, workshop_id, number, config, created_at) SELECT id, workshop_id, config_version, config, config_saved_at FROM builds WHERE id = $1", [id]);
  return id;
}

/** The newest sign-in mail to `to` that arrived after `since`, once the sink has it. */
async function signInMail(sql: pg.Pool, to: string, since: Date): Promise<string> {
  let id: string | undefined;
  await expect
    .poll(
      async () => {
        id = (await sql.query("SELECT id FROM mail_sink_messages WHERE $1 = ANY(envelope_to) AND subject LIKE 'Your Hiltbench sign-in code%' AND received_at >= $2 ORDER BY received_at DESC LIMIT 1", [to, since])).rows[0]?.id;
        return Boolean(id);
      },
      { timeout: 20_000, message: `sign-in mail to ${to}` },
    )
    .toBe(true);
  return id!;
}

/** On /login: ask for a code as a client, and read the code and link from the mailbox page. */
async function askForCode(page: Page, sql: pg.Pool, email = CLIENT, start = "/login"): Promise<{ code: string; link: string }> {
  const since = new Date(Date.now() - 2000);
  await page.goto(start);
  await expect(page).toHaveURL(/\/login(\?|$)/);
  const clients = page.getByRole("region", { name: "Clients: sign in with your e-mail" });
  await clients.getByLabel("Your e-mail address").fill(email);
  await clients.getByRole("button", { name: "E-mail me a code" }).click();
  await expect(page).toHaveURL(/\/login\/code$/);
  await expect(page.getByRole("status")).toHaveText("If this address belongs to a Hiltbench client, a code is on its way. It works for 10 minutes.");
  const id = await signInMail(sql, email, since);
  const codePage = page.url();
  await page.goto(`/dev/mailbox/${id}`);
  const text = (await page.getByTestId("mail-text").textContent()) ?? "";
  const code = /Your sign-in code is (\d{6})/.exec(text)?.[1];
  const link = /(http\S+\/login\/link\?t=\S+)/.exec(text)?.[1];
  expect(code && link, text).toBeTruthy();
  await page.goto(codePage);
  return { code: code!, link: link! };
}

test("a client signs in with an e-mailed code, follows their build to its release, and downloads the card", async ({ page, sql, playwright, pageErrors }, testInfo) => {
  void pageErrors;
  const name = `Kestrel handoff ${Date.now()}`;
  const id = await clientBuild(sql, name);
  const builder = await playwright.request.newContext({ baseURL: BASE_URL, extraHTTPHeaders: { Origin: BASE_URL } });
  try {
    const { code } = await askForCode(page, sql);
    await page.getByLabel("The 6-digit code from the e-mail").fill(code);
    await page.getByRole("button", { name: "Sign in" }).click();
    await expect(page).toHaveURL(/\/handoff$/);
    await expect(page.getByRole("heading", { name: "Your builds" })).toBeVisible();
    await expect(page.getByRole("link", { name: "Harrier" })).toHaveCount(0);

    // Before a release: where the build is, and that the workshop will write.
    await page.getByRole("link", { name }).click();
    await expect(page.getByRole("heading", { name, level: 1 })).toBeVisible();
    await expect(page.getByTestId("handoff-stage")).toContainText("Being set up");
    await expect(page.getByTestId("handoff-not-released")).toContainText("the workshop e-mails you");
    await expect(page.getByTestId("handoff-download")).toHaveCount(0);

    // The workshop releases it: the builder's real download gives the row's checksum and size.
    await signInRequest(builder, "demo-builder");
    const plan = await (await builder.get(`/api/builds/${id}/bundle?revision=1&names=long&card=32&check=1`)).json();
    const zipRes = await builder.get(`/api/builds/${id}/bundle?revision=1&template=${encodeURIComponent(plan.template.ref)}&names=long&card=32`);
    expect(zipRes.status()).toBe(200);
    const zip = await zipRes.body();
    const sha = createHash("sha256").update(zip).digest("hex");
    await sql.query(
      "INSERT INTO releases (build_id, workshop_id, number, revision, template_ref, template_version, name_mode, card_gb, bundle_sha256, bundle_bytes, note) SELECT id, workshop_id, 1, 1, $2, $5, 'long', 32, $3, $4, 'Charge it fully before the first use.' FROM builds WHERE id = $1",
      [id, plan.template.ref, sha, zip.length, plan.template.version],
    );

    await page.reload();
    await expect(page.getByTestId("handoff-stage")).toContainText("Ready");
    await expect(page.getByText("Charge it fully before the first use.")).toBeVisible();
    // Controls in plain words (the same words as handoff.html on the card).
    const controls = page.getByTestId("handoff-controls");
    await expect(controls.getByRole("cell", { name: "Light the blade" })).toBeVisible();
    // Presets with their fonts, and a preview that moves.
    const presets = page.getByTestId("handoff-presets").getByRole("button");
    expect(await presets.count()).toBeGreaterThan(1);
    await expect(presets.first()).toContainText("sound font");
    await presets.nth(1).click();
    await expect(presets.nth(1)).toHaveAttribute("aria-pressed", "true");
    const preview = page.getByTestId("handoff-preview-of").locator("section[data-frames-drawn]");
    const frames = async () => Number(await preview.getAttribute("data-frames-drawn"));
    const first = await frames();
    await expect.poll(frames, { message: "the preview keeps drawing" }).toBeGreaterThan(first + 5);
    await page.getByRole("button", { name: "Ignite" }).click();
    await expect(page.getByText("Blade lit")).toBeVisible();
    await page.getByRole("button", { name: "Clash" }).click();
    // The cell cautions, deferring to the maker's data and local rules.
    await expect(page.getByTestId("safety-cautions")).toContainText("The cell maker's data sheet, local rules and a qualified person");
    // Nothing of the workshop's: no revisions, reviews or templates.
    await expect(page.getByText(/revision|review|template/i)).toHaveCount(0);

    // The card zip: its SHA-256 is the one the page shows.
    const shown = (await page.getByTestId("handoff-sha256").textContent())?.trim();
    expect(shown).toBe(sha);
    await expect(page.getByTestId("handoff-size")).toContainText(`${zip.length.toLocaleString("en-GB")} bytes`);
    const [download] = await Promise.all([page.waitForEvent("download"), page.getByTestId("handoff-download").click()]);
    const file = await readFile((await download.path())!);
    expect(createHash("sha256").update(file).digest("hex")).toBe(shown);
    expect(download.suggestedFilename()).toMatch(/release-1\.zip$/);

    // The client's other ways to a bundle are closed: another revision, or the general route.
    expect((await page.request.get(`/api/builds/${id}/release-bundle?revision=1`)).status()).toBe(400);
    expect((await page.request.get(`/api/builds/${id}/bundle?revision=1`)).status()).toBe(403);
    // The workshop's table sends the client back here.
    await page.goto("/builds");
    await expect(page).toHaveURL(/\/handoff$/);
    testInfo.annotations.push({ type: "release", description: sha });

    // A second client finds neither the page nor the card.
    const other = await page.context().browser()!.newContext({ baseURL: BASE_URL });
    try {
      const otherPage = await other.newPage();
      const { code: code2 } = await askForCode(otherPage, sql, "client-two@example.test");
      await otherPage.getByLabel("The 6-digit code from the e-mail").fill(code2);
      await otherPage.getByRole("button", { name: "Sign in" }).click();
      await expect(otherPage).toHaveURL(/\/handoff$/);
      await expect(otherPage.getByRole("link", { name })).toHaveCount(0);
      expect((await otherPage.goto(`/handoff/${id}`))?.status()).toBe(404);
      const refused = await otherPage.request.get(`/api/builds/${id}/release-bundle`);
      expect(refused.status()).toBe(404);
      expect((await refused.json()).error).toMatch(/No build with this id/);
    } finally {
      await other.close();
    }
  } finally {
    await builder.dispose();
    await sql.query("DELETE FROM builds WHERE id = $1", [id]);
  }
});

test("the one-time link signs the client in, once, on the sheet they were sent to", async ({ page, sql, pageErrors }) => {
  void pageErrors;
  // A release e-mail's link to the sheet, opened signed out: sign-in first, then the sheet.
  const kestrel = (await sql.query("SELECT id FROM builds WHERE name = 'Kestrel' ORDER BY created_at LIMIT 1")).rows[0].id as string;
  const { link } = await askForCode(page, sql, CLIENT, `/handoff/${kestrel}`);
  await page.goto(link);
  await expect(page).toHaveURL(new RegExp(`/handoff/${kestrel}$`));
  await expect(page.getByRole("heading", { name: "Kestrel", level: 1 })).toBeVisible();
  // Opened again: used, said so, with a 4xx.
  const again = await page.goto(link);
  expect(again?.status()).toBe(410);
  await expect(page.getByRole("alert")).toHaveText("This code or link was already used to sign in. Ask for a new code if you need to sign in again.");
});

test("a wrong code, a malformed address and a link from nowhere are refused with their reasons; an unknown address gets the same answer and no mail", async ({ page, sql, pageErrors }) => {
  void pageErrors;
  const { code } = await askForCode(page, sql);
  const wrong = code === "000000" ? "111111" : "000000";
  await page.getByLabel("The 6-digit code from the e-mail").fill(wrong);
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByRole("alert")).toHaveText("That code is not right. Check the e-mail and try again (4 tries left).");
  await expect(page).toHaveURL(/\/login\/code$/);
  // The page's own status for it is a 400.
  const direct = await page.request.post("/login/code", { form: { intent: "verify", code: wrong }, headers: { Origin: BASE_URL }, maxRedirects: 0 });
  expect(direct.status()).toBe(400);

  // A malformed address: the reason, and no mail.
  const newCode = page.getByRole("region", { name: "Ask for a new code" });
  await newCode.getByLabel("Your e-mail address").fill("client-one@");
  await newCode.getByLabel("Your e-mail address").evaluate((el) => el.removeAttribute("type")); // past the browser's own check
  await newCode.getByRole("button", { name: "E-mail me a code" }).click();
  await expect(page.getByRole("alert")).toHaveText("Type an e-mail address such as name@example.com.");

  // An address that is no client's: the same words as for a client, and no mail.
  const since = new Date(Date.now() - 2000);
  await page.goto("/login");
  const clients = page.getByRole("region", { name: "Clients: sign in with your e-mail" });
  await clients.getByLabel("Your e-mail address").fill("stranger@example.test");
  await clients.getByRole("button", { name: "E-mail me a code" }).click();
  await expect(page.getByRole("status")).toHaveText("If this address belongs to a Hiltbench client, a code is on its way. It works for 10 minutes.");
  await page.waitForTimeout(1500); // the outbox would have it by now; the sink a moment later
  const queued = await sql.query("SELECT (SELECT count(*)::int FROM mail_outbox WHERE to_address = $1) AS o, (SELECT count(*)::int FROM mail_sink_messages WHERE $1 = ANY(envelope_to) AND received_at >= $2) AS s", ["stranger@example.test", since]);
  expect(queued.rows[0]).toEqual({ o: 0, s: 0 });

  expect((await page.goto("/login/link?t=made-up"))?.status()).toBe(400);
  await expect(page.getByRole("alert")).toHaveText("This sign-in link is not one Hiltbench sent, or it was cut short. Ask for a new code.");
});

test("a workshop member previews what the client sees, read-only", async ({ page, signIn, sql }) => {
  await signIn("demo-builder");
  const kestrel = (await sql.query("SELECT id FROM builds WHERE name = 'Kestrel' ORDER BY created_at LIMIT 1")).rows[0].id as string;
  await page.goto(`/builds/${kestrel}`);
  await page.getByRole("link", { name: "Preview the client's handoff" }).click();
  await expect(page).toHaveURL(new RegExp(`/handoff/${kestrel}$`));
  await expect(page.getByTestId("handoff-preview")).toHaveText("Preview: this is what the client sees (read-only).");
  await expect(page.getByRole("heading", { name: "Kestrel", level: 1 })).toBeVisible();
  await expect(page.getByRole("button", { name: /save|edit|delete/i })).toHaveCount(0);
  await page.getByRole("link", { name: "Back to the workshop" }).click();
  await expect(page).toHaveURL(/\/builds$/);
});
