// Export and import of "hiltbench.preset/1" files against the database (rules in exchange.ts).
import type { Kysely } from "kysely";
import type { Viewer } from "../auth/auth.server";
import { db as appDb } from "../db/db.server";
import type { Database } from "../db/types";
import * as repo from "../repo/library.server";
import { checkImport, exportDocument, type PresetDocument } from "./exchange";
import { actorOf, type Actor, type Outcome } from "./service.server";

export { isPresetDocument, MAX_PRESET_DOCUMENT_BYTES, PRESET_FORMAT } from "./exchange";

type Db = Kysely<Database>;

/** All versions, or one. Null when the preset (or that version) is not in the workshop. */
export async function exportPreset(db: Db, a: Actor, presetId: string, version?: number): Promise<PresetDocument | null> {
  const p = await repo.getLibraryPreset(db, a.workshopId, presetId);
  if (!p) return null;
  const wanted = version === undefined ? p.versions.map((v) => v.version) : p.versions.some((v) => v.version === version) ? [version] : [];
  if (wanted.length === 0) return null;
  const bodies = await repo.versionBodies(db, a.workshopId, p.id, wanted);
  return exportDocument(
    p,
    p.versions.filter((v) => wanted.includes(v.version)).map((v) => ({ version: v.version, changelog: v.changelog, createdAt: v.createdAt, body: bodies.get(v.version) })),
  );
}

/** A new library preset from a file: its versions renumbered from 1 in order, all or nothing. */
export type Imported = { presetId: string; versions: number; url: string };

export async function importPreset(db: Db, a: Actor, input: unknown): Promise<Outcome<Imported>> {
  const c = checkImport(input);
  if (!c.ok) return { status: 422, body: { error: c.message, diagnostics: c.diagnostics } };
  const r = await repo.importLibraryPreset(db, a.workshopId, a.userId, c);
  if (r.kind === "name-taken") return { status: 409, body: { error: `Your library already has a preset named ${c.name}; rename that one (or the file's "name") and import again. Nothing was imported.` } };
  return { status: 201, body: { presetId: r.presetId, versions: c.versions.length, url: `/api/presets/${r.presetId}` } };
}

export const exportFor = (v: Viewer, id: string, version?: number) => exportPreset(appDb(), actorOf(v), id, version);
export const importFor = (v: Viewer, input: unknown) => importPreset(appDb(), actorOf(v), input);
