// Workshop templates: a name per workshop, and immutable versions of its source. Builds pin one
// version (or none: the built-in generic header). Frozen in time: never import app code here.
import { sql, type Kysely } from "kysely";

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable("templates")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("workshop_id", "uuid", (c) => c.notNull().references("workshops.id").onDelete("cascade"))
    .addColumn("name", "text", (c) => c.notNull())
    .addColumn("created_by", "uuid", (c) => c.references("users.id").onDelete("set null"))
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addUniqueConstraint("templates_workshop_name_key", ["workshop_id", "name"])
    .execute();

  await db.schema
    .createTable("template_versions")
    .addColumn("template_id", "uuid", (c) => c.notNull().references("templates.id").onDelete("cascade"))
    .addColumn("version", "integer", (c) => c.notNull().check(sql`version >= 1`))
    .addColumn("source", "text", (c) => c.notNull())
    .addColumn("created_by", "uuid", (c) => c.references("users.id").onDelete("set null"))
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addPrimaryKeyConstraint("template_versions_pkey", ["template_id", "version"])
    .execute();
  // A version is what a build was rendered with: its source never changes after the insert.
  await sql`CREATE FUNCTION template_versions_immutable() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF NEW.source IS DISTINCT FROM OLD.source OR NEW.version IS DISTINCT FROM OLD.version OR NEW.template_id IS DISTINCT FROM OLD.template_id THEN
        RAISE EXCEPTION 'template versions are immutable';
      END IF;
      RETURN NEW;
    END $$`.execute(db);
  await sql`CREATE TRIGGER template_versions_immutable BEFORE UPDATE ON template_versions
    FOR EACH ROW EXECUTE FUNCTION template_versions_immutable()`.execute(db);

  await db.schema
    .alterTable("builds")
    .addColumn("pinned_template_id", "uuid", (c) => c.references("templates.id").onDelete("restrict"))
    .addColumn("pinned_template_version", "integer")
    .execute();
  await sql`ALTER TABLE builds ADD CONSTRAINT builds_pinned_template_pair
    CHECK ((pinned_template_id IS NULL) = (pinned_template_version IS NULL))`.execute(db);
  await sql`ALTER TABLE builds ADD CONSTRAINT builds_pinned_template_version_fkey
    FOREIGN KEY (pinned_template_id, pinned_template_version) REFERENCES template_versions (template_id, version)`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`ALTER TABLE builds DROP CONSTRAINT IF EXISTS builds_pinned_template_version_fkey`.execute(db);
  await sql`ALTER TABLE builds DROP CONSTRAINT IF EXISTS builds_pinned_template_pair`.execute(db);
  await db.schema.alterTable("builds").dropColumn("pinned_template_version").dropColumn("pinned_template_id").execute();
  await db.schema.dropTable("template_versions").ifExists().execute();
  await sql`DROP FUNCTION IF EXISTS template_versions_immutable()`.execute(db);
  await db.schema.dropTable("templates").ifExists().execute();
}
