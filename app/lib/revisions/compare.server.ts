// Two revisions of one build side by side: each rendered with the same template (printing its
// own number and save time, so a revision always renders to the same bytes), the model diff in
// words, and the text diff of the rendered output.
import type { Viewer } from "../auth/auth.server";
import { db } from "../db/db.server";
import { fail } from "../web/http.server";
import { diffModels, type Change } from "../model-diff";
import { diffTexts, type TextDiff } from "../text-diff/text-diff";
import { getRevision, listRevisions, restoreRevision, revisionAuthors, type RevisionQuery, type RevisionWithConfig } from "../repo/revisions.server";
import { readRevisionNumber } from "./params";
import { renderBuildOrSource, resolveTemplate, type ResolvedTemplate } from "../rendering/service.server";

type Build = { id: string; name: string; client_name: string; pinned_template_id: string | null; pinned_template_version: number | null };

export async function revisionOf(v: Viewer, b: Build, n: number): Promise<RevisionWithConfig> {
  const r = await getRevision(db(), v.workshop.id, b.id, n);
  if (!r) fail(404, `${b.name} has no revision ${n}.`);
  return r;
}

/** The template a revision renders with: the one asked for, else the revision's pin, else the generic header. */
export async function templateForRevision(v: Viewer, r: { templateId: string | null; templateVersion: number | null }, ref: string | null): Promise<ResolvedTemplate> {
  if (ref) return resolveTemplate(v, ref);
  if (r.templateId && r.templateVersion !== null) {
    try {
      return await resolveTemplate(v, r.templateId, r.templateVersion);
    } catch {
      // The pinned template was deleted since (revisions keep a record, not a reference).
    }
  }
  return resolveTemplate(v, "generic-header");
}

/** A revision rendered: the build's name, the revision's number and save time. */
export async function renderRevision(v: Viewer, b: Build, r: RevisionWithConfig, t: ResolvedTemplate) {
  const build = { name: b.name, client_name: b.client_name, config_saved_at: r.createdAt, config_version: r.number, config: r.config, pinned_template_id: r.templateId, pinned_template_version: r.templateVersion };
  const out = await renderBuildOrSource(v, { build }, t);
  if (out.kind === "failed") fail(422, `Revision ${r.number} does not render with ${t.name} v${t.version}: ${out.errors.map((e) => e.message).join("; ")}${out.total > out.errors.length ? ` (the first ${out.errors.length} of ${out.total} errors)` : ""}`);
  return out;
}

export type RevisionMeta = { number: number; createdAt: string; authorName: string | null; message: string | null; errorCount: number; warningCount: number };
const metaOf = (r: RevisionWithConfig): RevisionMeta => ({
  number: r.number,
  createdAt: r.createdAt.toISOString(),
  authorName: r.authorName,
  message: r.message,
  errorCount: r.errorCount,
  warningCount: r.warningCount,
});

export type Comparison = {
  from: RevisionMeta;
  to: RevisionMeta;
  /** True when `from` is the later revision: the diff reads backwards in time. */
  reversed: boolean;
  template: { name: string; version: number; ref: string };
  model: Change[];
  text: TextDiff;
};

export const fileLabel = (build: string, n: number, ext: string) => `${build.toLowerCase().replace(/[^a-z0-9]+/g, "-").replace(/^-|-$/g, "") || "build"}-r${n}.${ext}`;

export async function compareRevisions(v: Viewer, b: Build, fromN: number, toN: number, templateRef: string | null): Promise<Comparison> {
  const from = await revisionOf(v, b, fromN);
  const to = await revisionOf(v, b, toN);
  const t = await templateForRevision(v, to, templateRef);
  const [ra, rb] = [await renderRevision(v, b, from, t), await renderRevision(v, b, to, t)];
  const ext = ra.target === "c" ? "h" : "txt";
  return {
    from: metaOf(from),
    to: metaOf(to),
    reversed: fromN > toN,
    template: { name: t.name, version: t.version, ref: t.id ?? t.name },
    model: diffModels(from.config, to.config).changes,
    text: diffTexts(fileLabel(b.name, fromN, ext), fileLabel(b.name, toN, ext), ra.output, rb.output),
  };
}

// The revisions pages and API as the viewer's workshop sees them (routes do not hold the db).
/** The comparison a URL asks for (`?from=a&to=b&template=`), shared by the compare page and the diff API. */
export async function compareFromUrl(v: Viewer, b: Build, url: URL): Promise<Comparison> {
  const from = readRevisionNumber(url.searchParams.get("from"), "from");
  if (!from.ok) fail(400, from.error);
  const to = readRevisionNumber(url.searchParams.get("to"), "to");
  if (!to.ok) fail(400, to.error);
  return compareRevisions(v, b, from.value, to.value, url.searchParams.get("template") || null);
}

export function listRevisionsFor(v: Viewer, buildId: string, q: RevisionQuery) {
  return listRevisions(db(), v.workshop.id, buildId, q);
}
export function revisionAuthorsFor(v: Viewer, buildId: string) {
  return revisionAuthors(db(), v.workshop.id, buildId);
}
export function getRevisionFor(v: Viewer, buildId: string, n: number) {
  return getRevision(db(), v.workshop.id, buildId, n);
}
/** Restore revision n as a new revision by this viewer. */
export function restoreRevisionFor(v: Viewer, buildId: string, n: number, expectedVersion: number) {
  return restoreRevision(db(), v.workshop.id, buildId, n, expectedVersion, v.user.id);
}
