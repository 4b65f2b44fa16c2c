// Reviews data access: requests (one revision, its rendered text, the asked reviewers and their
// verdicts) and comment threads. Every read is scoped to the viewer's workshop.
import type { Kysely, Transaction } from "kysely";
import type { Database, ReviewState, Verdict } from "../db/types";

type Db = Kysely<Database> | Transaction<Database>;

export async function listReviewRequests(db: Db, workshopId: string, buildId: string) {
  const requests = await db
    .selectFrom("review_requests as r")
    .leftJoin("users as u", "u.id", "r.requested_by")
    .select(["r.id", "r.revision", "r.state", "r.note", "r.created_at", "r.decided_at", "r.requested_by", "u.display_name as requested_by_name"])
    .where("r.workshop_id", "=", workshopId)
    .where("r.build_id", "=", buildId)
    .orderBy("r.created_at", "desc")
    .execute();
  const reviewers = requests.length ? await reviewersOf(db, requests.map((r) => r.id)) : [];
  return requests.map((r) => ({ ...r, reviewers: reviewers.filter((x) => x.request_id === r.id) }));
}

export async function reviewersOf(db: Db, requestIds: string[]) {
  return db
    .selectFrom("review_reviewers as rr")
    .innerJoin("users as u", "u.id", "rr.reviewer_id")
    .select(["rr.request_id", "rr.reviewer_id", "rr.verdict", "rr.verdict_note", "rr.verdict_at", "u.display_name", "u.email"])
    .where("rr.request_id", "in", requestIds)
    .orderBy("u.display_name")
    .execute();
}

export async function getReviewRequest(db: Db, workshopId: string, buildId: string, requestId: string) {
  return db
    .selectFrom("review_requests as r")
    .leftJoin("users as u", "u.id", "r.requested_by")
    .selectAll("r")
    .select(["u.display_name as requested_by_name", "u.email as requested_by_email"])
    .where("r.workshop_id", "=", workshopId)
    .where("r.build_id", "=", buildId)
    .where("r.id", "=", requestId)
    .executeTakeFirst();
}

export async function openRequestFor(db: Db, buildId: string, revision: number) {
  return db.selectFrom("review_requests").select("id").where("build_id", "=", buildId).where("revision", "=", revision).where("state", "=", "open").executeTakeFirst();
}

/** Workshop members who may be asked to review (by role), with their e-mail. */
export async function membersWithRoles(db: Db, workshopId: string, roles: string[]) {
  return db
    .selectFrom("memberships as m")
    .innerJoin("users as u", "u.id", "m.user_id")
    .select(["u.id", "u.display_name", "u.email", "m.role"])
    .where("m.workshop_id", "=", workshopId)
    .where("m.role", "in", roles as never)
    .orderBy("u.display_name")
    .execute();
}

export async function insertReviewRequest(
  db: Db,
  r: { buildId: string; workshopId: string; revision: number; requestedBy: string; note: string; templateLabel: string; rendered: string; reviewerIds: string[] },
) {
  const row = await db
    .insertInto("review_requests")
    .values({ build_id: r.buildId, workshop_id: r.workshopId, revision: r.revision, requested_by: r.requestedBy, note: r.note, template_label: r.templateLabel, rendered: r.rendered })
    .returning("id")
    .executeTakeFirstOrThrow();
  await db
    .insertInto("review_reviewers")
    .values(r.reviewerIds.map((id) => ({ request_id: row.id, reviewer_id: id, verdict: null, verdict_note: null, verdict_at: null })))
    .execute();
  return row.id;
}

export async function recordVerdict(db: Db, requestId: string, reviewerId: string, verdict: Verdict, note: string) {
  const r = await db
    .updateTable("review_reviewers")
    .set({ verdict, verdict_note: note || null, verdict_at: new Date() })
    .where("request_id", "=", requestId)
    .where("reviewer_id", "=", reviewerId)
    .where("verdict", "is", null)
    .executeTakeFirst();
  return Number(r.numUpdatedRows) === 1;
}

export async function setRequestState(db: Db, requestId: string, state: ReviewState) {
  await db
    .updateTable("review_requests")
    .set({ state, decided_at: state === "open" ? null : new Date() })
    .where("id", "=", requestId)
    .execute();
}

