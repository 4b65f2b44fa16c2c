// What the Release tab and the bench-check API show: the revision to release (the newest approved
// one by default), its bench check with ticks, the bundle's choices and findings as the Bundle tab
// has them, whether a release is allowed now (and if not, why), and the release history.
import type { Viewer } from "../auth/auth.server";
import { requirePermission } from "../auth/auth.server";
import { can } from "../auth/permissions";
import type { BuildRow } from "../db/types";
import { db } from "../db/db.server";
import { openBundlePage } from "../bundle/page.server";
import * as repo from "../repo/releases.server";
import { readRevisionNumber } from "../revisions/params";
import { fail, failureOf } from "../web/http.server";
import { formAsBody, readReleaseInput, readTickInput } from "./requests";
import { approvedRevisionsFor, benchCheckFor, releaseBlocker, releaseBuildFor, releasesFor, setTickFor, type BenchCheck, type Release } from "./service.server";

type Build = Parameters<typeof benchCheckFor>[1] & Pick<BuildRow, "id">;

export async function benchCheckAnswerFor(v: Viewer, b: Build, n: number) {
  const check = await benchCheckFor(v, b, n);
  return { buildId: b.id, ...check, approved: await repo.isApproved(db(), b.id, n) };
}

export async function setTickAnswerFor(v: Viewer, b: Build, n: number, item: string, ticked: boolean) {
  const check = await setTickFor(v, b, n, item, ticked);
  return { buildId: b.id, ...check, approved: await repo.isApproved(db(), b.id, n) };
}

export type ReleasePage = {
  buildId: string;
  buildName: string;
  /** Approved revisions, newest first (the choices of the revision picker). */
  approved: number[];
  /** The revision shown, or null when none is approved and none was asked for. */
  revision: number | null;
  revisionApproved: boolean;
  check: BenchCheck | null;
  bundle: Awaited<ReturnType<typeof openBundlePage>> | null;
  /** Why the Release button is off (null: it is on). */
  blocked: string | null;
  may: { tick: boolean; release: boolean };
  releases: Release[];
};

export async function openReleasePage(v: Viewer, b: Build, params: URLSearchParams): Promise<ReleasePage> {
  requirePermission(v, "view:release");
  const approved = await approvedRevisionsFor(v, b);
  let revision: number | null = approved[0] ?? null;
  const asked = params.get("revision");
  if (asked) {
    const r = readRevisionNumber(asked, "revision");
    if (!r.ok) fail(400, r.error);
    revision = r.value;
  }
  const may = { tick: can(v.role, "check:bench") && !b.archived_at, release: can(v.role, "release:build") && !b.archived_at };
  const releases = await releasesFor(v, b);
  if (revision === null) return { buildId: b.id, buildName: b.name, approved, revision, revisionApproved: false, check: null, bundle: null, blocked: "No revision is approved yet.", may, releases };
  const check = await benchCheckFor(v, b, revision);
  const q = new URLSearchParams(params);
  q.set("revision", String(revision));
  const bundle = await openBundlePage(v, b, q);
  const revisionApproved = approved.includes(revision);
  const errors = bundle.plan?.findings.filter((f) => f.severity === "error") ?? [];
  const template = bundle.plan?.template.ref;
  // The card's size changes the findings, not the bytes: the same revision, template and names make the same bundle.
  const same = releases.find((r) => r.revision === revision && r.template === template && r.names === bundle.query.mode);
  const blocked = b.archived_at
    ? "This build is archived; restore it before releasing it."
    : same
      ? `Revision ${revision} is already released with these choices, as release ${same.number}.`
      : (releaseBlocker(revisionApproved, check)?.message ??
      (bundle.problem ? bundle.problem.message : errors.length ? `The card cannot be built: ${errors.map((e) => e.message).join(" ")}` : null));
  return { buildId: b.id, buildName: b.name, approved, revision, revisionApproved, check, bundle, blocked, may, releases };
}

export type ReleaseActionResult = { ok: true; intent: "tick"; check: BenchCheck } | { ok: true; intent: "release"; release: Release } | { ok: false; status: number; error: string };

/** The Release tab's form actions (tick, release); a refusal comes back as a message for an alert. */
export async function releasePageAction(v: Viewer, b: Build, form: FormData): Promise<ReleaseActionResult> {
  const intent = form.get("intent");
  try {
    if (intent === "tick") {
      requirePermission(v, "check:bench");
      const raw = form.get("revision");
      const n = readRevisionNumber(typeof raw === "string" ? raw : null, "revision");
      if (!n.ok) fail(400, n.error);
      const t = readTickInput(formAsBody(form, ["item", "ticked"]));
      if (!t.ok) fail(400, t.error);
      return { ok: true, intent, check: await setTickFor(v, b, n.value, t.value.item, t.value.ticked) };
    }
    if (intent === "release") {
      requirePermission(v, "release:build");
      const input = readReleaseInput(formAsBody(form, ["revision", "note", "template", "names", "card"]));
      if (!input.ok) fail(400, input.error);
      return { ok: true, intent, release: await releaseBuildFor(v, b, input.value) };
    }
    fail(400, "Unknown action: tick an item or release.");
  } catch (e) {
    const f = failureOf(e);
    // Not allowed or not found stay error pages; a refusal of what was asked is shown beside the form.
    if (!f || f.status === 403 || f.status === 404) throw e;
    return { ok: false, status: f.status, error: f.message };
  }
}
