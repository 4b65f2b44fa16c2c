// Server renders, one way for every route (the Render view, POST /api/render and
// GET /api/builds/:id/render): `chooseTemplate` decides which template a request means (a
// built-in by name, a workshop template by id and version, posted source, or the build's pin),
// and `renderBuildOrSource` renders a build's config or a posted one through it, entering the
// worker pool once. Failures a person caused are 4xx with a message.
import type { Viewer } from "../auth/auth.server";
import { validateConfig } from "../checks/validate";
import { db } from "../db/db.server";
import type { TemplateUses } from "../db/types";
import { getTemplateVersion, latestSources, sourcesForVersion } from "../repo/templates.server";
import { isUuid } from "../repo/builds.server";
import { BUILTIN_NAMES, BUILTIN_VERSION, builtinSource, DEFAULT_BUILTIN, isBuiltinName, type Limits } from "../template";
import { capErrors, type ErrorKind } from "../template/error-list";
import { fail } from "../web/http.server";
import { renderOffThread } from "./pool.server";
import { metaForBuild, type RenderOutcome } from "./render";

export type ResolvedTemplate = { kind: "builtin" | "workshop" | "source"; id: string | null; name: string; version: number; source: string };

/** What a request asks to render with; `null` means the build's own template. */
export type TemplateAsk = { id: string; version?: number } | { source: string } | { builtin: string };

/** The pin as a build row carries it. */
export type BuildPin = { pinned_template_id: string | null; pinned_template_version: number | null };

/** A build as far as rendering needs it. */
export type RenderableBuild = BuildPin & { name: string; client_name: string; config_saved_at: Date; config_version: number; config: unknown };

/**
 * Server renders (the API and the Render view) get a shorter clock than the editor's preview in
 * the browser. They run in a worker (decision 007), terminated at this plus KILL_MARGIN_MS.
 */
export const API_LIMITS: Partial<Limits> = { maxMillis: 500 };

/**
 * A template reference: a built-in's name or a workshop template's id, at the version given or
 * else the latest. A built-in at an earlier version renders that version's bytes (decision 015).
 */
export async function resolveTemplate(v: Viewer, ref: string, version?: number): Promise<ResolvedTemplate> {
  if (isBuiltinName(ref)) {
    const source = builtinSource(ref, version ?? BUILTIN_VERSION);
    if (source === undefined) fail(404, `The built-in '${ref}' has versions 1 to ${BUILTIN_VERSION}.`);
    return { kind: "builtin", id: null, name: ref, version: version ?? BUILTIN_VERSION, source };
  }
  if (!isUuid(ref)) fail(404, `No template '${ref.slice(0, 80)}': use a built-in (${BUILTIN_NAMES.join(", ")}) or a template id of your workshop.`);
  const row = await getTemplateVersion(db(), v.workshop.id, ref, version);
  if (!row) fail(404, version === undefined ? "No template with this id in your workshop." : `This template has no version ${version}.`);
  return { kind: "workshop", id: row.id, name: row.name, version: row.version, source: row.source };
}

/** The reference a build's own template goes by: its pinned template's id, or the default built-in's name. */
export function pinRef(b: BuildPin): string {
  return b.pinned_template_id ?? DEFAULT_BUILTIN;
}

/** The template a build renders with when none is asked for: its pin, or the default built-in. */
export async function pinnedTemplate(v: Viewer, b: BuildPin): Promise<ResolvedTemplate> {
  if (b.pinned_template_id && b.pinned_template_version !== null) return resolveTemplate(v, b.pinned_template_id, b.pinned_template_version);
  return resolveTemplate(v, DEFAULT_BUILTIN);
}

/**
 * The template a render request means. With a build: no ask, or its pinned template asked for
 * without a version, is the build's pin at its pinned version (not the latest), so every render
 * route shows a build the same bytes. `pinned` passes a pin already resolved (the Render view shows it).
 */
