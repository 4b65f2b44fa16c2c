// A build's card bundle for routes: the config of a chosen revision (or today's), rendered with
// the chosen template (else the revision's pin, else the build's pin) and the built-in readable
// copy, the wiring picture, and each font's files as the build had them at that revision.
import type { Viewer } from "../auth/auth.server";
import { requirePermission } from "../auth/auth.server";
import type { Config } from "../config/schema";
import { db } from "../db/db.server";
import { downloadName } from "../rendering/render";
import { API_LIMITS, chooseTemplateForBuild, pinRef, renderBuildOrSource, resolveTemplate, type RenderableBuild, type ResolvedTemplate } from "../rendering/service.server";
import { latestFontFiles } from "../repo/fonts.server";
import { revisionOf, templateForRevision } from "../revisions/compare.server";
import { DEFAULT_BUILTIN } from "../template";
import { fail } from "../web/http.server";
import { drawWiring } from "../wiring";
import type { NameMode } from "./names";
import { planBundle, type BundlePlan } from "./plan";

type BuildRow = RenderableBuild & { id: string; config: Config };

export type BundleOptions = { template: string | null; templateVersion?: number | null; mode: NameMode; cardGb: number; revision: number | null };
export type BundleResult = BundlePlan & { name: string; revision: number; latest: boolean; template: { name: string; version: number; ref: string } };

/**
 * `release`: the caller has already matched `opts` to the build's newest release row (the
 * handoff's download, decision 023), so a client may have it without seeing revisions.
 */
export async function bundleFor(v: Viewer, b: BuildRow, opts: BundleOptions, release = false): Promise<BundleResult> {
  const mayChooseRevision = () => release || requirePermission(v, "view:revisions");
  let subject: RenderableBuild & { config: Config };
  let t: ResolvedTemplate;
  let revision: number;
  if (opts.revision === null || opts.revision === b.config_version) {
    // Today's config is the newest revision; it renders with the build's pin as every render route does.
    if (opts.revision !== null) mayChooseRevision();
    subject = b;
    revision = b.config_version;
    // A version names the template exactly (a release's download): the asked one, else the build's own.
    t = opts.templateVersion ? await resolveTemplate(v, opts.template ?? pinRef(b), opts.templateVersion) : await chooseTemplateForBuild(v, b, opts.template);
  } else {
    mayChooseRevision();
    const r = await revisionOf(v, b, opts.revision);
    subject = { name: b.name, client_name: b.client_name, config_saved_at: r.createdAt, config_version: r.number, config: r.config, pinned_template_id: r.templateId, pinned_template_version: r.templateVersion };
    revision = r.number;
    t = opts.templateVersion ? await resolveTemplate(v, opts.template ?? r.templateId ?? DEFAULT_BUILTIN, opts.templateVersion) : await templateForRevision(v, r, opts.template);
  }
  const r = await renderBuildOrSource(v, { build: subject }, t, API_LIMITS);
  if (r.kind !== "rendered") fail(422, `Revision ${revision} does not render with template ${t.name}: ${r.errors[0]?.message ?? "error"}`);
  const readable = await renderBuildOrSource(v, { build: subject }, await resolveTemplate(v, "readable-copy"), API_LIMITS);
  const wiring = await drawWiring(subject.config, `Wiring of ${b.name}, revision ${revision}`);
  const files = await latestFontFiles(db(), b.id, revision === b.config_version ? undefined : revision);
  const plan = planBundle({
    buildName: b.name,
    clientName: b.client_name,
    config: subject.config,
    label: `${b.name}, revision ${revision}, template ${t.name} v${t.version}`,
    rendered: { name: downloadName(b.name, t.name, r.target), text: r.output },
    readable: readable.kind === "rendered" ? { name: "readable-config.txt", text: readable.output } : null,
    wiring: { svg: wiring.svg, ok: wiring.ok },
    fonts: subject.config.fonts.map((f) => ({ id: f.id, name: f.name, folder: f.folder, status: f.status, files: files.get(f.id) ?? [] })),
    mode: opts.mode,
    cardBytes: Math.round(opts.cardGb * 1e9),
  });
  return {
    ...plan,
    name: downloadName(`${b.name} r${revision}`, "card", "text").replace(/\.txt$/, ".zip"),
    revision,
    latest: revision === b.config_version,
    template: { name: t.name, version: t.version, ref: t.id ?? t.name },
  };
}

/** The plan as the API's `check=1` and the Bundle page show it. */
export function planAnswer(plan: BundleResult) {
  return {
    name: plan.name,
    revision: plan.revision,
    latest: plan.latest,
    template: plan.template,
    totalBytes: plan.totalBytes,
    cardUsedBytes: plan.cardUsedBytes,
    cardBytes: plan.cardBytes,
    files: plan.entries.map((e) => ({ path: e.path, size: e.size, sha256: e.sha256, stored: e.kind === "stored" })),
    findings: plan.findings,
  };
}
export type PlanAnswer = ReturnType<typeof planAnswer>;
