// The workshop's preset library: presets, their immutable versions, and which builds' presets
// came from which version. Every read takes the workshop, so another workshop's preset is
// simply not found. Versions are written once (a trigger refuses changes, migration 20261203_0100).
import { sql, type Kysely } from "kysely";
import type { Config } from "../config/schema";
import { upgradeStored } from "../config/upgrade";
import type { BuildStatus, Database } from "../db/types";
import { isInt4 } from "../input/edges";
import { isUuid } from "./builds.server";

type Db = Kysely<Database>;

export type LibraryQuery = { q?: string; tag?: string; page: number; perPage: number };
export type LibraryRow = { id: string; name: string; tags: string[]; latestVersion: number | null; publishedAt: Date; buildCount: number; buildNames: string[] };

export async function listLibrary(db: Db, workshopId: string, query: LibraryQuery): Promise<{ rows: LibraryRow[]; total: number }> {
  let q = db.selectFrom("library_presets as p").where("p.workshop_id", "=", workshopId);
  if (query.q) q = q.where("p.name", "ilike", `%${query.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`);
  if (query.tag) q = q.where(sql<boolean>`${query.tag} = ANY(p.tags)`);
  const total = Number((await q.select((eb) => eb.fn.countAll<string>().as("n")).executeTakeFirstOrThrow()).n);
  const rows = await q
    .select([
      "p.id",
      "p.name",
      "p.tags",
      "p.published_at as publishedAt",
      sql<number | null>`(SELECT max(v.version) FROM library_versions v WHERE v.preset_id = p.id)`.as("latestVersion"),
      sql<string[]>`coalesce((SELECT array_agg(DISTINCT b.name ORDER BY b.name) FROM build_preset_origins o JOIN builds b ON b.id = o.build_id
        WHERE o.library_preset_id = p.id AND b.archived_at IS NULL), '{}')`.as("buildNames"),
    ])
    .orderBy(sql`lower(p.name)`)
    .orderBy("p.id")
    .limit(query.perPage)
    .offset((query.page - 1) * query.perPage)
    .execute();
  return { rows: rows.map((r) => ({ ...r, buildCount: r.buildNames.length })), total };
}

/** Every tag in the workshop's library, for the filter. */
export async function libraryTags(db: Db, workshopId: string): Promise<string[]> {
  const r = await sql<{ tag: string }>`SELECT DISTINCT unnest(tags) AS tag FROM library_presets WHERE workshop_id = ${workshopId} ORDER BY 1`.execute(db);
  return r.rows.map((x) => x.tag);
}

export type VersionSummary = { version: number; changelog: string; authorName: string | null; createdAt: Date; errorCount: number; warningCount: number };

export async function getLibraryPreset(db: Db, workshopId: string, id: string) {
  if (!isUuid(id)) return undefined;
  const p = await db.selectFrom("library_presets").selectAll().where("workshop_id", "=", workshopId).where("id", "=", id).executeTakeFirst();
  if (!p) return undefined;
  const versions: VersionSummary[] = await db
    .selectFrom("library_versions as v")
    .leftJoin("users as u", "u.id", "v.author_id")
    .select(["v.version", "v.changelog", "u.display_name as authorName", "v.created_at as createdAt", "v.error_count as errorCount", "v.warning_count as warningCount"])
    .where("v.preset_id", "=", id)
    .orderBy("v.version", "desc")
    .execute();
  return { ...p, versions };
}

export async function getLibraryVersion(db: Db, workshopId: string, id: string, version: number) {
  if (!isUuid(id) || !isInt4(version)) return undefined;
  return db
    .selectFrom("library_versions as v")
    .leftJoin("users as u", "u.id", "v.author_id")
    .select(["v.preset_id as presetId", "v.version", "v.body", "v.changelog", "u.display_name as authorName", "v.created_at as createdAt", "v.error_count as errorCount", "v.warning_count as warningCount"])
    .where("v.workshop_id", "=", workshopId)
    .where("v.preset_id", "=", id)
    .where("v.version", "=", version)
    .executeTakeFirst();
}

