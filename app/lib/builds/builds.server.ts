// A workshop's builds as the pages use them: the list, the client picker, creating a build,
// its details, archiving, and saving the rig form through the checked save. Each function takes
// the viewer (whose workshop and role scope it) and reaches the database only through repo/.
import type { Viewer } from "../auth/auth.server";
import { scopeFor } from "../auth/build-access.server";
import { storeCheckedConfig, type StoreResult } from "../checks/save.server";
import { powerModeFor } from "../checks/power-mode";
import { validateConfig } from "../checks/validate";
import type { Config, Rig } from "../config/schema";
import { starterConfig } from "../config/starter";
import { db } from "../db/db.server";
import { createBuild, listBuilds, listClients, setArchived, updateBuildMeta, type BuildMeta, type BuildQuery } from "../repo/builds.server";
import { rigErrorsForForm } from "../forms/rig-form";

/** The builds this viewer may see (a client only their own), one page of them. */
export function buildsFor(v: Viewer, query: BuildQuery) {
  return listBuilds(db(), scopeFor(v), query);
}

/** The builds a viewer may open, by name, for pickers (the template editor's preview): the first hundred. */
export async function buildChoices(v: Viewer): Promise<{ id: string; name: string }[]> {
  const { rows } = await listBuilds(db(), scopeFor(v), { sort: "name", dir: "asc", page: 1, perPage: 100 });
  return rows.map((b) => ({ id: b.id, name: b.name }));
}

/** Client accounts of the viewer's workshop, for the build form's client picker. */
export function clientsOf(v: Viewer) {
  return listClients(db(), v.workshop.id);
}

export type DetailsOutcome = { ok: true; id: string } | { ok: false; errors: Record<string, string> };

const notAClient = { ok: false as const, errors: { clientUserId: "Choose a client account of this workshop." } };

/** A new build with the starter config; its client account, when one is chosen, must be the workshop's. */
export async function createBuildFor(v: Viewer, meta: BuildMeta): Promise<DetailsOutcome> {
  const clients = await clientsOf(v);
  const chosen = clients.find((c) => c.id === meta.clientUserId);
  if (meta.clientUserId && !chosen) return notAClient;
  const config = starterConfig();
  const found = validateConfig(config, { power: powerModeFor(config) }).diagnostics;
  const counts = { errors: found.filter((d) => d.severity === "error").length, warnings: found.filter((d) => d.severity === "warning").length };
  const { id } = await createBuild(db(), v.workshop.id, { ...meta, clientName: meta.clientName || chosen?.display_name || "" }, config, { authorId: v.user.id, counts });
  return { ok: true, id };
}

/** A build's name, client, notes and status (not its config). */
export async function updateDetails(v: Viewer, buildId: string, meta: BuildMeta): Promise<DetailsOutcome> {
  if (meta.clientUserId && !(await clientsOf(v)).some((c) => c.id === meta.clientUserId)) return notAClient;
  await updateBuildMeta(db(), v.workshop.id, buildId, meta);
  return { ok: true, id: buildId };
}

export function setArchivedFor(v: Viewer, buildId: string, archived: boolean) {
  return setArchived(db(), v.workshop.id, buildId, archived);
}

export type RigSave = { kind: "saved"; version: number } | { kind: "invalid"; message: string; fieldErrors: Record<string, string> } | { kind: "stale" };

/**
 * The rig form's save goes through the checked save like every other config write: the rig is
 * refused when it adds a validator error to the build's config (errors the config already had,
 * such as a new build's missing presets, do not block a rig edit; decision 009). Errors under
 * `rig` come back as the form's field errors.
 */
export async function saveRig(v: Viewer, b: { id: string; config: Config }, rig: Rig, expectedVersion: number, message?: string | null): Promise<RigSave> {
  const known = () => validateConfig(b.config, { power: powerModeFor(b.config) }).diagnostics;
  const r: StoreResult = await storeCheckedConfig(v, b.id, { ...b.config, rig }, expectedVersion, { known, message });
  if (r.kind === "saved") return { kind: "saved", version: r.version };
  if (r.kind === "stale") return { kind: "stale" };
  const { fieldErrors, elsewhere } = rigErrorsForForm(r.errors);
  const more = elsewhere.length ? ` ${elsewhere.map((d) => d.message).join(" ")}` : "";
  return { kind: "invalid", message: `This rig would give the config ${r.errors.length} new error${r.errors.length === 1 ? "" : "s"}; nothing was saved.${more}`, fieldErrors };
}
