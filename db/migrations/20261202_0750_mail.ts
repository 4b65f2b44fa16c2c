// E-mail: the outbox every message goes through (one row per message, written in the same
// transaction as what caused it; a pg-boss job on queue `mail.send` delivers it), and the local
// SMTP sink's mailbox, where development and tests read what was "sent".
// Frozen in time: never import app code here.
import { sql, type Kysely } from "kysely";

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable("mail_outbox")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("kind", "text", (c) => c.notNull())
    .addColumn("to_address", "text", (c) => c.notNull())
    .addColumn("subject", "text", (c) => c.notNull())
    .addColumn("text_body", "text", (c) => c.notNull())
    .addColumn("html_body", "text", (c) => c.notNull())
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("attempts", "integer", (c) => c.notNull().defaultTo(0))
    .addColumn("last_attempt_at", "timestamptz")
    .addColumn("last_error", "text")
    .addColumn("sent_at", "timestamptz")
    .addColumn("smtp_response", "text")
    .execute();
  await sql`CREATE INDEX mail_outbox_unsent_idx ON mail_outbox (created_at) WHERE sent_at IS NULL`.execute(db);

  await db.schema
    .createTable("mail_sink_messages")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("received_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("message_id", "text")
    .addColumn("envelope_from", "text", (c) => c.notNull())
    .addColumn("envelope_to", sql`text[]`, (c) => c.notNull())
    .addColumn("header_from", "text", (c) => c.notNull().defaultTo(""))
    .addColumn("header_to", "text", (c) => c.notNull().defaultTo(""))
    .addColumn("subject", "text", (c) => c.notNull().defaultTo(""))
    .addColumn("text_body", "text")
    .addColumn("html_body", "text")
    .addColumn("raw", "text", (c) => c.notNull())
    .execute();
  await sql`CREATE INDEX mail_sink_messages_received_idx ON mail_sink_messages (received_at DESC)`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable("mail_sink_messages").ifExists().execute();
  await db.schema.dropTable("mail_outbox").ifExists().execute();
}