/** Bodies of several versions of one preset, by number. */
export async function versionBodies(db: Db, workshopId: string, id: string, versions: number[]): Promise<Map<number, unknown>> {
  if (versions.length === 0) return new Map();
  const rows = await db.selectFrom("library_versions").select(["version", "body"]).where("workshop_id", "=", workshopId).where("preset_id", "=", id).where("version", "in", versions).execute();
  return new Map(rows.map((r) => [r.version, r.body]));
}

export type PublishInput = { name: string; tags: string[]; notes: string; body: unknown; changelog: string; authorId: string | null; counts: { errors: number; warnings: number } };
export type PublishResult = { kind: "published"; presetId: string; version: number } | { kind: "stale"; latest: number | null } | { kind: "name-taken" } | { kind: "missing" };

const isUniqueViolation = (e: unknown) => (e as { code?: string })?.code === "23505";

async function insertVersion(trx: Db, workshopId: string, presetId: string, version: number, input: PublishInput) {
  await trx
    .insertInto("library_versions")
    .values({ preset_id: presetId, version, workshop_id: workshopId, body: JSON.stringify(input.body), changelog: input.changelog, author_id: input.authorId, error_count: input.counts.errors, warning_count: input.counts.warnings })
    .execute();
}

/** A new library preset with its version 1. */
export async function createLibraryPreset(db: Db, workshopId: string, input: PublishInput): Promise<PublishResult> {
  try {
    return await db.transaction().execute(async (trx) => {
      const p = await trx
        .insertInto("library_presets")
        .values({ workshop_id: workshopId, name: input.name, tags: input.tags, notes: input.notes, head_version: 1, created_by: input.authorId })
        .returning("id")
        .executeTakeFirstOrThrow();
      await insertVersion(trx, workshopId, p.id, 1, input);
      return { kind: "published" as const, presetId: p.id, version: 1 };
    });
  } catch (e) {
    if (isUniqueViolation(e)) return { kind: "name-taken" };
    throw e;
  }
}

/**
 * A new version of an existing preset, only over the version it was based on (the latest
 * existing one); a stale publish changes nothing. The preset row is locked while deciding.
 */
export async function publishLibraryVersion(db: Db, workshopId: string, presetId: string, baseVersion: number, input: PublishInput, trxIn?: Db): Promise<PublishResult> {
  if (!isUuid(presetId)) return { kind: "missing" };
  const run = async (trx: Db): Promise<PublishResult> => {
    const p = await trx.selectFrom("library_presets").select(["id", "head_version"]).where("workshop_id", "=", workshopId).where("id", "=", presetId).forUpdate().executeTakeFirst();
    if (!p) return { kind: "missing" };
    const latest = (await trx.selectFrom("library_versions").select((eb) => eb.fn.max("version").as("v")).where("preset_id", "=", presetId).executeTakeFirstOrThrow()).v as number | null;
    if (latest !== baseVersion) return { kind: "stale", latest };
    const version = p.head_version + 1;
    await trx.updateTable("library_presets").set({ head_version: version, name: input.name, tags: input.tags, notes: input.notes, published_at: new Date() }).where("id", "=", presetId).execute();
    await insertVersion(trx, workshopId, presetId, version, input);
    return { kind: "published", presetId, version };
  };
  try {
    return trxIn ? await run(trxIn) : await db.transaction().execute(run);
  } catch (e) {
    if (isUniqueViolation(e)) return { kind: "name-taken" };
    throw e;
  }
}

export type BuildUse = { buildId: string; buildName: string; status: BuildStatus; presetId: string; version: number };

