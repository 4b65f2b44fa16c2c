// Releases as the handoff reads them (rows are written by the release flow, decision 023 reads only).
import type { Kysely } from "kysely";
import type { Database } from "../db/types";

type Db = Kysely<Database>;

/** A build's newest release (highest number): what its client gets. */
export function newestRelease(db: Db, workshopId: string, buildId: string) {
  return db
    .selectFrom("releases")
    .select(["number", "revision", "template_ref", "name_mode", "card_gb", "bundle_sha256", "bundle_bytes", "note", "released_at"])
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
