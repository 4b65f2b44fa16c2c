// Review as people do it: a builder asks for a review, the reviewer gets the e-mail (read in the
// development mailbox), follows its link, comments on a line and asks for changes; the builder
// follows the comment e-mail, replies and resolves; a new revision is saved and sent for review
// again, the reviewer approves, and the build is approved. Then bad input on the same pages.
import type { Page } from "@playwright/test";
import { test, expect, BASE_URL } from "./fixtures";
import type pg from "pg";

async function newBuild(sql: pg.Pool, name: string): Promise<string> {
  const r = await sql.query(
    `INSERT INTO builds (workshop_id, name, client_name, client_user_id, status, config, config_saved_at)
     SELECT workshop_id, $1, 'Client One', (SELECT id FROM users WHERE email = 'client-one@example.test'), 'configuring', config, now() FROM builds WHERE name = 'Kestrel' ORDER BY created_at LIMIT 1 RETURNING id`,
    [name],
  );
  const id = r.rows[0].id;
  await sql.query("INSERT INTO config_revisions (build_id, workshop_id, number, config, created_at) SELECT id, workshop_id, config_version, config, config_saved_at FROM builds WHERE id = $1", [id]);
  return id;
}

/** The newest message to `to` whose subject contains `subject`, once the sink has it. */
async function mailTo(sql: pg.Pool, to: string, subject: string): Promise<{ id: string; text_body: string }> {
  let row: { id: string; text_body: string } | undefined;
  await expect
    .poll(
      async () => {
        row = (await sql.query("SELECT id, text_body FROM mail_sink_messages WHERE $1 = ANY(envelope_to) AND subject LIKE $2 ORDER BY received_at DESC LIMIT 1", [to, `%${subject}%`])).rows[0];
        return Boolean(row);
      },
      { timeout: 20_000, message: `mail to ${to} about ${subject}` },
    )
    .toBe(true);
  return row!;
}

async function switchTo(page: Page, signIn: (login: string) => Promise<void>, login: string) {
  await page.context().clearCookies();
  await signIn(login);
}

test("request review → reviewer mail, comment, changes; builder replies and resolves; new revision approved", async ({ page, signIn, sql }) => {
  test.setTimeout(90_000);
  const name = `Kite ${Date.now()}`;
  const id = await newBuild(sql, name);
  try {
    // The builder asks the reviewer.
    await signIn("demo-builder");
    await page.goto(`/builds/${id}/reviews`);
    await page.getByLabel(/Demo Reviewer/).check();
    await page.getByLabel("Note (optional)").fill("First look at the Kite, please.");
    await page.getByRole("button", { name: "Ask for review of revision 1" }).click();
    await expect(page.getByTestId("request-state")).toHaveText("In review");
    await expect(page.getByTestId("build-status")).toHaveText("In review");

    // The reviewer reads the e-mail in the mailbox and follows its link.
    await switchTo(page, signIn, "demo-reviewer");
    const request = await mailTo(sql, "reviewer@ember-anvil.example.test", `Review requested: ${name}, revision 1`);
    await page.goto(`/dev/mailbox?to=${encodeURIComponent("reviewer@ember-anvil.example.test")}`);
    await page.getByRole("link", { name: `Review requested: ${name}, revision 1` }).first().click();
    await expect(page.getByTestId("mail-text")).toContainText("First look at the Kite");
    await page.getByTestId("mail-text").getByRole("link").click();
    await expect(page).toHaveURL(new RegExp(`/builds/${id}/reviews/[0-9a-f-]{36}$`));
    const reviewUrl = page.url();
    expect(request.text_body).toContain(reviewUrl);

    await page.getByRole("button", { name: "Comment on line 3", exact: true }).click();
    await page.getByRole("textbox", { name: "Comment on line 3", exact: true }).fill("Is this the right board profile?");
    await page.getByRole("button", { name: "Add comment" }).click();
    const thread = page.locator("#L3").getByTestId("thread");
    await expect(thread).toContainText("Is this the right board profile?");
    await page.getByLabel("Verdict note (optional)").fill("One question on line 3.");
    await page.getByRole("button", { name: "Ask for changes" }).click();
    await expect(page.getByTestId("request-state")).toHaveText("Changes requested");

    // The builder follows the comment e-mail, replies and resolves.
    await switchTo(page, signIn, "demo-builder");
    const comment = await mailTo(sql, "builder@ember-anvil.example.test", `New comment on ${name}, revision 1`);
    await mailTo(sql, "builder@ember-anvil.example.test", `Changes requested: ${name}, revision 1`);
    const link = /https?:\/\/\S+#comment-[0-9a-f-]+/.exec(comment.text_body)![0];
    await page.goto(link.replace(/^https?:\/\/[^/]+/, ""));
    const builderThread = page.locator("#L3").getByTestId("thread");
    await builderThread.getByRole("textbox", { name: "Reply" }).fill("Yes: the same profile as the Kestrel.");
    await builderThread.getByRole("button", { name: "Reply" }).click();
    await expect(builderThread).toContainText("Yes: the same profile as the Kestrel.");
    await builderThread.getByRole("button", { name: "Resolve" }).click();
    await expect(builderThread).toHaveAttribute("data-resolved", "true");
    await expect(page.getByTestId("build-status")).toHaveText("Configuring");

    // A new revision (brightness cap changed), sent for review again.
    const got = await (await page.request.get(`/api/builds/${id}/config`)).json();
    got.config.rig.power.brightnessCap = got.config.rig.power.brightnessCap === 0.5 ? 0.45 : 0.5;
    const put = await page.request.put(`/api/builds/${id}/config`, { data: { config: got.config, version: got.version }, headers: { Origin: BASE_URL } });
    expect(put.status(), await put.text()).toBe(200);
    await page.goto(`/builds/${id}/reviews`);
    await page.getByLabel(/Demo Reviewer/).check();
    await page.getByRole("button", { name: "Ask for review of revision 2" }).click();
    await expect(page.getByRole("heading", { name: "Revision 2" })).toBeVisible();
    // The model diff against revision 1 (none approved yet) lists the brightness change.
    await expect(page.getByRole("heading", { name: "Changes since revision 1" })).toBeVisible();
    await expect(page.getByTestId("review-model-diff").locator("li")).not.toHaveCount(0);
    // The resolved thread from revision 1 comes along (on its line, or listed as outdated).
    await expect(page.getByTestId("thread").filter({ hasText: "Is this the right board profile?" })).toContainText("made on revision 1");

    await switchTo(page, signIn, "demo-reviewer");
    const second = await mailTo(sql, "reviewer@ember-anvil.example.test", `Review requested: ${name}, revision 2`);
    await page.goto(/https?:\/\/\S+/.exec(second.text_body.split("Open the review: ")[1])![0].replace(/^https?:\/\/[^/]+/, ""));
    await page.getByRole("button", { name: "Approve revision 2" }).click();
    await expect(page.getByTestId("request-state")).toHaveText("Approved");
    await expect(page.getByTestId("build-status")).toHaveText("Approved");
    expect((await sql.query("SELECT status FROM builds WHERE id = $1", [id])).rows[0].status).toBe("approved");
  } finally {
    await sql.query("DELETE FROM builds WHERE id = $1", [id]);
  }
});

