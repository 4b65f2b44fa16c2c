// The library's actions as pages and the API use them: each takes the database and the acting
// person's workshop and id, checks the input with the pure rules, and writes through the repo
// (config changes through the checked save, so each is a normal save with a revision).
// `…For(viewer, …)` wrappers bind the app's database for routes.
import type { Kysely } from "kysely";
import type { Viewer } from "../auth/auth.server";
import type { ApiErrorDetails } from "../web/http.server";
import { storeCheckedConfigIn } from "../checks/save.server";
import { validate } from "../checks/validate";
import type { Diagnostic } from "../checks/diagnostics";
import type { Config } from "../config/schema";
import { db as appDb } from "../db/db.server";
import type { Database } from "../db/types";
import type { Change } from "../model-diff";
import type { Conflict, Side } from "../model-diff/merge";
import { getBuild } from "../repo/builds.server";
import * as repo from "../repo/library.server";
import { addToConfig, bodyFromBuildPreset, type Note } from "./adapt";
import { checkBody } from "./check";
import { dryRunOne, type DryRunRow } from "./dry-run";
import { presetBodySchema, type PresetBody } from "./format";
import { applyPlan, bodyChanges, planUpdate } from "./update";

type Db = Kysely<Database>;
export type Actor = { workshopId: string; userId: string | null };
export const actorOf = (v: Viewer): Actor => ({ workshopId: v.workshop.id, userId: v.user.id });

/** A refusal: a 4xx and the API's error message with its details (the routes answer it with `apiError`). */
export type Refusal = { status: number; body: { error: string } & ApiErrorDetails };
/** What the routes answer: a status and a JSON-able body, or a refusal. */
export type Outcome<T = unknown> = { status: 200 | 201; body: T } | Refusal;
export const refused = (r: Outcome<unknown>): r is Refusal => r.status >= 400;
const refuse = (status: number, error: string, more: ApiErrorDetails = {}): Refusal => ({ status, body: { error, ...more } });

export type Published = { presetId: string; version: number; url: string; diagnostics: Diagnostic[] };

/** A stored body read back (versions are checked before they are stored; a broken one is reported, not trusted). */
export function readBody(raw: unknown): PresetBody {
  const r = presetBodySchema.safeParse(raw);
  if (!r.success) throw new Error("A stored library version does not read as a preset body.");
  return r.data;
}

export type PublishRequest = { presetId: string | null; baseVersion: number | null; body: unknown; changelog: string };

/** Publish a body as a new preset (presetId null) or a new version over `baseVersion`: 201, 409 stale, 422 with diagnostics. */
export async function publish(db: Db, a: Actor, req: PublishRequest): Promise<Outcome<Published>> {
  const changelog = req.changelog.trim();
  if (!changelog) return refuse(422, "Say in one line what this version changes (the changelog); nothing was published.");
  if (changelog.length > 200) return refuse(422, "The changelog is one line of at most 200 characters; nothing was published.");
  const checked = checkBody(req.body);
  if (!checked.body) {
    const n = checked.counts.errors;
    return refuse(422, `The preset has ${n} error${n === 1 ? "" : "s"}; nothing was published.`, { diagnostics: checked.diagnostics });
  }
  const b = checked.body;
  const input: repo.PublishInput = { name: b.name, tags: b.tags, notes: b.notes, body: b, changelog, authorId: a.userId, counts: checked.counts };
  const r = req.presetId === null ? await repo.createLibraryPreset(db, a.workshopId, input) : await repo.publishLibraryVersion(db, a.workshopId, req.presetId, req.baseVersion ?? -1, input);
  return publishOutcome(r, req.baseVersion, checked.diagnostics);
}

function publishOutcome(r: repo.PublishResult, baseVersion: number | null, diagnostics: Diagnostic[]): Outcome<Published> {
  if (r.kind === "missing") return refuse(404, "No library preset with this id in your workshop.");
  if (r.kind === "name-taken") return refuse(409, "Another library preset already has this name; choose another name, or publish a new version of that one.");
  if (r.kind === "stale")
    return refuse(409, `Version ${r.latest} was published since version ${baseVersion} was read; nothing was published. Read the latest version, reapply your change and publish again.`, { latestVersion: r.latest });
  return { status: 201, body: { presetId: r.presetId, version: r.version, url: `/api/presets/${r.presetId}/versions/${r.version}`, diagnostics } };
}

