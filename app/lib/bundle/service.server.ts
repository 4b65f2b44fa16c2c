// A build's card bundle for routes: render the config with the chosen (or pinned) template and
// the built-in readable copy, gather the fonts' stored files, and plan. Today's config is used
// until revisions exist.
import type { Viewer } from "../auth/auth.server";
import { db } from "../db/db.server";
import { downloadName } from "../rendering/render";
import { API_LIMITS, chooseTemplateForBuild, renderBuildOrSource, resolveTemplate, type RenderableBuild } from "../rendering/service.server";
import { latestFontFiles } from "../repo/fonts.server";
import { fail } from "../web/http.server";
import type { NameMode } from "./names";
import { planBundle, type BundlePlan } from "./plan";

type BuildRow = RenderableBuild & { id: string; config: import("../config/schema").Config };

export async function bundleFor(v: Viewer, b: BuildRow, opts: { template: string | null; mode: NameMode; cardGb: number }): Promise<BundlePlan & { name: string }> {
  const t = await chooseTemplateForBuild(v, b, opts.template);
  const r = await renderBuildOrSource(v, { build: b }, t, API_LIMITS);
  if (r.kind !== "rendered") fail(422, `The config does not render with template ${t.name}: ${r.errors[0]?.message ?? "error"}`);
  const readableT = await resolveTemplate(v, "readable-copy");
  const readable = await renderBuildOrSource(v, { build: b }, readableT, API_LIMITS);
  const files = await latestFontFiles(db(), b.id);
  const plan = planBundle({
    buildName: b.name,
    clientName: b.client_name,
    config: b.config,
    rendered: { name: downloadName(b.name, t.name, r.target), text: r.output },
    readable: readable.kind === "rendered" ? { name: "readable-config.txt", text: readable.output } : null,
    fonts: b.config.fonts.map((f) => ({ id: f.id, name: f.name, folder: f.folder, status: f.status, files: files.get(f.id) ?? [] })),
    mode: opts.mode,
    cardBytes: opts.cardGb * 1e9,
  });
  return { ...plan, name: downloadName(b.name, "card", "text").replace(/\.txt$/, ".zip") };
}
