// Review actions: request, comment, reply, resolve, verdict. Each checks who may do it (through
// the permission table) and what state allows it, then writes in one transaction with the
// e-mails it causes (through the mail outbox, so a down mail server never fails the action).
// Failures are `fail(status, message)` with a message a person can act on; nothing is written.
import type { Kysely, Transaction } from "kysely";
import type { BuildStatus, Database, Role, Verdict } from "../db/types";
import { can, mayGiveVerdict, type Permission } from "../auth/permissions";
import { fail } from "../web/http.server";
import { commentMail, reviewRequestedMail, verdictMail, type MailMessage } from "../mail/messages";
import * as repo from "../repo/reviews.server";
import { lineAt, lineCount } from "./lines";
import { buildStatusFor, MAX_COMMENT_CHARS, MAX_NOTE_CHARS, modelPathExists, requestStateFrom } from "./rules";

export type ReviewDeps = {
  db: Kysely<Database>;
  /** Put a message in the outbox inside the action's transaction. */
  enqueue: (trx: Transaction<Database>, m: MailMessage) => Promise<unknown>;
  /** An absolute link into the app. */
  link: (path: string) => string;
};
export type Actor = { id: string; name: string; role: Role; workshopId: string };
export type ReviewBuild = { id: string; name: string; status: BuildStatus; config_version: number; config: unknown; archived_at: Date | null };

function need(a: Actor, p: Permission) {
  if (!can(a.role, p)) fail(403, `Your role (${a.role}) does not allow this.`);
}

function text(value: string, what: string, max: number, required: boolean): string {
  const t = value.trim();
  if (required && t === "") fail(400, `Write the ${what} first.`);
  if (t.length > max) fail(413, `The ${what} is ${t.length.toLocaleString("en")} characters; keep it under ${max.toLocaleString("en")}.`);
  return t;
}

const reviewPath = (buildId: string, requestId: string) => `/builds/${buildId}/reviews/${requestId}`;

/** Ask reviewers to read the build's current revision, as `rendered` shows it. */
export async function requestReview(
  d: ReviewDeps,
  a: Actor,
  b: ReviewBuild,
  input: { reviewerIds: string[]; note: string; rendered: { text: string; templateLabel: string } },
): Promise<string> {
  need(a, "request:review");
  const note = text(input.note, "note", MAX_NOTE_CHARS, false);
  if (b.archived_at) fail(409, "This build is archived; restore it before asking for a review.");
  if (b.status === "released") fail(409, "This build is released; a change needs a new revision first.");
  const ids = [...new Set(input.reviewerIds)];
  if (ids.length === 0) fail(400, "Choose at least one reviewer.");
  if (ids.length > 10) fail(400, "Ask at most ten reviewers.");
  if (ids.includes(a.id)) fail(400, "You cannot review your own request; choose someone else.");
  const eligible = await repo.membersWithRoles(d.db, a.workshopId, (["owner", "builder", "reviewer", "client"] as Role[]).filter((r) => can(r, "be:reviewer")));
  const chosen = ids.map((id) => eligible.find((m) => m.id === id));
  if (chosen.some((m) => !m)) fail(400, "Choose reviewers from this workshop's owners and reviewers.");
  return d.db.transaction().execute(async (trx) => {
    if (await repo.openRequestFor(trx, b.id, b.config_version)) fail(409, `Revision ${b.config_version} is already in review.`);
    const id = await repo.insertReviewRequest(trx, {
      buildId: b.id,
      workshopId: a.workshopId,
      revision: b.config_version,
      requestedBy: a.id,
      note,
      templateLabel: input.rendered.templateLabel,
      rendered: input.rendered.text,
      reviewerIds: ids,
    });
    if (!(await repo.setBuildStatusAt(trx, b.id, b.config_version, "in-review")))
      fail(409, "The config was saved again while you asked; reload and ask for the newest revision.");
    for (const m of chosen)
      if (m!.email)
        await d.enqueue(trx, reviewRequestedMail({ to: m!.email, requesterName: a.name, buildName: b.name, revision: b.config_version, note, url: d.link(reviewPath(b.id, id)) }));
    return id;
  });
}

type Request = NonNullable<Awaited<ReturnType<typeof repo.getReviewRequest>>>;

async function loadRequest(d: ReviewDeps, a: Actor, buildId: string, requestId: string): Promise<Request> {
  const r = /^[0-9a-f-]{36}$/i.test(requestId) ? await repo.getReviewRequest(d.db, a.workshopId, buildId, requestId) : undefined;
  if (!r) fail(404, "No review with this id on this build.");
  return r;
}

