// Font files: where each stored file's bytes are (by SHA-256, so the same bytes are stored once),
// every accepted upload of a font to a build with its report, the files that upload holds, and
// the workshop's own font layouts. Frozen in time: never import app code here.
import { sql, type Kysely } from "kysely";

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable("stored_files")
    .addColumn("sha256", "text", (c) => c.primaryKey().check(sql`sha256 ~ '^[0-9a-f]{64}$'`))
    .addColumn("size", "bigint", (c) => c.notNull().check(sql`size >= 0`))
    .addColumn("storage", "text", (c) => c.notNull().check(sql`storage IN ('disk', 's3')`))
    .addColumn("key", "text", (c) => c.notNull())
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .execute();

  await db.schema
    .createTable("font_uploads")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("build_id", "uuid", (c) => c.notNull().references("builds.id").onDelete("cascade"))
    .addColumn("font_id", "text", (c) => c.notNull())
    .addColumn("layout_name", "text", (c) => c.notNull())
    .addColumn("status", "text", (c) => c.notNull().check(sql`status IN ('received', 'invalid')`))
    .addColumn("report", "jsonb", (c) => c.notNull())
    .addColumn("uploaded_by", "uuid", (c) => c.references("users.id").onDelete("set null"))
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema.createIndex("font_uploads_build_font_idx").on("font_uploads").columns(["build_id", "font_id", "created_at"]).execute();

  await db.schema
    .createTable("font_files")
    .addColumn("upload_id", "uuid", (c) => c.notNull().references("font_uploads.id").onDelete("cascade"))
    .addColumn("path", "text", (c) => c.notNull())
    .addColumn("sha256", "text", (c) => c.notNull().references("stored_files.sha256").onDelete("restrict"))
    .addColumn("size", "bigint", (c) => c.notNull())
    .addColumn("cue", "text")
    .addColumn("duration_ms", "double precision", (c) => c.notNull())
    .addPrimaryKeyConstraint("font_files_pkey", ["upload_id", "path"])
    .execute();

  await db.schema
    .createTable("font_layouts")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("workshop_id", "uuid", (c) => c.notNull().references("workshops.id").onDelete("cascade"))
    .addColumn("name", "text", (c) => c.notNull())
    .addColumn("rules", "jsonb", (c) => c.notNull())
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addUniqueConstraint("font_layouts_workshop_name_key", ["workshop_id", "name"])
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable("font_layouts").ifExists().execute();
  await db.schema.dropTable("font_files").ifExists().execute();
  await db.schema.dropTable("font_uploads").ifExists().execute();
  await db.schema.dropTable("stored_files").ifExists().execute();
}
