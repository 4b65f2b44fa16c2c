// The workshop's template library as the pages use it: opening a template (a built-in or a
// saved version), what has moved on under it, comparing two versions, the save rule (only a
// source that compiles, with the partials it will use, over the version it was opened at),
// deleting with a typed confirmation, starting a template from a copy, and which template a
// build may pin. Routes guard, parse and call one of these; failures a person caused are 4xx.
import type { Viewer } from "../auth/auth.server";
import { loadBuildFor } from "../auth/build-access.server";
import { can } from "../auth/permissions";
import { buildChoices } from "../builds/builds.server";
import { db } from "../db/db.server";
import {
  createTemplate,
  deleteTemplate,
  describeDependents,
  getTemplate,
  getTemplateVersion,
  isForeignKeyViolation,
  latestSources,
  listTemplates,
  listVersions,
  pinTemplate,
  recordedUses,
  saveTemplateVersion,
  templateDependents,
  usesOf,
  type TemplateDependents,
} from "../repo/templates.server";
import { BUILTIN_NAMES, BUILTIN_TEMPLATES, BUILTIN_VERSION, DEFAULT_BUILTIN, isBuiltinName, type TemplateError } from "../template";
import { fail } from "../web/http.server";
import { checkOffThread } from "./pool.server";
import { type ErrorKind } from "../template/error-list";
import { chooseTemplateForBuild, pinnedTemplate, renderBuildOrSource, type RenderableBuild, type ResolvedTemplate } from "./service.server";
import { INT4_MAX, int4From } from "../input/edges";
import { diffVersions, newerPartials, parseCompare, type NewerPartial, type VersionDiff } from "./version-diff";

export type OpenedTemplate = { id: string; name: string; kind: "builtin" | "workshop"; version: number; latest: number; source: string };
export type VersionInfo = { version: number; createdAt: string; author: string | null };

/** A built-in by name, or a workshop template at `?version=` (its latest when null), with its version list. */
export async function openTemplate(v: Viewer, ref: string, asked: string | null): Promise<{ template: OpenedTemplate; versions: VersionInfo[] }> {
  if (isBuiltinName(ref)) return { template: { id: ref, name: ref, kind: "builtin", version: BUILTIN_VERSION, latest: BUILTIN_VERSION, source: BUILTIN_TEMPLATES[ref] }, versions: [] };
  const t = await getTemplate(db(), v.workshop.id, ref);
  if (!t) fail(404, "No template with this id in your workshop.");
  const version = asked === null ? undefined : (int4From(asked, 1) ?? fail(400, `'version' must be a whole number from 1 to ${INT4_MAX}.`));
  const row = await getTemplateVersion(db(), v.workshop.id, t.id, version);
  if (!row) fail(404, `This template has no version ${version}.`);
  const all = await listVersions(db(), v.workshop.id, t.id);
  return {
    template: { id: t.id, name: t.name, kind: "workshop", version: row.version, latest: all[0]?.version ?? row.version, source: row.source },
    versions: all.map((x) => ({ version: x.version, createdAt: x.created_at.toISOString(), author: x.author })),
  };
}

/**
 * Templates this one uses that have moved on since its latest version was saved (which renders
 * with the versions it recorded): a save, even of the same source, takes the newer ones in.
 * Only the latest version of a workshop template has any.
 */
export async function partialsMovedOn(v: Viewer, t: OpenedTemplate): Promise<NewerPartial[]> {
  if (t.kind !== "workshop" || t.version !== t.latest) return [];
  const [recorded, now] = await Promise.all([recordedUses(db(), v.workshop.id, t.id, t.version), usesOf(db(), v.workshop.id, t.source)]);
  return newerPartials(recorded, now);
}

/**
 * Everything the template editor page shows: the template at the asked version, its versions, a
 * comparison when asked, the build to preview with (the asked one, else the first by name), the
 * workshop's templates as draft partials, what moved on under it, and what depends on it for
 * those who may delete it.
 */
export async function openTemplatePage(v: Viewer, ref: string, ask: { version: string | null; compare: string | null; build: string | null }) {
  const { template, versions } = await openTemplate(v, ref, ask.version);
  const compare = ask.compare === null ? null : await compareVersions(v, template, ask.compare);
  const canEdit = template.kind === "workshop" && can(v.role, "edit:template");
  const builds = await buildChoices(v);
  const buildId = ask.build ?? builds[0]?.id;
  const b = buildId ? await loadBuildFor(v, buildId) : null;
  return {
    template,
    versions,
    partials: await workshopSources(v),
    builds,
    build: b ? { id: b.id, name: b.name, client_name: b.client_name, config_saved_at: b.config_saved_at.toISOString(), config_version: b.config_version, config: b.config } : null,
    canEdit,
    compare,
    dependents: canEdit ? await dependentsOf(v, template) : null,
    newerPartials: await partialsMovedOn(v, template),
  };
}

