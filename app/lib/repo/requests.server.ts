// Client requests in PostgreSQL: listed per build (newest first), counted open per build, asked
// and answered. An answer is a compare-and-set on `version`, so a stale answer changes nothing.
import type { Kysely, Transaction } from "kysely";
import type { ClientRequestKind, ClientRequestStatus, Database } from "../db/types";
import { isUuid } from "./builds.server";

type Db = Kysely<Database> | Transaction<Database>;

export type ClientRequestRow = {
  id: string;
  buildId: string;
  kind: ClientRequestKind;
  message: string;
  status: ClientRequestStatus;
  reply: string;
  askedBy: string | null;
  askedByName: string | null;
  askedAt: Date;
  handledByName: string | null;
  updatedAt: Date;
  version: number;
};

function base(db: Db) {
  return db
    .selectFrom("client_requests as r")
    .leftJoin("users as a", "a.id", "r.asked_by")
    .leftJoin("users as h", "h.id", "r.handled_by")
    .select([
      "r.id",
      "r.build_id as buildId",
      "r.kind",
      "r.message",
      "r.status",
      "r.reply",
      "r.asked_by as askedBy",
      "a.display_name as askedByName",
      "r.asked_at as askedAt",
      "h.display_name as handledByName",
      "r.updated_at as updatedAt",
      "r.version",
    ]);
}

export async function listClientRequests(db: Db, workshopId: string, buildId: string): Promise<ClientRequestRow[]> {
  return base(db).where("r.workshop_id", "=", workshopId).where("r.build_id", "=", buildId).orderBy("r.asked_at", "desc").orderBy("r.id").execute();
}

export async function getClientRequest(db: Db, workshopId: string, buildId: string, id: string): Promise<ClientRequestRow | null> {
  if (!isUuid(id)) return null;
  return (await base(db).where("r.workshop_id", "=", workshopId).where("r.build_id", "=", buildId).where("r.id", "=", id).executeTakeFirst()) ?? null;
}

/** Open or in-hand requests per build of the workshop (for badges), or of one build. */
export async function openRequestCounts(db: Db, workshopId: string, buildId?: string): Promise<Map<string, number>> {
  let q = db
    .selectFrom("client_requests")
    .select(["build_id", (eb) => eb.fn.countAll<string>().as("n")])
    .where("workshop_id", "=", workshopId)
    .where("status", "in", ["open", "in-hand"])
    .groupBy("build_id");
  if (buildId) q = q.where("build_id", "=", buildId);
  const rows = await q.execute();
  return new Map(rows.map((r) => [r.build_id, Number(r.n)]));
}

export async function insertClientRequest(db: Db, r: { workshopId: string; buildId: string; kind: ClientRequestKind; message: string; askedBy: string }): Promise<string> {
  const row = await db
    .insertInto("client_requests")
    .values({ workshop_id: r.workshopId, build_id: r.buildId, kind: r.kind, message: r.message, asked_by: r.askedBy })
    .returning("id")
    .executeTakeFirstOrThrow();
  return row.id;
}

/** Set status and reply if the request is still at `version`; the new version, or null when stale. */
export async function answerClientRequest(db: Db, id: string, version: number, a: { status: ClientRequestStatus; reply: string; by: string }): Promise<number | null> {
  const row = await db
    .updateTable("client_requests")
    .set((eb) => ({ status: a.status, reply: a.reply, handled_by: a.by, updated_at: new Date(), version: eb("version", "+", 1) }))
    .where("id", "=", id)
    .where("version", "=", version)
    .returning("version")
    .executeTakeFirst();
  return row?.version ?? null;
}