export type SaveFromBuild = { buildId: string; presetId: string; name?: string; tags?: string[]; notes?: string; changelog: string; libraryPresetId: string | null; baseVersion: number | null };

/**
 * "Save to library" on a build's preset: a new library preset, or a new version of the one it
 * came from. The build's preset then is that version, so its origin moves to it.
 */
export async function saveFromBuild(db: Db, a: Actor, req: SaveFromBuild): Promise<Outcome<Published & { notes?: Note[] }>> {
  const build = await getBuild(db, { workshopId: a.workshopId }, req.buildId);
  if (!build) return refuse(404, "No build with this id in your workshop.");
  const made = bodyFromBuildPreset(build.config, req.presetId, { name: req.name, tags: req.tags, notes: req.notes });
  if (!made) return refuse(404, "The build has no preset with this id.");
  const out = await publish(db, a, { presetId: req.libraryPresetId, baseVersion: req.baseVersion, body: made.body, changelog: req.changelog });
  if (refused(out)) return out;
  await repo.setOrigin(db, a.workshopId, build.id, req.presetId, out.body.presetId, out.body.version, build.config_version);
  return { status: out.status, body: { ...out.body, notes: made.notes } };
}

export type AddRequest = { buildId: string; libraryPresetId: string; version: number | null; fontId: string; configVersion: number; name?: string };

/** Add a library preset to a build (a normal checked save, with its origin recorded in the same transaction). */
export type Added = { presetId: string; version: number; libraryVersion: number; notes: Note[] };

export async function addFromLibrary(db: Db, a: Actor, req: AddRequest): Promise<Outcome<Added>> {
  const build = await getBuild(db, { workshopId: a.workshopId }, req.buildId);
  if (!build) return refuse(404, "No build with this id in your workshop.");
  if (build.status === "released") return refuse(409, "This build is released; released builds are never changed. Nothing was added.");
  const preset = await repo.getLibraryPreset(db, a.workshopId, req.libraryPresetId);
  if (!preset || preset.versions.length === 0) return refuse(404, "No library preset with this id in your workshop.");
  const version = req.version ?? preset.versions[0].version;
  const v = await repo.getLibraryVersion(db, a.workshopId, preset.id, version);
  if (!v) return refuse(404, `The library preset has no version ${version}.`);
  if (!build.config.fonts.some((f) => f.id === req.fontId)) return refuse(422, `The build has no font "${req.fontId}"; choose one of its fonts. Nothing was added.`);
  const { config, presetId, notes } = addToConfig(build.config, readBody(v.body), { fontId: req.fontId, name: req.name });
  return db.transaction().execute(async (trx): Promise<Outcome<Added>> => {
    const r = await storeCheckedConfigIn(trx, a.workshopId, build.id, config, req.configVersion, { author: a.userId, message: `Added ${preset.name} v${version} from the library`, known: () => validate(build.config) });
    if (r.kind === "invalid") return refuse(422, `With this preset the config would have errors; nothing was added.`, { diagnostics: r.errors });
    if (r.kind === "stale") return refuse(409, r.message, { currentVersion: r.currentVersion });
    await repo.setOrigin(trx, a.workshopId, build.id, presetId, preset.id, version, r.version);
    return { status: 201, body: { presetId, version: r.version, libraryVersion: version, notes } };
  });
}

export type PresetUpdate = {
  presetId: string;
  presetName: string;
  libraryPresetId: string;
  libraryName: string;
  from: number;
  to: number;
  changes: Change[];
  conflicts: Conflict[];
  notes: Note[];
};

/** The build's presets that came from an older library version, with the library's changes and the collisions with local edits. */
export async function updatesFor(db: Db, a: Actor, build: { id: string; config: Config }): Promise<{ origins: repo.Origin[]; updates: PresetUpdate[] }> {
  const origins = (await repo.originsOf(db, a.workshopId, build.id)).filter((o) => build.config.presets.some((p) => p.id === o.presetId));
  const updates: PresetUpdate[] = [];
  for (const o of origins) {
    if (o.latest <= o.version) continue;
    const bodies = await repo.versionBodies(db, a.workshopId, o.libraryPresetId, [o.version, o.latest]);
    const base = bodies.get(o.version);
    const next = bodies.get(o.latest);
    if (base === undefined || next === undefined) continue;
    const plan = planUpdate(build.config, o.presetId, readBody(base), readBody(next));
    if (!plan) continue;
    const preset = build.config.presets.find((p) => p.id === o.presetId)!;
    updates.push({ presetId: o.presetId, presetName: preset.name, libraryPresetId: o.libraryPresetId, libraryName: o.libraryName, from: o.version, to: o.latest, changes: plan.libraryChanges, conflicts: plan.conflicts, notes: plan.notes });
  }
  return { origins, updates };
}

