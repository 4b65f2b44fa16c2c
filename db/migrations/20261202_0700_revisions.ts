// Config revisions: every config save appends one immutable row, numbered with the build's
// `config_version` after that save, stamped with the build's `config_saved_at`, and carrying the
// template pin and the validator's counts at that moment.
//
// Immutable like template versions: a trigger refuses UPDATE and DELETE. Two exceptions, both
// done by the database itself and never by app code:
// - DELETE is allowed once the build row is gone, which is what `ON DELETE CASCADE` from builds
//   does (deleting a build, or a workshop through its builds). A lone DELETE still finds the
//   build and is refused.
// - UPDATE is allowed only when nothing but `author_id` changes, and only to NULL: that is the
//   `ON DELETE SET NULL` from users when an account goes. Nothing else about a revision moves.
//
// `workshop_id` is copied from the build (for scoping reads) with no foreign key: a cascade from
// workshops straight to revisions could run before the builds cascade and be refused above. The
// template pin is a record of what was pinned, with no foreign key either: revisions must not
// stop a later template delete, and a SET NULL would rewrite history.
//
// Backfill: each existing build's current config becomes its revision `config_version`, stamped
// `config_saved_at`, author unknown. Counts cannot be computed here (the validator is app code,
// and migrations are frozen), so backfilled rows say so in their message and keep 0 / 0.
// Frozen in time: never import app code here.
import { sql, type Kysely } from "kysely";

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable("config_revisions")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("build_id", "uuid", (c) => c.notNull().references("builds.id").onDelete("cascade"))
    .addColumn("workshop_id", "uuid", (c) => c.notNull())
    .addColumn("number", "integer", (c) => c.notNull().check(sql`number >= 1`))
    .addColumn("config", "jsonb", (c) => c.notNull())
    .addColumn("author_id", "uuid", (c) => c.references("users.id").onDelete("set null"))
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("message", "text")
    .addColumn("template_id", "uuid")
    .addColumn("template_version", "integer")
    .addColumn("error_count", "integer", (c) => c.notNull().defaultTo(0))
    .addColumn("warning_count", "integer", (c) => c.notNull().defaultTo(0))
    .addUniqueConstraint("config_revisions_build_number_key", ["build_id", "number"])
    .addCheckConstraint("config_revisions_template_pair", sql`(template_id IS NULL) = (template_version IS NULL)`)
    .execute();
  await sql`CREATE INDEX config_revisions_build_author_idx ON config_revisions (build_id, author_id)`.execute(db);

  await sql`CREATE FUNCTION config_revisions_immutable() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF TG_OP = 'DELETE' THEN
        IF EXISTS (SELECT 1 FROM builds WHERE id = OLD.build_id) THEN
          RAISE EXCEPTION 'config revisions are immutable: delete the whole build instead';
        END IF;
        RETURN OLD;
      END IF;
      IF NEW.author_id IS NULL AND OLD.author_id IS NOT NULL
         AND (to_jsonb(NEW) - 'author_id') = (to_jsonb(OLD) - 'author_id') THEN
        RETURN NEW;
      END IF;
      RAISE EXCEPTION 'config revisions are immutable';
    END $$`.execute(db);
  await sql`CREATE TRIGGER config_revisions_immutable BEFORE UPDATE OR DELETE ON config_revisions
    FOR EACH ROW EXECUTE FUNCTION config_revisions_immutable()`.execute(db);

  await sql`INSERT INTO config_revisions (build_id, workshop_id, number, config, author_id, created_at, message, template_id, template_version)
    SELECT id, workshop_id, config_version, config, NULL, config_saved_at,
           'Recorded when revisions began (earlier saves were not kept; counts not recorded)',
           pinned_template_id, pinned_template_version
    FROM builds`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable("config_revisions").ifExists().execute();
  await sql`DROP FUNCTION IF EXISTS config_revisions_immutable()`.execute(db);
}