export async function chooseTemplate(v: Viewer, ask: TemplateAsk | null, build?: BuildPin, pinned?: ResolvedTemplate): Promise<ResolvedTemplate> {
  // Posted source has no versions; it renders as version 1 whatever the built-ins' version is.
  if (ask && "source" in ask) return { kind: "source", id: null, name: "posted", version: 1, source: ask.source };
  if (ask && "builtin" in ask) {
    if (!isBuiltinName(ask.builtin)) fail(404, `No built-in template '${ask.builtin.slice(0, 80)}'.`);
    return resolveTemplate(v, ask.builtin);
  }
  if (build && (!ask || (ask.version === undefined && ask.id === pinRef(build)))) return pinned ?? pinnedTemplate(v, build);
  if (!ask) fail(400, "Say which template to render with.");
  return resolveTemplate(v, ask.id, ask.version);
}

/** The same for a build, from a page's or the API's `?template=&version=`. */
export function chooseTemplateForBuild(v: Viewer, b: BuildPin, ref: string | null, version?: number, pinned?: ResolvedTemplate): Promise<ResolvedTemplate> {
  return chooseTemplate(v, ref ? { id: ref, version } : null, b, pinned);
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

export type ApiError = { stage: string; message: string; line: number; column: number };

/**
 * A render failure as the API's error list, with the limit named when a budget stopped it:
 * the first 50 errors, the total and the distinct kinds (decision 011), never thousands.
 */
export function apiErrors(r: Extract<RenderOutcome, { ok: false }>, limits: Partial<Limits> = {}): { errors: ApiError[]; total: number; kinds: ErrorKind[] } {
  const capped = capErrors(r.errors);
  const errors = capped.errors.map((e) => ({
    stage: e.stage,
    message: e.message === "rendering took longer than the time limit" && limits.maxMillis ? `rendering took longer than the time limit of ${limits.maxMillis} ms` : e.message,
    line: e.line,
    column: e.column,
  }));
  return { errors, total: capped.total, kinds: capped.kinds };
}

export type RenderError = ApiError;

/** The message of a 422 for a template that did not render (the positioned errors ride along). */
export function renderFailedMessage(total: number): string {
  return `The template did not render: ${total} error${total === 1 ? "" : "s"}; each is listed with its line and column.`;
}
/** A posted config without the model's shape: the same 422 shape as a template error, `path` naming the field. */
export type ConfigError = { stage: "config"; message: string; line: null; column: null; path: string };

export type Rendered = { kind: "rendered"; output: string; target: "c" | "text"; uses: TemplateUses };
export type RenderFailed = { kind: "failed"; errors: RenderError[]; total: number; kinds: ErrorKind[]; uses: TemplateUses };
export type BadConfig = { kind: "bad-config"; message: string; errors: ConfigError[]; total: number; kinds: ErrorKind[] };

/** Renders a build's config, or a posted config (checked against the model first), through `t`. */
export async function renderBuildOrSource(v: Viewer, subject: { build: RenderableBuild }, t: ResolvedTemplate, limits?: Partial<Limits>): Promise<Rendered | RenderFailed>;
export async function renderBuildOrSource(v: Viewer, subject: { build: RenderableBuild } | { config: unknown }, t: ResolvedTemplate, limits?: Partial<Limits>): Promise<Rendered | RenderFailed | BadConfig>;
export async function renderBuildOrSource(
  v: Viewer,
  subject: { build: RenderableBuild } | { config: unknown },
  t: ResolvedTemplate,
  limits: Partial<Limits> = API_LIMITS,
): Promise<Rendered | RenderFailed | BadConfig> {
  let build: { name: string; client_name: string; config_saved_at: Date; config_version?: number };
  let config: unknown;
  if ("build" in subject) {
    build = subject.build;
    config = subject.build.config;
  } else {
    const checked = validateConfig(subject.config);
    if (!checked.config) {
      // Capped like every answered error list (decision 011).
      const capped = capErrors(checked.diagnostics.filter((d) => d.severity === "error"));
      const errors = capped.errors.map((d): ConfigError => ({ stage: "config", message: d.message, line: null, column: null, path: d.path }));
      return { kind: "bad-config", message: "The config does not have the model's shape; fix it before rendering.", errors, total: capped.total, kinds: capped.kinds };
    }
    config = checked.config;
    build = { name: "Posted config", client_name: "", config_saved_at: new Date(0) };
  }
  const { sources, uses } = await partialsFor(v, t);
  const r = await renderOffThread(t.source, config as never, metaForBuild(build, t), { partials: sources, limits });
  return r.ok ? { kind: "rendered", output: r.output, target: r.target, uses } : { kind: "failed", ...apiErrors(r, limits), uses };
}
