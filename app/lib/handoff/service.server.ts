// The client's side of a build (decision 023): their builds with their stage, and a build's
// handoff sheet as of its newest release: the released revision's controls, presets and fonts,
// and the card zip with the SHA-256 and size recorded when it was released. Clients see only
// their own builds (loadBuildFor); workshop members see the same page as a preview.
import type { Viewer } from "../auth/auth.server";
import { loadBuildFor, scopeFor } from "../auth/build-access.server";
import { controlsInWords, presetsInWords } from "../bundle/handoff";
import { bundleFor, type BundleResult } from "../bundle/service.server";
import type { Config } from "../config/schema";
import { db } from "../db/db.server";
import type { BuildStatus } from "../db/types";
import { listBuilds } from "../repo/builds.server";
import { newestRelease, releasedBuilds } from "../repo/releases.server";
import { getRevision } from "../repo/revisions.server";
import { fail } from "../web/http.server";
import { stageInWords, type StageWords } from "./words";

export type HandoffListItem = { id: string; name: string; stage: StageWords; releasedAt: string | null };

/** The builds this viewer's handoff list shows: a client's own, or the workshop's for a member's preview. */
export async function handoffList(v: Viewer): Promise<HandoffListItem[]> {
  const { rows } = await listBuilds(db(), scopeFor(v), { sort: "name", dir: "asc", page: 1, perPage: 200 });
  const released = await releasedBuilds(db(), v.workshop.id, rows.map((r) => r.id));
  return rows.map((r) => ({ id: r.id, name: r.name, stage: stageInWords(r.status as BuildStatus, released.has(r.id)), releasedAt: released.get(r.id)?.toISOString() ?? null }));
}

export type HandoffRelease = { number: number; releasedAt: string; note: string; sha256: string; bytes: number; fileName: string };
export type HandoffSheet = {
  build: { id: string; name: string; clientName: string; stage: StageWords };
  release: (HandoffRelease & { config: Config; controls: ReturnType<typeof controlsInWords>; presets: ReturnType<typeof presetsInWords> }) | null;
};

export async function handoffSheetFor(v: Viewer, buildId: string): Promise<HandoffSheet> {
  const b = await loadBuildFor(v, buildId);
  const r = await newestRelease(db(), v.workshop.id, b.id);
  const build = { id: b.id, name: b.name, clientName: b.client_name, stage: stageInWords(b.status, Boolean(r)) };
  if (!r) return { build, release: null };
  const revision = await getRevision(db(), v.workshop.id, b.id, r.revision);
  if (!revision) fail(404, `${b.name}'s release ${r.number} names a revision that is gone.`);
  const config = revision.config;
  return {
    build,
    release: {
      number: r.number,
      releasedAt: r.released_at.toISOString(),
      note: r.note,
      sha256: r.bundle_sha256,
      bytes: Number(r.bundle_bytes),
      fileName: releaseFileName(b.name, r.number),
      config,
      controls: controlsInWords(config),
      presets: presetsInWords(config),
    },
  };
}

export const releaseFileName = (buildName: string, n: number) => `${buildName.toLowerCase().replace(/[^a-z0-9]+/g, "-").replace(/^-|-$/g, "") || "build"}-release-${n}.zip`;

/**
 * The card zip of the build's newest release: its revision, template, name rules and card size
 * exactly as recorded, so the bytes are the ones released (SHA-256 in the row). Nothing else:
 * a client can ask for no other revision or parameter here.
 */
export async function releaseBundleFor(v: Viewer, buildId: string): Promise<{ plan: BundleResult; release: HandoffRelease }> {
  const b = await loadBuildFor(v, buildId);
  const r = await newestRelease(db(), v.workshop.id, b.id);
  if (!r) fail(404, `${b.name} has not been released yet: the workshop e-mails you when its card is ready.`);
  // The template and the version recorded at release, named exactly (as the release's own link
  // does, decision 022), so later edits of the template or the build's pin change nothing here.
  const plan = await bundleFor(v, b, { revision: r.revision, template: r.template_ref, templateVersion: r.template_version, mode: r.name_mode, cardGb: Number(r.card_gb) }, true);
  const errors = plan.findings.filter((f) => f.severity === "error");
  if (errors.length) fail(409, `The released card of ${b.name} cannot be made again: ${errors.map((e) => e.message).join(" ")} Ask the workshop.`);
  return {
    plan,
    release: { number: r.number, releasedAt: r.released_at.toISOString(), note: r.note, sha256: r.bundle_sha256, bytes: Number(r.bundle_bytes), fileName: releaseFileName(b.name, r.number) },
  };
}
