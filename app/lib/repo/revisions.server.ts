// A build's config revisions: listed (sorted, filtered, paged on the server), read one by number,
// and restored (a restore is a new save of the old content through saveConfig, with the presets'
// library origins put back as that revision had them).
import { sql, type Kysely } from "kysely";
import type { Database } from "../db/types";
import { upgradeStored } from "../config/upgrade";
import { saveConfig } from "./builds.server";
import { restoreOrigins } from "./library.server";

type Db = Kysely<Database>;

export const REVISION_SORTS = ["number", "author", "errors", "warnings"] as const;
export type RevisionSort = (typeof REVISION_SORTS)[number];
export type RevisionQuery = { sort: RevisionSort; dir: "asc" | "desc"; page: number; perPage: number; author?: string | "none" };

/** One revision's metadata without its config (what lists show). */
export type RevisionSummary = {
  number: number;
  createdAt: Date;
  message: string | null;
  authorId: string | null;
  authorName: string | null;
  templateId: string | null;
  templateVersion: number | null;
  errorCount: number;
  warningCount: number;
};

function base(db: Db, workshopId: string, buildId: string) {
  return db
    .selectFrom("config_revisions as r")
    .leftJoin("users as u", "u.id", "r.author_id")
    .where("r.workshop_id", "=", workshopId)
    .where("r.build_id", "=", buildId);
}

const summaryColumns = [
  "r.number",
  "r.created_at as createdAt",
  "r.message",
  "r.author_id as authorId",
  "u.display_name as authorName",
  "r.template_id as templateId",
  "r.template_version as templateVersion",
  "r.error_count as errorCount",
  "r.warning_count as warningCount",
] as const;

export async function listRevisions(db: Db, workshopId: string, buildId: string, query: RevisionQuery): Promise<{ rows: RevisionSummary[]; total: number }> {
  let q = base(db, workshopId, buildId);
  if (query.author === "none") q = q.where("r.author_id", "is", null);
  else if (query.author) q = q.where("r.author_id", "=", query.author);
  const total = await q.select((eb) => eb.fn.countAll<string>().as("n")).executeTakeFirstOrThrow();
  const order = { number: sql`r.number`, author: sql`lower(coalesce(u.display_name, ''))`, errors: sql`r.error_count`, warnings: sql`r.warning_count` }[query.sort];
  const rows = await q
    .select(summaryColumns)
    .orderBy(order, query.dir)
    .orderBy("r.number", "desc")
    .limit(query.perPage)
    .offset((query.page - 1) * query.perPage)
    .execute();
  return { rows, total: Number(total.n) };
}

/** Everyone who saved a revision of this build, for the author filter. */
export async function revisionAuthors(db: Db, workshopId: string, buildId: string) {
  const rows = await base(db, workshopId, buildId)
    .select(["r.author_id as id", "u.display_name as name"])
    .distinct()
    .execute();
  return rows.sort((a, b) => (a.name ?? "").localeCompare(b.name ?? ""));
}

export async function getRevision(db: Db, workshopId: string, buildId: string, number: number) {
  const row = await base(db, workshopId, buildId).select([...summaryColumns, "r.config"]).where("r.number", "=", number).executeTakeFirst();
  // Revisions are never rewritten: one saved in an older form is upgraded as it is read.
  return row && { ...row, config: upgradeStored(row.config) };
}
export type RevisionWithConfig = NonNullable<Awaited<ReturnType<typeof getRevision>>>;

/**
 * Put revision `number`'s config back as a new revision (nothing is rewritten). Stale like any
 * save: answers null when the build moved on since `expectedVersion`.
 */
export async function restoreRevision(db: Db, workshopId: string, buildId: string, number: number, expectedVersion: number, authorId: string, message?: string | null) {
  const old = await getRevision(db, workshopId, buildId, number);
  if (!old) return { kind: "missing" as const };
  // The presets' library origins go back with the looks (decision 019), in the same transaction.
  const saved = await db.transaction().execute(async (trx) => {
    const n = await saveConfig(trx, workshopId, buildId, old.config, expectedVersion, {
      authorId,
      message: message?.trim() || `Restored revision ${number}`,
      counts: { errors: old.errorCount, warnings: old.warningCount },
    });
    if (n !== null) await restoreOrigins(trx, workshopId, buildId, number, n);
    return n;
  });
  return saved === null ? { kind: "stale" as const } : { kind: "restored" as const, number: saved };
}