export type Comparison = { from: number; to: number; diff: VersionDiff; patchHref: string };

/** Two saved versions of a workshop template, `compare` being `a..b` as the address carries it. */
export async function compareVersions(v: Viewer, t: { id: string; name: string; kind: "builtin" | "workshop" }, compare: string): Promise<Comparison> {
  if (t.kind === "builtin") fail(400, "Built-in templates have a single version; there is nothing to compare.");
  const pair = parseCompare(compare);
  if (!pair) fail(400, `'compare' must be two version numbers like 1..2, not '${compare.slice(0, 40)}'.`);
  const [a, b, latest] = await Promise.all([...pair.map((n) => getTemplateVersion(db(), v.workshop.id, t.id, n)), getTemplateVersion(db(), v.workshop.id, t.id)]);
  const absent = pair.filter((_, i) => ![a, b][i]);
  if (absent.length) fail(404, `This template has no version ${absent[0]}; its versions are 1 to ${latest?.version ?? 1}.`);
  return { from: a!.version, to: b!.version, diff: diffVersions(t.name, a!, b!), patchHref: `/templates/${t.id}/compare.patch?compare=${a!.version}..${b!.version}` };
}

/** A workshop template by id for a change (save, delete, patch); built-ins are refused with `builtinMessage`. */
export async function workshopTemplate(v: Viewer, ref: string, builtinStatus: 400 | 403, builtinMessage: string) {
  if (isBuiltinName(ref)) fail(builtinStatus, builtinMessage);
  const t = await getTemplate(db(), v.workshop.id, ref);
  if (!t) fail(404, "No template with this id in your workshop.");
  return t;
}

/** Who depends on a workshop template (shown before a delete). */
export function dependentsOf(v: Viewer, t: { id: string; name: string }): Promise<TemplateDependents> {
  return templateDependents(db(), v.workshop.id, t.id, t.name);
}

/** The workshop's templates at their latest versions, by name: the editor's draft partials. */
export function workshopSources(v: Viewer): Promise<Record<string, string>> {
  return latestSources(db(), v.workshop.id);
}

export type SaveOutcome =
  | { ok: true; version: number }
  | { ok: false; status: 409 | 422; message: string; errors?: TemplateError[]; total?: number; kinds?: ErrorKind[] };

/**
 * The save rule: a new version is stored only when the source compiles with the workshop's
 * templates as they will be, and only over the version the editor was opened at. The source is
 * compiled in a render worker (checkOffThread), never on the event loop, and its error list
 * comes back capped (decision 011).
 */
export async function saveTemplateSource(v: Viewer, t: { id: string; name: string }, source: string, openedAt: number): Promise<SaveOutcome> {
  // This template's own name means the source being saved: it is about to be the latest, and a
  // cycle through another template (this → other → this) only shows when it is.
  const partials = { ...(await latestSources(db(), v.workshop.id)), [t.name]: source };
  const checked = await checkOffThread(source, partials);
  if (!checked.ok) {
    const { errors, total, kinds } = checked.errors;
    return { ok: false, status: 422, message: `The template has ${total} error${total === 1 ? "" : "s"}; nothing was saved.`, errors, total, kinds };
  }
  const r = await saveTemplateVersion(db(), v.workshop.id, t.id, v.user.id, source, openedAt);
  if (r.kind === "missing") fail(404, "No template with this id in your workshop.");
  if (r.kind === "stale") return { ok: false, status: 409, message: `Someone saved version ${r.latest} since you opened version ${openedAt}; nothing was saved. Reload to see it and reapply your change.` };
  return { ok: true, version: r.version };
}

export type DeleteOutcome =
  | { kind: "deleted"; name: string; versions: number }
  | { kind: "refused"; status: 400 | 409; message: string; dependents?: TemplateDependents };

/** Deletes a workshop template when `confirm` is its name and nothing depends on it (decision 006). */
export async function deleteConfirmed(v: Viewer, t: { id: string; name: string }, confirm: unknown): Promise<DeleteOutcome> {
  if (confirm !== t.name) return { kind: "refused", status: 400, message: `Type the template's name, ${t.name}, to confirm; nothing was deleted.` };
  const r = await deleteTemplate(db(), v.workshop.id, t.id);
  if (r.kind === "missing") fail(404, "No template with this id in your workshop.");
  if (r.kind === "in-use") return { kind: "refused", status: 409, message: describeDependents(r.name, r.dependents), dependents: r.dependents };
  return r;
}