export type ApplyRequest = { buildId: string; presetId: string; configVersion: number; choices: Record<string, Side> };

/** Apply the newest library version to one build preset; every collision must have been decided. */
export async function applyUpdate(db: Db, a: Actor, req: ApplyRequest): Promise<Outcome<{ version: number; libraryVersion: number }>> {
  const build = await getBuild(db, { workshopId: a.workshopId }, req.buildId);
  if (!build) return refuse(404, "No build with this id in your workshop.");
  if (build.status === "released") return refuse(409, "This build is released; released builds are never changed. Nothing was updated.");
  const o = (await repo.originsOf(db, a.workshopId, build.id)).find((x) => x.presetId === req.presetId);
  if (!o || !build.config.presets.some((p) => p.id === req.presetId)) return refuse(404, "This preset of the build did not come from the library.");
  if (o.latest <= o.version) return refuse(409, `The preset is already on the newest library version (v${o.version}); nothing to apply.`);
  const bodies = await repo.versionBodies(db, a.workshopId, o.libraryPresetId, [o.version, o.latest]);
  const plan = planUpdate(build.config, o.presetId, readBody(bodies.get(o.version)), readBody(bodies.get(o.latest)), req.choices)!;
  const undecided = plan.conflicts.filter((c) => req.choices[c.path] !== "mine" && req.choices[c.path] !== "theirs");
  if (undecided.length > 0) return refuse(409, `${undecided.length} collision${undecided.length === 1 ? "" : "s"} between the library's changes and this build's need a choice; nothing was applied.`, { conflicts: undecided });
  return db.transaction().execute(async (trx): Promise<Outcome<{ version: number; libraryVersion: number }>> => {
    const r = await storeCheckedConfigIn(trx, a.workshopId, build.id, applyPlan(build.config, plan), req.configVersion, { author: a.userId, message: `Updated ${plan.merged.name} to ${o.libraryName} v${o.latest} from the library`, known: () => validate(build.config) });
    if (r.kind === "invalid") return refuse(422, "The merged preset would give the config errors; nothing was applied.", { diagnostics: r.errors });
    if (r.kind === "stale") return refuse(409, r.message, { currentVersion: r.currentVersion });
    await repo.setOrigin(trx, a.workshopId, build.id, o.presetId, o.libraryPresetId, o.latest, r.version);
    return { status: 200, body: { version: r.version, libraryVersion: o.latest } };
  });
}

export type RolloutReport = { target: number; rows: (DryRunRow & { applied?: boolean; error?: string })[] };

/**
 * The update of every build using a library preset: a dry run (`apply` false) says which builds
 * merge cleanly and which need hands; with `apply`, the clean ones are saved (each its own
 * transaction, read afresh, so a build changed since the dry run is merged again or left).
 * Released builds are never changed.
 */
export async function rollOut(db: Db, a: Actor, libraryPresetId: string, apply: boolean): Promise<Outcome<RolloutReport>> {
  const preset = await repo.getLibraryPreset(db, a.workshopId, libraryPresetId);
  if (!preset || preset.versions.length === 0) return refuse(404, "No library preset with this id in your workshop.");
  const target = preset.versions[0].version;
  const builds = await repo.buildsForDryRun(db, a.workshopId, preset.id);
  const needed = [...new Set([target, ...builds.map((b) => b.version)])];
  const raw = await repo.versionBodies(db, a.workshopId, preset.id, needed);
  const bodies = new Map([...raw].map(([k, v]) => [k, readBody(v)] as const));
  const rows: RolloutReport["rows"] = [];
  for (const b of builds) {
    const one = dryRunOne({ ...b, configVersion: b.configVersion }, bodies, target);
    const { next, ...row } = one;
    if (!apply || one.outcome !== "clean" || !next) {
      rows.push(row);
      continue;
    }
    const saved = await db.transaction().execute(async (trx) => {
      const r = await storeCheckedConfigIn(trx, a.workshopId, b.id, next, b.configVersion, { author: a.userId, message: `Updated ${row.presetName} to ${preset.name} v${target} from the library (all builds)`, known: () => validate(b.config) });
      if (r.kind !== "saved") return r.message;
      await repo.setOrigin(trx, a.workshopId, b.id, b.presetId, preset.id, target, r.version);
      return null;
    });
    rows.push(saved === null ? { ...row, applied: true } : { ...row, applied: false, error: saved });
  }
  return { status: 200, body: { target, rows } };
}

