// Which template a request means (a built-in by name, a workshop template by id and version,
// or posted source) and rendering a build through it. Failures are 4xx with a message.
import type { Viewer } from "../auth/auth.server";
import { db } from "../db/db.server";
import { fail } from "../web/http.server";
import type { TemplateUses } from "../db/types";
import { BUILTIN_TEMPLATES, type Limits } from "../template";
import { renderOffThread } from "./pool.server";
import { BUILTIN_VERSION, isBuiltinName, metaForBuild, type RenderOutcome } from "./render";
import { getTemplateVersion, latestSources, sourcesForVersion } from "../repo/templates.server";
import { isUuid } from "../repo/builds.server";

export type ResolvedTemplate = { kind: "builtin" | "workshop" | "source"; id: string | null; name: string; version: number; source: string };

/** A template reference: a built-in's name or a workshop template's id (latest version unless given). */
export async function resolveTemplate(v: Viewer, ref: string, version?: number): Promise<ResolvedTemplate> {
  if (isBuiltinName(ref)) return { kind: "builtin", id: null, name: ref, version: BUILTIN_VERSION, source: BUILTIN_TEMPLATES[ref] };
  if (!isUuid(ref)) fail(404, `No template '${ref.slice(0, 80)}': use a built-in (${Object.keys(BUILTIN_TEMPLATES).join(", ")}) or a template id of your workshop.`);
  const row = await getTemplateVersion(db(), v.workshop.id, ref, version);
  if (!row) fail(404, version === undefined ? "No template with this id in your workshop." : `This template has no version ${version}.`);
  return { kind: "workshop", id: row.id, name: row.name, version: row.version, source: row.source };
}

/** The template a build renders with when none is asked for: its pin, or the generic header. */
export async function pinnedTemplate(v: Viewer, b: { pinned_template_id: string | null; pinned_template_version: number | null }): Promise<ResolvedTemplate> {
  if (b.pinned_template_id && b.pinned_template_version !== null) return resolveTemplate(v, b.pinned_template_id, b.pinned_template_version);
  return resolveTemplate(v, "generic-header");
}

/**
 * Server renders (the API and the Render view) get a shorter clock than the editor's preview in
 * the browser. They run in a worker (decision 007), terminated at this plus KILL_MARGIN_MS.
 */
export const API_LIMITS: Partial<Limits> = { maxMillis: 500 };

export async function renderBuildWith(
  v: Viewer,
  b: { name: string; client_name: string; config_saved_at: Date; config_version: number; config: unknown },
  t: ResolvedTemplate,
  limits?: Partial<Limits>,
): Promise<RenderOutcome & { uses: TemplateUses }> {
  const { sources, uses } = await partialsFor(v, t);
  return { ...(await renderOffThread(t.source, b.config as never, metaForBuild(b, t), { partials: sources, limits })), uses };
}

/**
 * The workshop templates `use "name"` resolves to: for a saved version, the versions it recorded
 * when it was saved (decision 005, listed in `uses`), so its bytes do not follow later edits of
 * its partials; for a built-in or posted source, the latest of each (nothing recorded).
 */
export async function partialsFor(v: Viewer, t: ResolvedTemplate): Promise<{ sources: Record<string, string>; uses: TemplateUses }> {
  if (t.kind === "workshop" && t.id) return sourcesForVersion(db(), v.workshop.id, t.id, t.version);
  return { sources: await latestSources(db(), v.workshop.id), uses: Object.create(null) };
}

/** A render failure as the API's error list, with the limit named when a budget stopped it. */
export function apiErrors(r: Extract<RenderOutcome, { ok: false }>, limits: Partial<Limits> = {}) {
  return r.errors.map((e) => ({
    stage: e.stage,
    message: e.message === "rendering took longer than the time limit" && limits.maxMillis ? `rendering took longer than the time limit of ${limits.maxMillis} ms` : e.message,
    line: e.line,
    column: e.column,
  }));
}
