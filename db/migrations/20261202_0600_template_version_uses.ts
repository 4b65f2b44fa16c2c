// What a template version uses: the workshop templates it brings in with `use "name"`, directly
// or through them, each at the version that was latest when it was saved. Rendering a saved
// version resolves its partials from this record, so the same config and template version give
// the same bytes after a partial is edited. Null until recorded (versions saved before this
// migration get theirs at their first render); once recorded it never changes.
// Frozen in time: never import app code here.
import { sql, type Kysely } from "kysely";

export async function up(db: Kysely<any>): Promise<void> {
  await sql`ALTER TABLE template_versions ADD COLUMN uses jsonb`.execute(db);
  await sql`CREATE OR REPLACE FUNCTION template_versions_immutable() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF NEW.source IS DISTINCT FROM OLD.source OR NEW.version IS DISTINCT FROM OLD.version OR NEW.template_id IS DISTINCT FROM OLD.template_id
         OR (OLD.uses IS NOT NULL AND NEW.uses IS DISTINCT FROM OLD.uses) THEN
        RAISE EXCEPTION 'template versions are immutable';
      END IF;
      RETURN NEW;
    END $$`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`CREATE OR REPLACE FUNCTION template_versions_immutable() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF NEW.source IS DISTINCT FROM OLD.source OR NEW.version IS DISTINCT FROM OLD.version OR NEW.template_id IS DISTINCT FROM OLD.template_id THEN
        RAISE EXCEPTION 'template versions are immutable';
      END IF;
      RETURN NEW;
    END $$`.execute(db);
  await sql`ALTER TABLE template_versions DROP COLUMN IF EXISTS uses`.execute(db);
}
