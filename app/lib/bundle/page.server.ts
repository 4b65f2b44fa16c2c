// What the Bundle and Check-a-card pages show: the plan for the revision, template, name mode and
// card the page asks for (or why there is none), and the choices for the pickers. Routes stay thin.
import type { Viewer } from "../auth/auth.server";
import { can } from "../auth/permissions";
import { templateChoices } from "../rendering/library.server";
import { pinnedTemplate, type RenderableBuild } from "../rendering/service.server";
import { listRevisionsFor } from "../revisions/compare.server";
import { BUILTIN_NAMES } from "../template";
import { fail, failureOf } from "../web/http.server";
import type { Config } from "../config/schema";
import { readBundleQuery, type BundleQuery } from "./query";
import { bundleFor, planAnswer, type PlanAnswer } from "./service.server";

type BuildRow = RenderableBuild & { id: string; config: Config };

export type BundlePage = {
  buildId: string;
  buildName: string;
  query: BundleQuery;
  plan: PlanAnswer | null;
  /** Why there is no plan (the revision does not render, say), as the API would answer it. */
  problem: { status: number; message: string } | null;
  revisions: { number: number; label: string }[];
  templates: { ref: string; label: string }[];
  pinnedLabel: string;
  /** The API address of this bundle (the download), without `check`. */
  apiHref: string;
};

export async function openBundlePage(v: Viewer, b: BuildRow, params: URLSearchParams): Promise<BundlePage> {
  const q = readBundleQuery(params);
  if (!q.ok) fail(400, q.error);
  const query = { ...q.value, check: true };
  let plan: PlanAnswer | null = null;
  let problem: BundlePage["problem"] = null;
  try {
    plan = planAnswer(await bundleFor(v, b, query));
  } catch (e) {
    const f = failureOf(e);
    // A refusal that is about this page's own address (no such revision, not allowed) stays an error page.
    if (!f || f.status !== 422) throw e;
    problem = { status: f.status, message: f.message };
  }
  const pinned = await pinnedTemplate(v, b);
  const templates = can(v.role, "view:templates") ? (await templateChoices(v, pinned)).choices : BUILTIN_NAMES.map((n) => ({ ref: n, label: `${n} (built-in)` }));
  const revisions = can(v.role, "view:revisions")
    ? (await listRevisionsFor(v, b.id, { sort: "number", dir: "desc", page: 1, perPage: 100 })).rows.map((r) => ({
        number: r.number,
        label: `Revision ${r.number}${r.number === b.config_version ? " (today's config)" : ""} · ${r.createdAt.toISOString().slice(0, 16).replace("T", " ")} UTC${r.message ? ` · ${r.message.slice(0, 60)}` : ""}`,
      }))
    : [];
  const api = new URLSearchParams();
  if (query.revision !== null) api.set("revision", String(query.revision));
  if (query.template) api.set("template", query.template);
  api.set("names", query.mode);
  api.set("card", String(query.cardGb));
  return {
    buildId: b.id,
    buildName: b.name,
    query: q.value,
    plan,
    problem,
    revisions,
    templates,
    pinnedLabel: `${pinned.name} v${pinned.version}`,
    apiHref: `/api/builds/${b.id}/bundle?${api}`,
  };
}