/** Builds whose presets came from this library preset (archived ones included: they still hold it). */
export async function buildsUsing(db: Db, workshopId: string, presetId: string, version?: number): Promise<BuildUse[]> {
  if (!isUuid(presetId)) return [];
  let q = db
    .selectFrom("build_preset_origins as o")
    .innerJoin("builds as b", "b.id", "o.build_id")
    .select(["b.id as buildId", "b.name as buildName", "b.status", "o.preset_id as presetId", "o.library_version as version"])
    .where("o.workshop_id", "=", workshopId)
    .where("o.library_preset_id", "=", presetId);
  if (version !== undefined) q = q.where("o.library_version", "=", version);
  return q.orderBy("b.name").orderBy("o.preset_id").execute();
}

export type DeleteResult = { kind: "deleted" } | { kind: "in-use"; builds: BuildUse[] } | { kind: "last" } | { kind: "missing" };

/** The guarded path for deleting a version: only one no build uses, never the only one left. */
export async function deleteLibraryVersion(db: Db, workshopId: string, presetId: string, version: number): Promise<DeleteResult> {
  if (!isUuid(presetId) || !isInt4(version)) return { kind: "missing" };
  return db.transaction().execute(async (trx) => {
    const p = await trx.selectFrom("library_presets").select("id").where("workshop_id", "=", workshopId).where("id", "=", presetId).forUpdate().executeTakeFirst();
    if (!p) return { kind: "missing" as const };
    const versions = await trx.selectFrom("library_versions").select("version").where("preset_id", "=", presetId).execute();
    if (!versions.some((v) => v.version === version)) return { kind: "missing" as const };
    const builds = await buildsUsing(trx, workshopId, presetId, version);
    if (builds.length > 0) return { kind: "in-use" as const, builds };
    if (versions.length === 1) return { kind: "last" as const };
    await sql`SET LOCAL hiltbench.version_delete = 'unused'`.execute(trx);
    await trx.deleteFrom("library_versions").where("preset_id", "=", presetId).where("version", "=", version).execute();
    return { kind: "deleted" as const };
  });
}

export type Origin = { presetId: string; libraryPresetId: string; libraryName: string; version: number; latest: number };

/** Where a build's presets came from, with each library preset's latest version. */
export async function originsOf(db: Db, workshopId: string, buildId: string): Promise<Origin[]> {
  if (!isUuid(buildId)) return [];
  return db
    .selectFrom("build_preset_origins as o")
    .innerJoin("library_presets as p", "p.id", "o.library_preset_id")
    .select([
      "o.preset_id as presetId",
      "o.library_preset_id as libraryPresetId",
      "p.name as libraryName",
      "o.library_version as version",
      sql<number>`(SELECT max(v.version) FROM library_versions v WHERE v.preset_id = p.id)`.as("latest"),
    ])
    .where("o.workshop_id", "=", workshopId)
    .where("o.build_id", "=", buildId)
    .orderBy("o.preset_id")
    .execute();
}

/** The preset's origin from `revision` (the build's revision that holds it) on; logged for restores. */
export async function setOrigin(db: Db, workshopId: string, buildId: string, presetId: string, libraryPresetId: string, version: number, revision: number) {
  await db
    .insertInto("build_preset_origins")
    .values({ build_id: buildId, preset_id: presetId, workshop_id: workshopId, library_preset_id: libraryPresetId, library_version: version })
    .onConflict((oc) => oc.columns(["build_id", "preset_id"]).doUpdateSet({ library_preset_id: libraryPresetId, library_version: version, added_at: new Date() }))
    .execute();
  await db.insertInto("preset_origin_events").values({ build_id: buildId, preset_id: presetId, revision, library_preset_id: libraryPresetId, library_version: version }).execute();
}

/**
 * After revision `asOf` was restored as revision `revision`: the build's origins become the ones
 * revision `asOf` had (an origin whose library version has since been deleted is left out), and
 * the change is logged at `revision`, so restoring any later revision finds it. Call in the
 * restore's transaction.
 */
