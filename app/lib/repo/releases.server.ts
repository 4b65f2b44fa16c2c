// Bench-check ticks and releases: data access only. Every read is scoped to the workshop.
// Releases are immutable (a trigger); ticks are rows that exist while an item is ticked. The
// handoff reads the newest release (what the client gets).
import type { Kysely, Transaction } from "kysely";
import type { Database } from "../db/types";

type Db = Kysely<Database> | Transaction<Database>;

export async function ticksOf(db: Db, buildId: string, revision: number) {
  return db
    .selectFrom("bench_check_ticks as t")
    .leftJoin("users as u", "u.id", "t.ticked_by")
    .select(["t.item_key", "t.ticked_at", "t.ticked_by", "u.display_name as ticked_by_name"])
    .where("t.build_id", "=", buildId)
    .where("t.revision", "=", revision)
    .execute();
}

/** Tick an item (a second tick keeps the first one's who and when). */
export async function tick(db: Db, buildId: string, revision: number, itemKey: string, userId: string) {
  await db
    .insertInto("bench_check_ticks")
    .values({ build_id: buildId, revision, item_key: itemKey, ticked_by: userId })
    .onConflict((oc) => oc.columns(["build_id", "revision", "item_key"]).doNothing())
    .execute();
}

export async function untick(db: Db, buildId: string, revision: number, itemKey: string) {
  await db.deleteFrom("bench_check_ticks").where("build_id", "=", buildId).where("revision", "=", revision).where("item_key", "=", itemKey).execute();
}

/** The revisions of a build that a review approved, newest first. */
export async function approvedRevisions(db: Db, buildId: string): Promise<number[]> {
  const rows = await db.selectFrom("review_requests").select("revision").distinct().where("build_id", "=", buildId).where("state", "=", "approved").orderBy("revision", "desc").execute();
  return rows.map((r) => r.revision);
}

export async function isApproved(db: Db, buildId: string, revision: number): Promise<boolean> {
  const r = await db.selectFrom("review_requests").select("id").where("build_id", "=", buildId).where("revision", "=", revision).where("state", "=", "approved").limit(1).executeTakeFirst();
  return r !== undefined;
}

export async function releasesOf(db: Db, workshopId: string, buildId: string) {
  return db
    .selectFrom("releases as r")
    .leftJoin("users as u", "u.id", "r.released_by")
    .selectAll("r")
    .select(["u.display_name as released_by_name"])
    .where("r.workshop_id", "=", workshopId)
    .where("r.build_id", "=", buildId)
    .orderBy("r.number", "desc")
    .execute();
}
export type ReleaseRow = Awaited<ReturnType<typeof releasesOf>>[number];

export async function lastReleaseNumber(db: Db, buildId: string): Promise<number> {
  const r = await db.selectFrom("releases").select((eb) => eb.fn.max("number").as("n")).where("build_id", "=", buildId).executeTakeFirst();
  return r?.n ?? 0;
}

export async function insertRelease(
  db: Db,
  r: { buildId: string; workshopId: string; number: number; revision: number; templateRef: string; templateVersion: number; nameMode: "long" | "8.3"; cardGb: number; sha256: string; bytes: number; note: string; userId: string },
) {
  return db
    .insertInto("releases")
    .values({
      build_id: r.buildId,
      workshop_id: r.workshopId,
      number: r.number,
      revision: r.revision,
      template_ref: r.templateRef,
      template_version: r.templateVersion,
      name_mode: r.nameMode,
      card_gb: r.cardGb,
      bundle_sha256: r.sha256,
      bundle_bytes: r.bytes,
      note: r.note,
      released_by: r.userId,
    })
    .returning("id")
    .executeTakeFirstOrThrow();
}

export async function setReleased(db: Db, buildId: string) {
  await db.updateTable("builds").set({ status: "released", updated_at: new Date() }).where("id", "=", buildId).execute();
}

/** The build's client account's e-mail and name, if the build has one. */
export async function clientOf(db: Db, buildId: string) {
  return db
    .selectFrom("builds as b")
    .innerJoin("users as u", "u.id", "b.client_user_id")
    .select(["u.email", "u.display_name"])
    .where("b.id", "=", buildId)
    .executeTakeFirst();
}

/** A build's newest release (highest number): what its client gets. */
export function newestRelease(db: Db, workshopId: string, buildId: string) {
  return db
    .selectFrom("releases")
    .select(["number", "revision", "template_ref", "template_version", "name_mode", "card_gb", "bundle_sha256", "bundle_bytes", "note", "released_at"])
    .where("workshop_id", "=", workshopId)
    .where("build_id", "=", buildId)
    .orderBy("number", "desc")
    .limit(1)
    .executeTakeFirst();
}

/** For a list of builds: which have a release, and the newest one's time. */
export async function releasedBuilds(db: Db, workshopId: string, buildIds: string[]): Promise<Map<string, Date>> {
  if (buildIds.length === 0) return new Map();
  const rows = await db
    .selectFrom("releases")
    .select(["build_id", (eb) => eb.fn.max("released_at").as("at")])
    .where("workshop_id", "=", workshopId)
    .where("build_id", "in", buildIds)
    .groupBy("build_id")
    .execute();
  return new Map(rows.map((r) => [r.build_id, new Date(r.at as unknown as string | Date)]));
}
