// Foundation tables: workshops, people, memberships, invitations, builds, sessions, API tokens.
// Frozen in time: never import app code here.
import { sql, type Kysely } from "kysely";

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable("workshops")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("name", "text", (c) => c.notNull())
    .addColumn("slug", "text", (c) => c.notNull().unique())
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .execute();

  await db.schema
    .createTable("users")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("github_login", "text")
    .addColumn("email", "text")
    .addColumn("display_name", "text", (c) => c.notNull())
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await sql`CREATE UNIQUE INDEX users_github_login_key ON users (lower(github_login))`.execute(db);
  await sql`CREATE UNIQUE INDEX users_email_key ON users (lower(email))`.execute(db);

  await db.schema
    .createTable("memberships")
    .addColumn("workshop_id", "uuid", (c) => c.notNull().references("workshops.id").onDelete("cascade"))
    .addColumn("user_id", "uuid", (c) => c.notNull().references("users.id").onDelete("cascade"))
    .addColumn("role", "text", (c) => c.notNull().check(sql`role IN ('owner','builder','reviewer','client')`))
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addPrimaryKeyConstraint("memberships_pkey", ["workshop_id", "user_id"])
    .execute();
  await db.schema.createIndex("memberships_user_idx").on("memberships").column("user_id").execute();

  await db.schema
    .createTable("invitations")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("workshop_id", "uuid", (c) => c.notNull().references("workshops.id").onDelete("cascade"))
    .addColumn("github_login", "text")
    .addColumn("email", "text")
    .addColumn("role", "text", (c) => c.notNull().check(sql`role IN ('owner','builder','reviewer','client')`))
    .addColumn("invited_by", "uuid", (c) => c.references("users.id").onDelete("set null"))
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("accepted_at", "timestamptz")
    .addCheckConstraint("invitations_target", sql`github_login IS NOT NULL OR email IS NOT NULL`)
    .execute();

  await db.schema
    .createTable("builds")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("workshop_id", "uuid", (c) => c.notNull().references("workshops.id").onDelete("cascade"))
    .addColumn("name", "text", (c) => c.notNull())
    .addColumn("client_name", "text", (c) => c.notNull().defaultTo(""))
    .addColumn("client_user_id", "uuid", (c) => c.references("users.id").onDelete("set null"))
    .addColumn("hilt_notes", "text", (c) => c.notNull().defaultTo(""))
    .addColumn("status", "text", (c) =>
      c.notNull().check(sql`status IN ('intake','configuring','in-review','approved','released')`),
    )
    .addColumn("config", "jsonb", (c) => c.notNull())
    .addColumn("config_version", "integer", (c) => c.notNull().defaultTo(1))
    .addColumn("archived_at", "timestamptz")
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("updated_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await sql`CREATE INDEX builds_workshop_name_idx ON builds (workshop_id, lower(name))`.execute(db);
  await sql`CREATE INDEX builds_workshop_updated_idx ON builds (workshop_id, updated_at DESC)`.execute(db);
  await sql`CREATE INDEX builds_client_idx ON builds (client_user_id)`.execute(db);

  await db.schema
    .createTable("sessions")
    .addColumn("id", "text", (c) => c.primaryKey())
    .addColumn("data", "jsonb", (c) => c.notNull())
    .addColumn("expires_at", "timestamptz", (c) => c.notNull())
    .execute();

  await db.schema
    .createTable("api_tokens")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("user_id", "uuid", (c) => c.notNull().references("users.id").onDelete("cascade"))
    .addColumn("name", "text", (c) => c.notNull())
    .addColumn("token_hash", "text", (c) => c.notNull().unique())
    .addColumn("prefix", "text", (c) => c.notNull())
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("last_used_at", "timestamptz")
    .addColumn("revoked_at", "timestamptz")
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  for (const t of ["api_tokens", "sessions", "builds", "invitations", "memberships", "users", "workshops"]) {
    await db.schema.dropTable(t).ifExists().execute();
  }
}
