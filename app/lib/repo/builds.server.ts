// Builds: the workshop's commissions. Every read takes the viewer's workshop (and, for a
// client, their own user id), so a build of another workshop is simply not found.
import { isInt4 } from "../input/edges";
import { sql, type Kysely } from "kysely";
import type { Config } from "../config/schema";
import { upgradeStored } from "../config/upgrade";
import { BUILD_STATUSES, type BuildStatus, type Database } from "../db/types";

type Db = Kysely<Database>;
export type Scope = { workshopId: string; clientUserId?: string };

export const SORTABLE = ["name", "client", "status", "updated", "created"] as const;
export type SortKey = (typeof SORTABLE)[number];
export type BuildQuery = {
  q?: string;
  status?: BuildStatus;
  archived?: boolean;
  sort: SortKey;
  dir: "asc" | "desc";
  page: number;
  perPage: number;
};

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
export const isUuid = (s: string) => UUID.test(s);

function scoped(db: Db, scope: Scope) {
  let q = db.selectFrom("builds as b").where("b.workshop_id", "=", scope.workshopId);
  if (scope.clientUserId) q = q.where("b.client_user_id", "=", scope.clientUserId);
  return q;
}

export async function listBuilds(db: Db, scope: Scope, query: BuildQuery) {
  let q = scoped(db, scope);
  q = query.archived ? q.where("b.archived_at", "is not", null) : q.where("b.archived_at", "is", null);
  if (query.status) q = q.where("b.status", "=", query.status);
  if (query.q) {
    const like = `%${query.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    q = q.where((eb) => eb.or([eb("b.name", "ilike", like), eb("b.client_name", "ilike", like), eb("b.hilt_notes", "ilike", like)]));
  }
  const order = {
    name: sql`lower(b.name)`,
    client: sql`lower(b.client_name)`,
    status: sql`array_position(${sql.raw(`ARRAY[${BUILD_STATUSES.map((s) => `'${s}'`).join(",")}]`)}, b.status)`,
    updated: sql`b.updated_at`,
    created: sql`b.created_at`,
  }[query.sort];
  // The page and the total in one round trip (a window count); a page past the end has no rows
  // to carry it, so only then is the total counted on its own (decision 010).
  const found = await q
    .select(["b.id", "b.name", "b.client_name", "b.status", "b.updated_at", "b.created_at", "b.archived_at"])
    .select(sql<number>`count(*) over ()`.as("total_count"))
    .orderBy(order, query.dir)
    .orderBy("b.id")
    .limit(query.perPage)
    .offset((query.page - 1) * query.perPage)
    .execute();
  const total = found.length
    ? Number(found[0].total_count)
    : Number((await q.select((eb) => eb.fn.countAll<number>().as("n")).executeTakeFirstOrThrow()).n);
  const rows = found.map(({ total_count: _, ...row }) => row);
  return { rows, total };
}

export async function getBuild(db: Db, scope: Scope, id: string) {
  if (!isUuid(id)) return undefined;
  const row = await scoped(db, scope)
    .leftJoin("users as c", "c.id", "b.client_user_id")
    .selectAll("b")
    .select(["c.email as client_email", "c.display_name as client_display_name"])
    .where("b.id", "=", id)
    .executeTakeFirst();
  // A config stored in an older form is read in the current one (deterministically, so renders stay stable).
  return row && { ...row, config: upgradeStored(row.config) };
}

export type BuildMeta = { name: string; clientName: string; clientUserId: string | null; hiltNotes: string; status: BuildStatus };

/** A new build and its revision 1, in one transaction (a build always has its current config as a revision). */
export async function createBuild(db: Db, workshopId: string, meta: BuildMeta, config: Config, note: { authorId: string | null; counts: { errors: number; warnings: number } }) {
  const { authorId, counts } = note;
  const run = async (tx: Db) => {
    const b = await tx
      .insertInto("builds")
      .values({
        workshop_id: workshopId,
        name: meta.name,
        client_name: meta.clientName,
        client_user_id: meta.clientUserId,
        hilt_notes: meta.hiltNotes,
        status: meta.status,
        config: JSON.stringify(config),
        config_saved_at: new Date(),
      })
      .returning(["id", "config_version", "config_saved_at"])
      .executeTakeFirstOrThrow();
    await tx
      .insertInto("config_revisions")
      .values({
        build_id: b.id,
        workshop_id: workshopId,
        number: b.config_version,
        config: JSON.stringify(config),
        author_id: authorId,
        created_at: b.config_saved_at,
        message: null,
        template_id: null,
        template_version: null,
        error_count: counts.errors,
        warning_count: counts.warnings,
      })
      .execute();
    return { id: b.id };
  };
  return db.isTransaction ? run(db) : db.transaction().execute(run);
}

export async function updateBuildMeta(db: Db, workshopId: string, id: string, meta: BuildMeta) {
  await db
    .updateTable("builds")
    .set({
      name: meta.name,
      client_name: meta.clientName,
      client_user_id: meta.clientUserId,
      hilt_notes: meta.hiltNotes,
      status: meta.status,
      updated_at: new Date(),
    })
    .where("workshop_id", "=", workshopId)
    .where("id", "=", id)
    .execute();
}

/** What a save records about itself beside the config (the revision's metadata). */
export type RevisionNote = {
  /** The viewer who saved; null only for saves made by the system (seed, migration). */
  authorId: string | null;
  /** "What changed", optional; trimmed, empty is none. */
  message?: string | null;
  /** The validator's counts for this config (repo/ does not run the validator: callers do). */
  counts: { errors: number; warnings: number };
};

/**
 * Replace the config only if nobody saved since `expectedVersion` was read, and append the
 * revision (number = the new config_version, created_at = the new config_saved_at) in the same
 * statement: both happen or neither. A stale save changes nothing and answers null.
 */
export async function saveConfig(db: Db, workshopId: string, id: string, config: Config, expectedVersion: number, note: RevisionNote) {
  // No stored version is outside int4; such a number would be a database error, not a stale save.
  if (!isInt4(expectedVersion)) return null;
  const now = new Date();
  const counts = note.counts;
  const message = note.message?.trim() || null;
  const json = JSON.stringify(config);
  // config_saved_at moves only here (and at creation): renders print it, so a rename or a status
  // change leaves a rendered header byte-for-byte the same. The revision copies it.
  const r = await sql<{ number: number }>`
    WITH saved AS (
      UPDATE builds SET config = ${json}::jsonb, config_version = config_version + 1, config_saved_at = ${now}, updated_at = ${now}
      WHERE workshop_id = ${workshopId} AND id = ${id} AND config_version = ${expectedVersion}
      RETURNING id, workshop_id, config_version, config, config_saved_at, pinned_template_id, pinned_template_version
    )
    INSERT INTO config_revisions (build_id, workshop_id, number, config, author_id, created_at, message, template_id, template_version, error_count, warning_count)
    SELECT id, workshop_id, config_version, config, ${note.authorId}::uuid, config_saved_at, ${message}::text,
           pinned_template_id, pinned_template_version, ${counts.errors}::integer, ${counts.warnings}::integer
    FROM saved
    RETURNING number`.execute(db);
  return r.rows[0]?.number ?? null;
}


/** The build's config version now (after a refused stale save, to say how far it moved); null when it is gone. */
export async function currentConfigVersion(db: Db, workshopId: string, id: string): Promise<number | null> {
  const row = await db.selectFrom("builds").select("config_version").where("id", "=", id).where("workshop_id", "=", workshopId).executeTakeFirst();
  return row?.config_version ?? null;
}

export async function setArchived(db: Db, workshopId: string, id: string, archived: boolean) {
  await db
    .updateTable("builds")
    .set({ archived_at: archived ? new Date() : null, updated_at: new Date() })
    .where("workshop_id", "=", workshopId)
    .where("id", "=", id)
    .execute();
}

/** Client accounts of the workshop, for the build form's client picker. */
export async function listClients(db: Db, workshopId: string) {
  return db
    .selectFrom("memberships as m")
    .innerJoin("users as u", "u.id", "m.user_id")
    .select(["u.id", "u.display_name", "u.email"])
    .where("m.workshop_id", "=", workshopId)
    .where("m.role", "=", "client")
    .orderBy("u.display_name")
    .execute();
}