test("bad review input gets a clear 4xx and changes nothing", async ({ page, signIn, sql }) => {
  const id = await newBuild(sql, `Merlin ${Date.now()}`);
  try {
    await signIn("demo-builder");
    const post = (path: string, form: Record<string, string>) => page.request.post(path, { form, headers: { Origin: BASE_URL }, maxRedirects: 0 });
    const asked = await post(`/builds/${id}/reviews`, { intent: "request", reviewer: (await sql.query("SELECT id FROM users WHERE github_login = 'demo-reviewer'")).rows[0].id });
    expect(asked.status()).toBe(302);
    const reviewPath = asked.headers()["location"];
    const before = (await sql.query("SELECT (SELECT count(*)::int FROM review_comments) AS c, (SELECT count(*)::int FROM review_reviewers WHERE verdict IS NOT NULL) AS v")).rows[0];

    // The builder cannot approve.
    const approve = await post(reviewPath, { intent: "verdict", verdict: "approved" });
    expect(approve.status()).toBe(403);

    await page.context().clearCookies();
    await signIn("demo-reviewer");
    const lines = await page.request.get(reviewPath);
    expect(lines.status()).toBe(200);
    const noLine = await post(reviewPath, { intent: "comment", line: "100000", body: "x" });
    expect(noLine.status()).toBe(400);
    expect(await noLine.text()).toContain("there is no line 100000");
    const huge = await post(reviewPath, { intent: "comment", line: "1", body: "x".repeat(2 * 1024 * 1024) });
    expect(huge.status()).toBe(413);
    const badPath = await post(reviewPath, { intent: "comment", modelPath: "presets.500.name", body: "x" });
    expect(badPath.status()).toBe(400);

    // A verdict on a revision no longer in review.
    await sql.query("UPDATE builds SET config_version = config_version + 1 WHERE id = $1", [id]);
    const stale = await post(reviewPath, { intent: "verdict", verdict: "approved" });
    expect(stale.status()).toBe(409);

    // Clients see no reviews.
    await page.context().clearCookies();
    await signIn("client-one");
    expect((await page.request.get(reviewPath)).status()).toBe(403);

    const after = (await sql.query("SELECT (SELECT count(*)::int FROM review_comments) AS c, (SELECT count(*)::int FROM review_reviewers WHERE verdict IS NOT NULL) AS v")).rows[0];
    expect(after).toEqual(before);
  } finally {
    await sql.query("DELETE FROM builds WHERE id = $1", [id]);
  }
});

test("the overview refuses setting in review or approved by hand, and changes nothing", async ({ page, signIn, sql }) => {
  const id = await newBuild(sql, `Goshawk ${Date.now()}`);
  try {
    await signIn("demo-owner");
    await page.goto(`/builds/${id}`);
    for (const [value, says] of [
      ["approved", "approved by its reviewers' verdicts"],
      ["in-review", "goes into review when someone asks for a review"],
    ] as const) {
      await page.getByLabel("Status").selectOption(value);
      await page.getByRole("button", { name: "Save details" }).click();
      await expect(page.locator(".field-error").filter({ hasText: says })).toBeVisible();
      expect((await sql.query("SELECT status FROM builds WHERE id = $1", [id])).rows[0].status).toBe("configuring");
    }
  } finally {
    await sql.query("DELETE FROM builds WHERE id = $1", [id]);
  }
});
