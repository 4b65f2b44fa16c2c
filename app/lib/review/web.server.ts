// What the review pages share on the server: the form reader with a size cap (a 2 MB comment is
// a 413 before anything is parsed), the actor and mail hooks from the signed-in viewer, and the
// render of the build's current revision with its pinned template.
import { data } from "react-router";
import type { Viewer } from "../auth/auth.server";
import { db } from "../db/db.server";
import { appLink, sendMail } from "../mail/mailer.server";
import { API_LIMITS, pinnedTemplate, renderBuildOrSource, type RenderableBuild } from "../rendering/service.server";
import { readBodyLimited } from "../web/body.server";
import { fail } from "../web/http.server";
import { MAX_REVIEW_FORM_BYTES } from "./rules";
import type { Actor, ReviewDeps } from "./service.server";

export async function readReviewForm(request: Request): Promise<URLSearchParams> {
  let bytes: Uint8Array;
  try {
    // Reads (and drops) a moderately oversized body to its end so the client sees the 413.
    bytes = await readBodyLimited(request, MAX_REVIEW_FORM_BYTES);
  } catch (e) {
    const status = (e as { init?: { status?: number } }).init?.status;
    if (status !== 413) throw e;
    throw data({ message: `The form is larger than ${MAX_REVIEW_FORM_BYTES / 1024} KB; a comment is far shorter. Nothing was saved.` }, { status: 413, headers: { Connection: "close" } });
  }
  const type = request.headers.get("Content-Type") ?? "";
  if (!type.startsWith("application/x-www-form-urlencoded")) fail(415, "Send the review form as a form (application/x-www-form-urlencoded).");
  return new URLSearchParams(new TextDecoder().decode(bytes));
}

export const actorOf = (v: Viewer): Actor => ({ id: v.user.id, name: v.user.displayName, role: v.role, workshopId: v.workshop.id });

export function reviewDeps(): ReviewDeps {
  return { db: db(), enqueue: (trx, m) => sendMail(trx, m), link: appLink };
}

/** The text reviewers read: the current revision through the build's pinned template. */
export async function renderForReview(v: Viewer, b: RenderableBuild) {
  const t = await pinnedTemplate(v, b);
  const r = await renderBuildOrSource(v, { build: b }, t, API_LIMITS);
  if (r.kind !== "rendered") fail(422, `Revision ${b.config_version} does not render with ${t.name} v${t.version} (${r.errors[0]?.message ?? "render failed"}); fix it before asking for a review.`);
  return { text: r.output, templateLabel: `${t.name} v${t.version}` };
}
