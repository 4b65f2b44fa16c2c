// Deleting a workshop template: its versions go with it (the existing ON DELETE CASCADE), but a
// single version can still never be removed or changed on its own. A version row may only be
// deleted once its template row is gone, which is exactly what the cascade does. Builds keep
// their RESTRICT / NO ACTION foreign keys, so a pinned template cannot be deleted at all.
// Frozen in time: never import app code here.
import { sql, type Kysely } from "kysely";

export async function up(db: Kysely<any>): Promise<void> {
  // The cascade runs after the template row is deleted in the same statement, so the template
  // is no longer visible here; a direct DELETE of a version still finds it and is refused.
  await sql`CREATE FUNCTION template_versions_no_lone_delete() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF EXISTS (SELECT 1 FROM templates WHERE id = OLD.template_id) THEN
        RAISE EXCEPTION 'template versions are immutable: delete the whole template instead';
      END IF;
      RETURN OLD;
    END $$`.execute(db);
  await sql`CREATE TRIGGER template_versions_no_lone_delete BEFORE DELETE ON template_versions
    FOR EACH ROW EXECUTE FUNCTION template_versions_no_lone_delete()`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`DROP TRIGGER IF EXISTS template_versions_no_lone_delete ON template_versions`.execute(db);
  await sql`DROP FUNCTION IF EXISTS template_versions_no_lone_delete()`.execute(db);
}
