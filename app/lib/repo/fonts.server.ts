// Font uploads and their files: the newest accepted upload of each font of a build is what the
// build has; older ones stay as history. Stored files are found by SHA-256, and only through
// a build that holds them, so a hash alone opens nothing.
import type { Kysely } from "kysely";
import type { Database } from "../db/types";

type Db = Kysely<Database>;

export async function latestUploads(db: Db, buildId: string) {
  const rows = await db
    .selectFrom("font_uploads as u")
    .leftJoin("users as p", "p.id", "u.uploaded_by")
    .select(["u.id", "u.font_id", "u.status", "u.layout_name", "u.report", "u.created_at", "p.display_name as uploaded_by"])
    .where("u.build_id", "=", buildId)
    .orderBy("u.created_at", "desc")
    .orderBy("u.id")
    .execute();
  const seen = new Set<string>();
  return rows.filter((r) => !seen.has(r.font_id) && seen.add(r.font_id));
}

/** Each font's newest upload whose save made revision `n` or an earlier one. */
async function uploadsAtRevision(db: Db, buildId: string, n: number) {
  const rows = await db
    .selectFrom("font_uploads")
    .select(["id", "font_id"])
    .where("build_id", "=", buildId)
    .where("revision", "<=", n)
    .orderBy("revision", "desc")
    .orderBy("created_at", "desc")
    .orderBy("id")
    .execute();
  const seen = new Set<string>();
  return rows.filter((r) => !seen.has(r.font_id) && seen.add(r.font_id));
}

export async function filesOfUpload(db: Db, uploadId: string) {
  return db.selectFrom("font_files").selectAll().where("upload_id", "=", uploadId).orderBy("path").execute();
}

/** A stored file, if some font upload of this build holds it. */
export async function storedFileOfBuild(db: Db, buildId: string, sha256: string) {
  if (!/^[0-9a-f]{64}$/.test(sha256)) return undefined;
  return db
    .selectFrom("stored_files as s")
    .select(["s.sha256", "s.size", "s.key", "s.storage"])
    .where("s.sha256", "=", sha256)
    .where((eb) =>
      eb.exists(
        eb
          .selectFrom("font_files as f")
          .innerJoin("font_uploads as u", "u.id", "f.upload_id")
          .select("f.sha256")
          .whereRef("f.sha256", "=", "s.sha256")
          .where("u.build_id", "=", buildId),
      ),
    )
    .executeTakeFirst();
}

export async function listLayouts(db: Db, workshopId: string) {
  return db.selectFrom("font_layouts").select(["id", "name", "rules"]).where("workshop_id", "=", workshopId).orderBy("name").execute();
}

export async function saveLayout(db: Db, workshopId: string, name: string, rules: { cue: string; pattern: string }[]) {
  await db
    .insertInto("font_layouts")
    .values({ workshop_id: workshopId, name, rules: JSON.stringify(rules) })
    .onConflict((oc) => oc.columns(["workshop_id", "name"]).doUpdateSet({ rules: JSON.stringify(rules) }))
    .execute();
}

/**
 * The files of each font's newest upload, with where their bytes are (for the card bundle); with
 * `atRevision`, the newest upload whose save made that revision or an earlier one.
 */
export async function latestFontFiles(db: Db, buildId: string, atRevision?: number) {
  const latest = atRevision === undefined ? await latestUploads(db, buildId) : await uploadsAtRevision(db, buildId, atRevision);
  const out = new Map<string, { path: string; size: number; sha256: string; key: string }[]>();
  for (const u of latest) {
    const rows = await db
      .selectFrom("font_files as f")
      .innerJoin("stored_files as s", "s.sha256", "f.sha256")
      .select(["f.path", "f.size", "f.sha256", "s.key"])
      .where("f.upload_id", "=", u.id)
      .orderBy("f.path")
      .execute();
    out.set(u.font_id, rows);
  }
  return out;
}
