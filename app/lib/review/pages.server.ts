// What the review pages load, as one call each (routes stay thin: guard, call, return).
import type { Viewer } from "../auth/auth.server";
import { loadBuildFor } from "../auth/build-access.server";
import { can, mayGiveVerdict } from "../auth/permissions";
import { db } from "../db/db.server";
import { diffModels } from "../model-diff";
import { getRevision } from "../repo/revisions.server";
import { commentsUpTo, getReviewRequest, lastApprovedBefore, listReviewRequests, membersWithRoles, openRequestFor, renderedOf, revisionAuthor, reviewersOf } from "../repo/reviews.server";
import { fail } from "../web/http.server";
import { splitLines } from "./lines";
import { threadsFor } from "./threads";

/** The Reviews tab: every request on the build, and who may be asked for the current revision. */
export async function openReviewsPage(v: Viewer, buildId: string) {
  const b = await loadBuildFor(v, buildId);
  const canRequest = can(v.role, "request:review");
  const requests = await listReviewRequests(db(), v.workshop.id, b.id);
  const candidates = canRequest ? (await membersWithRoles(db(), v.workshop.id, ["owner", "reviewer"])).filter((m) => m.id !== v.user.id) : [];
  return {
    revision: b.config_version,
    status: b.status,
    openForCurrent: Boolean(await openRequestFor(db(), b.id, b.config_version)),
    canRequest,
    candidates: candidates.map((m) => ({ id: m.id, name: m.display_name, role: m.role })),
    requests: requests.map((r) => ({
      id: r.id,
      revision: r.revision,
      state: r.state,
      note: r.note,
      at: r.created_at.toISOString(),
      by: r.requested_by_name ?? "(former member)",
      reviewers: r.reviewers.map((x) => ({ name: x.display_name, verdict: x.verdict })),
    })),
  };
}

/** One review: its rendered lines, threads placed on them, verdicts, the model diff, what the viewer may do. */
export async function openReviewPage(v: Viewer, buildId: string, requestId: string) {
  const b = await loadBuildFor(v, buildId);
  const r = /^[0-9a-f-]{36}$/i.test(requestId) ? await getReviewRequest(db(), v.workshop.id, b.id, requestId) : undefined;
  if (!r) fail(404, "No review with this id on this build.");
  const reviewers = await reviewersOf(db(), [r.id]);
  const rows = await commentsUpTo(db(), v.workshop.id, b.id, r.revision);
  const texts = await renderedOf(db(), [...new Set(rows.map((c) => c.request_id))].filter((id) => id !== r.id));
  const current = r.revision === b.config_version;
  const me = reviewers.find((x) => x.reviewer_id === v.user.id);
  const authorId = await revisionAuthor(db(), b.id, r.revision);
  // The model diff against the last approved revision, or the previous one when none is approved.
  const approvedBase = await lastApprovedBefore(db(), b.id, r.revision);
  const baseNumber = approvedBase ?? (r.revision > 1 ? r.revision - 1 : null);
  const [base, head] = await Promise.all([
    baseNumber !== null ? getRevision(db(), v.workshop.id, b.id, baseNumber) : undefined,
    getRevision(db(), v.workshop.id, b.id, r.revision),
  ]);
  const model = base && head ? { from: base.number, approved: approvedBase !== null, changes: diffModels(base.config, head.config).changes } : null;
  return {
    model,
    buildId: b.id,
    request: { id: r.id, revision: r.revision, state: r.state, note: r.note, by: r.requested_by_name ?? "(former member)", template: r.template_label, at: r.created_at.toISOString() },
    currentRevision: b.config_version,
    lines: splitLines(r.rendered),
    threads: threadsFor(rows, texts, { requestId: r.id, rendered: r.rendered }),
    reviewers: reviewers.map((x) => ({ id: x.reviewer_id, name: x.display_name, verdict: x.verdict, note: x.verdict_note })),
    can: {
      comment: can(v.role, "comment:review"),
      startThread: can(v.role, "comment:review") && current,
      resolve: can(v.role, "resolve:comment"),
      verdict: Boolean(me && !me.verdict) && current && r.state === "open" && mayGiveVerdict(v.role, v.user.id, { authorId, requestedBy: r.requested_by }),
    },
  };
}