export async function restoreOrigins(db: Db, workshopId: string, buildId: string, asOf: number, revision: number) {
  const then = await sql<{ preset_id: string; library_preset_id: string; library_version: number }>`
    SELECT e.preset_id, e.library_preset_id, e.library_version
    FROM (SELECT DISTINCT ON (preset_id) preset_id, library_preset_id, library_version
          FROM preset_origin_events WHERE build_id = ${buildId} AND revision <= ${asOf}
          ORDER BY preset_id, revision DESC, id DESC) e
    JOIN library_versions v ON v.preset_id = e.library_preset_id AND v.version = e.library_version`.execute(db);
  const now = await db.selectFrom("build_preset_origins").select(["preset_id", "library_preset_id", "library_version"]).where("build_id", "=", buildId).where("workshop_id", "=", workshopId).execute();
  const wanted = new Map(then.rows.map((r) => [r.preset_id, r]));
  for (const o of now)
    if (!wanted.has(o.preset_id)) {
      await db.deleteFrom("build_preset_origins").where("build_id", "=", buildId).where("preset_id", "=", o.preset_id).execute();
      await db.insertInto("preset_origin_events").values({ build_id: buildId, preset_id: o.preset_id, revision, library_preset_id: null, library_version: null }).execute();
    }
  for (const w of wanted.values()) {
    const same = now.find((o) => o.preset_id === w.preset_id && o.library_preset_id === w.library_preset_id && o.library_version === w.library_version);
    if (!same) await setOrigin(db, workshopId, buildId, w.preset_id, w.library_preset_id, w.library_version, revision);
  }
}

/** Builds using a library preset with their configs, for the dry run (one query). */
export async function buildsForDryRun(db: Db, workshopId: string, presetId: string) {
  if (!isUuid(presetId)) return [];
  const rows = await db
    .selectFrom("build_preset_origins as o")
    .innerJoin("builds as b", "b.id", "o.build_id")
    .select(["b.id", "b.name", "b.status", "b.config", "b.config_version as configVersion", "o.preset_id as presetId", "o.library_version as version"])
    .where("o.workshop_id", "=", workshopId)
    .where("o.library_preset_id", "=", presetId)
    .where("b.archived_at", "is", null)
    .orderBy("b.name")
    .execute();
  return rows.map((r) => ({ ...r, config: upgradeStored(r.config as Config) }));
}

export type ImportInput = { name: string; tags: string[]; notes: string; versions: { changelog: string; body: unknown; counts: { errors: number; warnings: number } }[] };

/** A whole preset with its versions (1…n) in one transaction. */
export async function importLibraryPreset(db: Db, workshopId: string, authorId: string | null, input: ImportInput): Promise<{ kind: "imported"; presetId: string } | { kind: "name-taken" }> {
  try {
    return await db.transaction().execute(async (trx) => {
      const p = await trx
        .insertInto("library_presets")
        .values({ workshop_id: workshopId, name: input.name, tags: input.tags, notes: input.notes, head_version: input.versions.length, created_by: authorId })
        .returning("id")
        .executeTakeFirstOrThrow();
      let n = 0;
      for (const v of input.versions) {
        n += 1;
        await insertVersion(trx, workshopId, p.id, n, { name: input.name, tags: input.tags, notes: input.notes, body: v.body, changelog: v.changelog, authorId, counts: v.counts });
      }
      return { kind: "imported" as const, presetId: p.id };
    });
  } catch (e) {
    if (isUniqueViolation(e)) return { kind: "name-taken" };
    throw e;
  }
}

/** Every preset's versions, newest first (the "Add from library" picker). */
export async function libraryVersionList(db: Db, workshopId: string) {
  return db
    .selectFrom("library_presets as p")
    .innerJoin("library_versions as lv", "lv.preset_id", "p.id")
    .select(["p.id", "p.name", "lv.version"])
    .where("p.workshop_id", "=", workshopId)
    .orderBy(sql`lower(p.name)`)
    .orderBy("lv.version", "desc")
    .limit(2000)
    .execute();
}
