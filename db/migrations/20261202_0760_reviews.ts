// Reviews: a builder asks reviewers to read one revision (the build's config_version at the
// time) as it renders; each reviewer gives a verdict; comments are threads anchored on a line of
// that render or on a model path. The request keeps the rendered text the reviewers read, so a
// comment's line can be mapped onto a later revision's render through a text diff.
//
// A config save while a build is in review or approved sends it back to configuring (a trigger,
// so every save path obeys it): a changed config needs a new review.
// Frozen in time: never import app code here.
import { sql, type Kysely } from "kysely";

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable("review_requests")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("build_id", "uuid", (c) => c.notNull().references("builds.id").onDelete("cascade"))
    .addColumn("workshop_id", "uuid", (c) => c.notNull())
    .addColumn("revision", "integer", (c) => c.notNull().check(sql`revision >= 1`))
    .addColumn("requested_by", "uuid", (c) => c.references("users.id").onDelete("set null"))
    .addColumn("note", "text", (c) => c.notNull().defaultTo(""))
    .addColumn("template_label", "text", (c) => c.notNull())
    .addColumn("rendered", "text", (c) => c.notNull())
    .addColumn("state", "text", (c) => c.notNull().defaultTo("open").check(sql`state IN ('open','approved','changes-requested')`))
    .addColumn("decided_at", "timestamptz")
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await sql`CREATE INDEX review_requests_build_idx ON review_requests (build_id, revision DESC, created_at DESC)`.execute(db);

  await db.schema
    .createTable("review_reviewers")
    .addColumn("request_id", "uuid", (c) => c.notNull().references("review_requests.id").onDelete("cascade"))
    .addColumn("reviewer_id", "uuid", (c) => c.notNull().references("users.id").onDelete("cascade"))
    .addColumn("verdict", "text", (c) => c.check(sql`verdict IN ('approved','changes-requested')`))
    .addColumn("verdict_note", "text")
    .addColumn("verdict_at", "timestamptz")
    .addPrimaryKeyConstraint("review_reviewers_pkey", ["request_id", "reviewer_id"])
    .execute();
  await db.schema.createIndex("review_reviewers_reviewer_idx").on("review_reviewers").column("reviewer_id").execute();

  await db.schema
    .createTable("review_comments")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("request_id", "uuid", (c) => c.notNull().references("review_requests.id").onDelete("cascade"))
    .addColumn("thread_id", "uuid", (c) => c.references("review_comments.id").onDelete("cascade"))
    .addColumn("author_id", "uuid", (c) => c.references("users.id").onDelete("set null"))
    .addColumn("body", "text", (c) => c.notNull())
    .addColumn("line", "integer", (c) => c.check(sql`line >= 1`))
    .addColumn("line_text", "text")
    .addColumn("model_path", "text")
    .addColumn("resolved_at", "timestamptz")
    .addColumn("resolved_by", "uuid", (c) => c.references("users.id").onDelete("set null"))
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    // A thread's first comment is anchored on exactly one of a line or a model path; replies on neither.
    .addCheckConstraint(
      "review_comments_anchor",
      sql`(thread_id IS NULL AND ((line IS NOT NULL AND line_text IS NOT NULL AND model_path IS NULL) OR (line IS NULL AND line_text IS NULL AND model_path IS NOT NULL)))
          OR (thread_id IS NOT NULL AND line IS NULL AND line_text IS NULL AND model_path IS NULL AND resolved_at IS NULL)`,
    )
    .execute();
  await db.schema.createIndex("review_comments_request_idx").on("review_comments").columns(["request_id", "created_at"]).execute();
  await db.schema.createIndex("review_comments_thread_idx").on("review_comments").column("thread_id").execute();

  await sql`CREATE FUNCTION builds_review_after_save() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF NEW.config_version <> OLD.config_version AND OLD.status IN ('in-review', 'approved') THEN
        NEW.status := 'configuring';
      END IF;
      RETURN NEW;
    END $$`.execute(db);
  await sql`CREATE TRIGGER builds_review_after_save BEFORE UPDATE OF config_version ON builds
    FOR EACH ROW EXECUTE FUNCTION builds_review_after_save()`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`DROP TRIGGER IF EXISTS builds_review_after_save ON builds`.execute(db);
  await sql`DROP FUNCTION IF EXISTS builds_review_after_save()`.execute(db);
  await db.schema.dropTable("review_comments").ifExists().execute();
  await db.schema.dropTable("review_reviewers").ifExists().execute();
  await db.schema.dropTable("review_requests").ifExists().execute();
}
