// Reviews on a real PostgreSQL: who may do what, what state allows it, the build's status
// following the verdicts (and a save sending it back), comments carried onto a later revision's
// unchanged lines, the e-mails each step puts in the outbox, and bad input changing nothing.
import { sql, type Kysely } from "kysely";
import { beforeAll, describe, expect, it } from "vitest";
import type { Database, Role } from "~/lib/db/types";
import type { MailMessage } from "~/lib/mail/messages";
import { commentsUpTo, getReviewRequest, renderedOf } from "~/lib/repo/reviews.server";
import { saveConfig } from "~/lib/repo/builds.server";
import { addComment, giveVerdict, requestReview, setThreadResolved, type Actor, type ReviewDeps } from "~/lib/review/service.server";
import { threadsFor } from "~/lib/review/threads";
import { seed } from "../../db/seed";
import { freshDb, hasDatabase } from "./db";

const statusOf = (e: unknown) => (e as { init?: { status?: number } }).init?.status;
async function failsWith(p: Promise<unknown>, status: number, message?: RegExp) {
  const e = await p.then(
    () => undefined,
    (err) => err,
  );
  expect(statusOf(e), String((e as { data?: { message?: string } })?.data?.message ?? e)).toBe(status);
  if (message) expect((e as { data: { message: string } }).data.message).toMatch(message);
}