/** Set the build's status only while it is still at `revision` (a save since then wins). */
export async function setBuildStatusAt(db: Db, buildId: string, revision: number, status: Database["builds"]["status"]) {
  const r = await db.updateTable("builds").set({ status, updated_at: new Date() }).where("id", "=", buildId).where("config_version", "=", revision).executeTakeFirst();
  return Number(r.numUpdatedRows) === 1;
}

export async function insertComment(
  db: Db,
  c: { requestId: string; threadId: string | null; authorId: string; body: string; line: number | null; lineText: string | null; modelPath: string | null },
) {
  return (
    await db
      .insertInto("review_comments")
      .values({ request_id: c.requestId, thread_id: c.threadId, author_id: c.authorId, body: c.body, line: c.line, line_text: c.lineText, model_path: c.modelPath })
      .returning("id")
      .executeTakeFirstOrThrow()
  ).id;
}

/** Every comment on the build's requests up to `revision`, with the request's revision and text. */
export async function commentsUpTo(db: Db, workshopId: string, buildId: string, revision: number) {
  return db
    .selectFrom("review_comments as c")
    .innerJoin("review_requests as r", "r.id", "c.request_id")
    .leftJoin("users as u", "u.id", "c.author_id")
    .leftJoin("users as ru", "ru.id", "c.resolved_by")
    .select([
      "c.id",
      "c.request_id",
      "c.thread_id",
      "c.author_id",
      "c.body",
      "c.line",
      "c.line_text",
      "c.model_path",
      "c.resolved_at",
      "c.created_at",
      "r.revision",
      "u.display_name as author_name",
      "ru.display_name as resolved_by_name",
    ])
    .where("r.workshop_id", "=", workshopId)
    .where("r.build_id", "=", buildId)
    .where("r.revision", "<=", revision)
    .orderBy("c.created_at")
    .orderBy("c.id")
    .execute();
}

export async function renderedOf(db: Db, requestIds: string[]) {
  if (requestIds.length === 0) return new Map<string, string>();
  const rows = await db.selectFrom("review_requests").select(["id", "rendered"]).where("id", "in", requestIds).execute();
  return new Map(rows.map((r) => [r.id, r.rendered]));
}

/** A thread's first comment, scoped to the build. */
export async function getThreadRoot(db: Db, workshopId: string, buildId: string, commentId: string) {
  return db
    .selectFrom("review_comments as c")
    .innerJoin("review_requests as r", "r.id", "c.request_id")
    .leftJoin("users as u", "u.id", "c.author_id")
    .select(["c.id", "c.request_id", "c.thread_id", "c.author_id", "c.resolved_at", "c.line", "c.model_path", "r.revision", "u.email as author_email"])
    .where("r.workshop_id", "=", workshopId)
    .where("r.build_id", "=", buildId)
    .where("c.id", "=", commentId)
    .where("c.thread_id", "is", null)
    .executeTakeFirst();
}

export async function resolveThread(db: Db, threadId: string, by: string, resolved: boolean) {
  await db
    .updateTable("review_comments")
    .set(resolved ? { resolved_at: new Date(), resolved_by: by } : { resolved_at: null, resolved_by: null })
    .where("id", "=", threadId)
    .where("thread_id", "is", null)
    .execute();
}

export async function userEmail(db: Db, userId: string | null) {
  if (!userId) return null;
  return (await db.selectFrom("users").select(["email", "display_name"]).where("id", "=", userId).executeTakeFirst()) ?? null;
}

/** Who saved revision `n` of the build (null: unknown, e.g. recorded when revisions began). */
export async function revisionAuthor(db: Db, buildId: string, n: number): Promise<string | null> {
  const r = await db.selectFrom("config_revisions").select("author_id").where("build_id", "=", buildId).where("number", "=", n).executeTakeFirst();
  return r?.author_id ?? null;
}

/** The newest approved revision before `n`, if any: the review's model diff is read against it. */
export async function lastApprovedBefore(db: Db, buildId: string, n: number): Promise<number | null> {
  const r = await db
    .selectFrom("review_requests")
    .select("revision")
    .where("build_id", "=", buildId)
    .where("state", "=", "approved")
    .where("revision", "<", n)
    .orderBy("revision", "desc")
    .limit(1)
    .executeTakeFirst();
  return r?.revision ?? null;
}