/** Start a thread on a line of the rendered text or on a model path, or reply to one. */
export async function addComment(
  d: ReviewDeps,
  a: Actor,
  b: ReviewBuild,
  requestId: string,
  input: { body: string; line?: number | null; modelPath?: string | null; threadId?: string | null },
): Promise<string> {
  need(a, "comment:review");
  const r = await loadRequest(d, a, b.id, requestId);
  const body = text(input.body, "comment", MAX_COMMENT_CHARS, true);
  let root: Awaited<ReturnType<typeof repo.getThreadRoot>> | undefined;
  let anchor = { line: null as number | null, lineText: null as string | null, modelPath: null as string | null, where: "" };
  if (input.threadId) {
    root = /^[0-9a-f-]{36}$/i.test(input.threadId) ? await repo.getThreadRoot(d.db, a.workshopId, b.id, input.threadId) : undefined;
    if (!root) fail(404, "No comment thread with this id on this build.");
    anchor.where = root.line !== null ? `line ${root.line}` : `${root.model_path}`;
  } else {
    if (r.revision !== b.config_version) fail(409, `Revision ${r.revision} has been replaced by revision ${b.config_version}; comment on the newest review.`);
    if (input.line != null && input.modelPath) fail(400, "A comment is on a line or on a model path, not both.");
    if (input.line != null) {
      const t = lineAt(r.rendered, input.line);
      if (t === undefined) fail(400, `The rendered config has ${lineCount(r.rendered)} lines; there is no line ${input.line}.`);
      anchor = { line: input.line, lineText: t, modelPath: null, where: `line ${input.line}` };
    } else if (input.modelPath) {
      const p = input.modelPath.trim();
      if (!modelPathExists(b.config, p)) fail(400, `There is nothing at '${p.slice(0, 120)}' in this revision's config (write a path like presets.0.name).`);
      anchor = { line: null, lineText: null, modelPath: p, where: p };
    } else fail(400, "Choose a line of the rendered config or give a model path.");
  }
  return d.db.transaction().execute(async (trx) => {
    const id = await repo.insertComment(trx, { requestId: r.id, threadId: root?.id ?? null, authorId: a.id, body, line: anchor.line, lineText: anchor.lineText, modelPath: anchor.modelPath });
    // The revision's requester hears about comments on it, and a thread's starter about replies.
    const to = new Set<string>();
    if (r.requested_by && r.requested_by !== a.id && r.requested_by_email) to.add(r.requested_by_email);
    if (root && root.author_id && root.author_id !== a.id && root.author_email) to.add(root.author_email);
    for (const addr of to)
      await d.enqueue(trx, commentMail({ to: addr, authorName: a.name, where: anchor.where, body, buildName: b.name, revision: r.revision, url: d.link(`${reviewPath(b.id, r.id)}#comment-${root?.id ?? id}`) }));
    return id;
  });
}

export async function setThreadResolved(d: ReviewDeps, a: Actor, b: ReviewBuild, threadId: string, resolved: boolean) {
  need(a, "resolve:comment");
  const root = /^[0-9a-f-]{36}$/i.test(threadId) ? await repo.getThreadRoot(d.db, a.workshopId, b.id, threadId) : undefined;
  if (!root) fail(404, "No comment thread with this id on this build.");
  await repo.resolveThread(d.db, root.id, a.id, resolved);
}

/** Approve or ask for changes; the request and the build's status follow. */
export async function giveVerdict(d: ReviewDeps, a: Actor, b: ReviewBuild, requestId: string, input: { verdict: Verdict; note: string }) {
  if (!can(a.role, "give:verdict")) fail(403, `Your role (${a.role}) cannot approve or ask for changes; reviewers and owners can.`);
  const r = await loadRequest(d, a, b.id, requestId);
  const authorId = await repo.revisionAuthor(d.db, b.id, r.revision);
  if (!mayGiveVerdict(a.role, a.id, { authorId, requestedBy: r.requested_by }))
    fail(403, authorId === a.id ? "You saved this revision yourself; someone else must give the verdict." : "You asked for this review yourself; someone else must give the verdict.");
  const note = text(input.note, "note", MAX_NOTE_CHARS, false);
  if (r.state !== "open" || r.revision !== b.config_version)
    fail(409, r.state !== "open" ? `This review is closed (${r.state === "approved" ? "approved" : "changes requested"}).` : `Revision ${r.revision} is no longer in review: revision ${b.config_version} was saved since.`);
  return d.db.transaction().execute(async (trx) => {
    const reviewers = await repo.reviewersOf(trx, [r.id]);
    const me = reviewers.find((x) => x.reviewer_id === a.id);
    if (!me) fail(403, "You were not asked to review this revision.");
    if (me.verdict) fail(409, "You already gave your verdict on this revision.");
    if (!(await repo.recordVerdict(trx, r.id, a.id, input.verdict, note))) fail(409, "You already gave your verdict on this revision.");
    const state = requestStateFrom(reviewers.map((x) => (x.reviewer_id === a.id ? input.verdict : x.verdict)));
    if (state !== "open") {
      await repo.setRequestState(trx, r.id, state);
      if (!(await repo.setBuildStatusAt(trx, b.id, r.revision, buildStatusFor(state)))) fail(409, "The config was saved while you decided; the review is no longer current.");
    }
    if (r.requested_by_email && r.requested_by !== a.id)
      await d.enqueue(trx, verdictMail({ to: r.requested_by_email, reviewerName: a.name, verdict: input.verdict, note, buildName: b.name, revision: r.revision, url: d.link(reviewPath(b.id, r.id)) }));
    return state;
  });
}
