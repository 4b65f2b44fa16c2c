// When the build's config was last saved, apart from `updated_at` (which also moves on a rename,
// a status change, notes or archiving). Renders print this time, so the same config and template
// version always give the same bytes. Existing rows take their `updated_at`, the best we know.
// New rows default to their insert time: creating a build saves its first config.
// Frozen in time: never import app code here.
import { sql, type Kysely } from "kysely";

export async function up(db: Kysely<any>): Promise<void> {
  await sql`ALTER TABLE builds ADD COLUMN config_saved_at timestamptz`.execute(db);
  await sql`UPDATE builds SET config_saved_at = updated_at`.execute(db);
  await sql`ALTER TABLE builds ALTER COLUMN config_saved_at SET DEFAULT now(), ALTER COLUMN config_saved_at SET NOT NULL`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`ALTER TABLE builds DROP COLUMN IF EXISTS config_saved_at`.execute(db);
}