describe.runIf(hasDatabase)("reviews (PostgreSQL)", () => {
  let db: Kysely<Database>;
  let deps: ReviewDeps;
  const sent: MailMessage[] = [];
  const people: Record<string, Actor> = {};
  let buildId: string;
  const build = () => db.selectFrom("builds").selectAll().where("id", "=", buildId).executeTakeFirstOrThrow();
  const counts = async () => {
    const r = await sql<{ req: number; com: number; out: number; ver: number }>`SELECT
      (SELECT count(*)::int FROM review_requests) AS req, (SELECT count(*)::int FROM review_comments) AS com,
      (SELECT count(*)::int FROM mail_outbox) AS out, (SELECT count(*)::int FROM review_reviewers WHERE verdict IS NOT NULL) AS ver`.execute(db);
    return r.rows[0];
  };
  const r1 = "#define A 1\n#define B 2\n#define C 3\n";
  const r2 = "// revision 2\n#define A 1\n#define B 20\n#define C 3\n";

  beforeAll(async () => {
    db = await freshDb();
    const { workshopId } = await seed(db);
    // The outbox row is written in the action's transaction, as the real queue does.
    deps = {
      db,
      link: (p) => `http://hb.test${p}`,
      enqueue: async (trx, m) => {
        await trx.insertInto("mail_outbox").values({ kind: m.kind, to_address: m.to, subject: m.subject, text_body: m.text, html_body: m.html }).execute();
        sent.push(m);
      },
    };
    const rows = await db.selectFrom("memberships as m").innerJoin("users as u", "u.id", "m.user_id").select(["u.id", "u.display_name", "u.github_login", "u.email", "m.role"]).execute();
    for (const r of rows) people[(r.github_login ?? r.email)!] = { id: r.id, name: r.display_name, role: r.role as Role, workshopId };
    buildId = (await db.selectFrom("builds").select("id").where("name", "=", "Kestrel").executeTakeFirstOrThrow()).id;
  });

  it("refuses bad requests and changes nothing", async () => {
    const before = await counts();
    const b = await build();
    const rendered = { text: r1, templateLabel: "generic-header v1" };
    await failsWith(requestReview(deps, people["demo-reviewer"], b, { reviewerIds: [people["demo-owner"].id], note: "", rendered }), 403);
    await failsWith(requestReview(deps, people["client-one@example.test"], b, { reviewerIds: [people["demo-reviewer"].id], note: "", rendered }), 403);
    await failsWith(requestReview(deps, people["demo-builder"], b, { reviewerIds: [], note: "", rendered }), 400, /at least one/);
    await failsWith(requestReview(deps, people["demo-builder"], b, { reviewerIds: [people["client-one@example.test"].id], note: "", rendered }), 400, /owners and reviewers/);
    await failsWith(requestReview(deps, people["demo-owner"], b, { reviewerIds: [people["demo-owner"].id], note: "", rendered }), 400, /own request/);
    expect(await counts()).toEqual(before);
  });

  let req1 = "";
  it("a review request puts the build in review and e-mails each reviewer a link", async () => {
    const b = await build();
    req1 = await requestReview(deps, people["demo-builder"], b, { reviewerIds: [people["demo-reviewer"].id], note: "New chamber pulse", rendered: { text: r1, templateLabel: "generic-header v1" } });
    expect((await build()).status).toBe("in-review");
    const mail = sent.at(-1)!;
    expect(mail.to).toBe("reviewer@ember-anvil.example.test");
    expect(mail.text).toContain(`http://hb.test/builds/${buildId}/reviews/${req1}`);
    await failsWith(requestReview(deps, people["demo-builder"], await build(), { reviewerIds: [people["demo-reviewer"].id], note: "", rendered: { text: r1, templateLabel: "x" } }), 409, /already in review/);
  });

  let t1 = "";
  let t2 = "";
  it("comments: bad anchors and oversized text are refused; a comment e-mails the requester", async () => {
    const b = await build();
    const before = await counts();
    await failsWith(addComment(deps, people["demo-reviewer"], b, req1, { body: "x", line: 4 }), 400, /3 lines; there is no line 4/);
    await failsWith(addComment(deps, people["demo-reviewer"], b, req1, { body: "x", line: 0 }), 400);
    await failsWith(addComment(deps, people["demo-reviewer"], b, req1, { body: "x".repeat(2 * 1024 * 1024), line: 1 }), 413);
    await failsWith(addComment(deps, people["demo-reviewer"], b, req1, { body: "   ", line: 1 }), 400);
    await failsWith(addComment(deps, people["demo-reviewer"], b, req1, { body: "x", modelPath: "presets.999" }), 400, /nothing at/);
    await failsWith(addComment(deps, people["client-one@example.test"], b, req1, { body: "x", line: 1 }), 403);
    await failsWith(addComment(deps, people["demo-reviewer"], b, "00000000-0000-4000-8000-000000000000", { body: "x", line: 1 }), 404);
    expect(await counts()).toEqual(before);

    t1 = await addComment(deps, people["demo-reviewer"], b, req1, { body: "B should be 20", line: 2 });
    t2 = await addComment(deps, people["demo-reviewer"], b, req1, { body: "C is fine?", line: 3 });
    await addComment(deps, people["demo-reviewer"], b, req1, { body: "Check the first preset's name", modelPath: "presets.0.name" });
    expect(sent.at(-1)).toMatchObject({ kind: "review-comment", to: "builder@ember-anvil.example.test" });
    expect(sent.at(-1)!.text).toContain("presets.0.name");
    await addComment(deps, people["demo-builder"], b, req1, { body: "Will do", threadId: t1 });
    expect(sent.at(-1)).toMatchObject({ kind: "review-comment", to: "reviewer@ember-anvil.example.test" });
    await failsWith(setThreadResolved(deps, people["demo-reviewer"], b, t1, true), 403);
  });

  it("verdicts: builders, clients and the requester cannot give one; changes requested sends the build back", async () => {
    const b = await build();
    const before = await counts();
    await failsWith(giveVerdict(deps, people["demo-builder"], b, req1, { verdict: "approved", note: "" }), 403);
    await failsWith(giveVerdict(deps, people["client-one@example.test"], b, req1, { verdict: "approved", note: "" }), 403);
    await failsWith(giveVerdict(deps, people["demo-owner"], b, req1, { verdict: "approved", note: "" }), 403, /not asked/);
    expect(await counts()).toEqual(before);
    expect(await giveVerdict(deps, people["demo-reviewer"], b, req1, { verdict: "changes-requested", note: "See line 2" })).toBe("changes-requested");
    expect((await build()).status).toBe("configuring");
    expect(sent.at(-1)).toMatchObject({ kind: "review-verdict", to: "builder@ember-anvil.example.test", subject: expect.stringMatching(/^Changes requested/) });
    const after = await counts();
    await failsWith(giveVerdict(deps, people["demo-reviewer"], await build(), req1, { verdict: "approved", note: "" }), 409, /closed/);
    expect(await counts()).toEqual(after);
  });

  it("a new revision carries unchanged lines' threads, marks changed ones outdated, and approval sets the status; a later save needs a new review", async () => {
    const b = await build();
    await setThreadResolved(deps, people["demo-builder"], b, t1, true);
    expect(await saveConfig(db, b.workshop_id, b.id, b.config, b.config_version, { authorId: people["demo-builder"].id, counts: { errors: 0, warnings: 0 } })).toBe(b.config_version + 1);
    const b2 = await build();
    // The old request is no longer current: no new thread on it, no verdict.
    await failsWith(addComment(deps, people["demo-reviewer"], b2, req1, { body: "late", line: 1 }), 409, /replaced/);
    const req2 = await requestReview(deps, people["demo-builder"], b2, { reviewerIds: [people["demo-reviewer"].id], note: "B fixed", rendered: { text: r2, templateLabel: "generic-header v1" } });
    const r = (await getReviewRequest(db, b.workshop_id, b.id, req2))!;
    const rows = await commentsUpTo(db, b.workshop_id, b.id, r.revision);
    const threads = threadsFor(rows, await renderedOf(db, [req1]), { requestId: req2, rendered: r.rendered });
    const byId = new Map(threads.map((t) => [t.id, t]));
    expect(byId.get(t1)).toMatchObject({ line: null, outdated: true, resolved: expect.anything() });
    expect(byId.get(t2)).toMatchObject({ line: 4, outdated: false, resolved: null });
    expect(await giveVerdict(deps, people["demo-reviewer"], b2, req2, { verdict: "approved", note: "" })).toBe("approved");
    expect((await build()).status).toBe("approved");
    await failsWith(giveVerdict(deps, people["demo-reviewer"], await build(), req1, { verdict: "approved", note: "" }), 409);

    // An owner asked to review a revision they saved themselves cannot approve it.
    const b25 = await build();
    await saveConfig(db, b25.workshop_id, b25.id, b25.config, b25.config_version, { authorId: people["demo-owner"].id, counts: { errors: 0, warnings: 0 } });
    const req3 = await requestReview(deps, people["demo-builder"], await build(), { reviewerIds: [people["demo-owner"].id], note: "", rendered: { text: r2, templateLabel: "generic-header v1" } });
    await failsWith(giveVerdict(deps, people["demo-owner"], await build(), req3, { verdict: "approved", note: "" }), 403, /saved this revision yourself/);
    expect((await build()).status).toBe("in-review");

    const b3 = await build();
    await saveConfig(db, b3.workshop_id, b3.id, b3.config, b3.config_version, { authorId: people["demo-builder"].id, counts: { errors: 0, warnings: 0 } });
    expect((await build()).status).toBe("configuring");
  });
});
