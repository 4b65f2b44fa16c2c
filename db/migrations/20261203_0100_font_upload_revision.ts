// Which revision each font upload made: the card bundle of revision N takes each font's files
// from the newest upload at or before N. Uploads before this column are matched to the first
// revision saved at or after them (the upload and its save share a transaction).
// Frozen in time: never import app code here.
import { sql, type Kysely } from "kysely";

export async function up(db: Kysely<any>): Promise<void> {
  await sql`ALTER TABLE font_uploads ADD COLUMN revision integer CHECK (revision >= 1)`.execute(db);
  await sql`UPDATE font_uploads u SET revision = (
    SELECT min(r.number) FROM config_revisions r WHERE r.build_id = u.build_id AND r.created_at >= u.created_at
  )`.execute(db);
  await sql`CREATE INDEX font_uploads_build_font_revision_idx ON font_uploads (build_id, font_id, revision)`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`DROP INDEX IF EXISTS font_uploads_build_font_revision_idx`.execute(db);
  await sql`ALTER TABLE font_uploads DROP COLUMN IF EXISTS revision`.execute(db);
}