export type CreateOutcome = { kind: "created"; id: string } | { kind: "refused"; field: "name" | "from"; message: string };

/** A new workshop template named `name`, starting from a copy of a built-in or a workshop template's latest version. */
export async function createTemplateFrom(v: Viewer, name: string, from: string): Promise<CreateOutcome> {
  if (isBuiltinName(name)) return { kind: "refused", field: "name", message: `'${name}' is a built-in template's name; choose another.` };
  let source: string;
  if (isBuiltinName(from)) source = BUILTIN_TEMPLATES[from];
  else {
    const t = await getTemplateVersion(db(), v.workshop.id, from);
    if (!t) return { kind: "refused", field: "from", message: "No such template in your workshop." };
    source = t.source;
  }
  const r = await createTemplate(db(), v.workshop.id, v.user.id, name, source);
  if (r.kind === "taken") return { kind: "refused", field: "name", message: `Your workshop already has a template named '${name}'.` };
  return r;
}

/** The workshop's own templates for its list page. */
export function workshopTemplates(v: Viewer) {
  return listTemplates(db(), v.workshop.id);
}

/** The Render view's picker: the built-ins, then the workshop's templates (the pinned one at its pinned version), and how far the pin is behind. */
export async function templateChoices(v: Viewer, pinned: ResolvedTemplate): Promise<{ choices: { ref: string; label: string }[]; pinnedLatest: number | null }> {
  const workshop = await listTemplates(db(), v.workshop.id);
  return {
    choices: [
      ...BUILTIN_NAMES.map((n) => ({ ref: n, label: `${n} (built-in)` })),
      ...workshop.map((w) => ({ ref: w.id, label: `${w.name} (v${w.id === pinned.id ? pinned.version : w.latest})` })),
    ],
    pinnedLatest: pinned.id ? (workshop.find((w) => w.id === pinned.id)?.latest ?? pinned.version) : null,
  };
}

/**
 * What a build's Render view shows: the build rendered (in a worker, with the API's clock,
 * decision 007) with the asked template or its own, the versions of the templates that one
 * uses, the pin and how far it is behind, and the picker's choices. A failed render carries the
 * template's source so its errors can quote their lines.
 */
export async function openRenderView(v: Viewer, b: RenderableBuild & { id: string }, ref: string | null) {
  const pinned = await pinnedTemplate(v, b);
  const t = await chooseTemplateForBuild(v, b, ref, undefined, pinned);
  const r = await renderBuildOrSource(v, { build: b }, t);
  const { choices, pinnedLatest } = await templateChoices(v, pinned);
  return {
    buildId: b.id,
    buildName: b.name,
    configVersion: b.config_version,
    // The workshop templates this version uses, at the versions it recorded when it was saved.
    template: { id: t.id, name: t.name, version: t.version, kind: t.kind, ref: t.id ?? t.name, uses: Object.entries(r.uses).map(([name, u]) => ({ name, version: u.version })), pinnable: isPinnable(t) },
    pinned: { id: pinned.id, name: pinned.name, version: pinned.version, latest: pinnedLatest },
    choices,
    result: r.kind === "rendered" ? { ok: true as const, output: r.output, target: r.target } : { ok: false as const, errors: r.errors, total: r.total, kinds: r.kinds, source: t.source },
  };
}

/** Whether a build may pin this template: a workshop template, or the default built-in (which is what no pin means). */
export function isPinnable(t: { kind: string; name: string }): boolean {
  return t.kind === "workshop" || (t.kind === "builtin" && t.name === DEFAULT_BUILTIN);
}

/**
 * The pin policy: a build renders with a workshop template at a version it names, or with the
 * default built-in (pinning it clears the pin); the other built-ins are for reading only.
 */
export async function pinForBuild(v: Viewer, buildId: string, ref: unknown, version: number | null): Promise<void> {
  if (typeof ref !== "string" || ref === "") fail(400, "Choose the template to pin.");
  if (isBuiltinName(ref)) {
    if (ref !== DEFAULT_BUILTIN) fail(400, "Only the generic header (or a workshop template) can be a build's template; the other built-ins are for reading.");
    await pinTemplate(db(), v.workshop.id, buildId, null);
    return;
  }
  if (version === null) fail(400, "Say which version of the template to pin (a whole number from 1).");
  const t = await getTemplateVersion(db(), v.workshop.id, ref, version);
  if (!t) fail(404, "No such template version in your workshop.");
  try {
    await pinTemplate(db(), v.workshop.id, buildId, { templateId: t.id, version: t.version });
  } catch (e) {
    // The template was deleted between the check above and the pin: nothing changed.
    if (isForeignKeyViolation(e)) fail(409, "This template was deleted just now; the build keeps its template.");
    throw e;
  }
}
