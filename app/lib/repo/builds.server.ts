// Builds: the workshop's commissions. Every read takes the viewer's workshop (and, for a
// client, their own user id), so a build of another workshop is simply not found.
import { isInt4 } from "../input/edges";
import { sql, type Kysely } from "kysely";
import type { Config } from "../config/schema";
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
  return scoped(db, scope)
    .leftJoin("users as c", "c.id", "b.client_user_id")
    .selectAll("b")
    .select(["c.email as client_email", "c.display_name as client_display_name"])
    .where("b.id", "=", id)
    .executeTakeFirst();
}

export type BuildMeta = { name: string; clientName: string; clientUserId: string | null; hiltNotes: string; status: BuildStatus };

export async function createBuild(db: Db, workshopId: string, meta: BuildMeta, config: Config) {
  return db
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
    .returning(["id"])
    .executeTakeFirstOrThrow();
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

/**
 * Replace the config only if nobody saved since `expectedVersion` was read; a stale save
 * changes nothing and answers false.
 */
export async function saveConfig(db: Db, workshopId: string, id: string, config: Config, expectedVersion: number) {
  // No stored version is outside int4; such a number would be a database error, not a stale save.
  if (!isInt4(expectedVersion)) return null;
  const now = new Date();
  const r = await db
    .updateTable("builds")
    // config_saved_at moves only here (and at creation): renders print it, so a rename or a
    // status change leaves a rendered header byte-for-byte the same.
    .set((eb) => ({ config: JSON.stringify(config), config_version: eb("config_version", "+", 1), config_saved_at: now, updated_at: now }))
    .where("workshop_id", "=", workshopId)
    .where("id", "=", id)
    .where("config_version", "=", expectedVersion)
    .returning(["config_version"])
    .executeTakeFirst();
  return r?.config_version ?? null;
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