/** The model diff between two versions of a library preset, in words. */
export async function compareVersions(db: Db, a: Actor, libraryPresetId: string, from: number, to: number): Promise<Change[] | null> {
  const bodies = await repo.versionBodies(db, a.workshopId, libraryPresetId, [from, to]);
  if (!bodies.has(from) || !bodies.has(to)) return null;
  return bodyChanges(readBody(bodies.get(from)), readBody(bodies.get(to)));
}

// ---------------------------------------------------------------- for routes

export const publishFor = (v: Viewer, req: PublishRequest) => publish(appDb(), actorOf(v), req);
export const saveFromBuildFor = (v: Viewer, req: SaveFromBuild) => saveFromBuild(appDb(), actorOf(v), req);
export const addFromLibraryFor = (v: Viewer, req: AddRequest) => addFromLibrary(appDb(), actorOf(v), req);
export const updatesForBuild = (v: Viewer, build: { id: string; config: Config }) => updatesFor(appDb(), actorOf(v), build);
export const applyUpdateFor = (v: Viewer, req: ApplyRequest) => applyUpdate(appDb(), actorOf(v), req);
export const rollOutFor = (v: Viewer, id: string, apply: boolean) => rollOut(appDb(), actorOf(v), id, apply);
export const compareVersionsFor = (v: Viewer, id: string, from: number, to: number) => compareVersions(appDb(), actorOf(v), id, from, to);
export const listLibraryFor = (v: Viewer, q: repo.LibraryQuery) => repo.listLibrary(appDb(), v.workshop.id, q);
export const libraryTagsFor = (v: Viewer) => repo.libraryTags(appDb(), v.workshop.id);
export const getLibraryPresetFor = (v: Viewer, id: string) => repo.getLibraryPreset(appDb(), v.workshop.id, id);
export const getLibraryVersionFor = (v: Viewer, id: string, n: number) => repo.getLibraryVersion(appDb(), v.workshop.id, id, n);
export const buildsUsingFor = (v: Viewer, id: string) => repo.buildsUsing(appDb(), v.workshop.id, id);
export const deleteVersionFor = (v: Viewer, id: string, n: number) => repo.deleteLibraryVersion(appDb(), v.workshop.id, id, n);

export type PanelData = {
  origins: repo.Origin[];
  updates: PresetUpdate[];
  library: { id: string; name: string; latest: number | null; versions: number[] }[];
};

/** What the Looks page shows about the library: origins, updates available, presets to add. */
export async function libraryPanelFor(v: Viewer, build: { id: string; config: Config }): Promise<PanelData> {
  const db = appDb();
  const a = actorOf(v);
  const { origins, updates } = await updatesFor(db, a, build);
  const rows = await repo.libraryVersionList(db, a.workshopId);
  const byId = new Map<string, PanelData["library"][number]>();
  for (const r of rows) {
    const e = byId.get(r.id) ?? { id: r.id, name: r.name, latest: null, versions: [] };
    e.versions.push(r.version);
    e.latest = e.latest ?? r.version;
    byId.set(r.id, e);
  }
  return { origins, updates, library: [...byId.values()] };
}

/** The build's presets whose library version is older than the newest (the overview's notice; no merge computed). */
export async function outdatedPresetsFor(v: Viewer, build: { id: string; config: Config }) {
  const origins = await repo.originsOf(appDb(), v.workshop.id, build.id);
  return origins
    .filter((o) => o.latest > o.version)
    .flatMap((o) => {
      const p = build.config.presets.find((x) => x.id === o.presetId);
      return p ? [{ presetName: p.name, libraryName: o.libraryName, from: o.version, to: o.latest }] : [];
    });
}
