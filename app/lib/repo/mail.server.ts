// Mail data access: the outbox (what the app has queued and whether it went out) and the local
// sink's mailbox (what the development SMTP sink received).
import { sql, type Kysely } from "kysely";
import type { Database } from "../db/types";

type Db = Kysely<Database>;

export async function listSinkMessages(db: Db, q: { to?: string; page: number; perPage: number }) {
  let query = db.selectFrom("mail_sink_messages");
  if (q.to) query = query.where(sql<boolean>`${q.to.toLowerCase()} = ANY (SELECT lower(a) FROM unnest(envelope_to) AS a)`);
  const total = await query.select((eb) => eb.fn.countAll<number>().as("n")).executeTakeFirstOrThrow();
  const rows = await query
    .select(["id", "received_at", "envelope_to", "header_from", "subject"])
    .orderBy("received_at", "desc")
    .orderBy("id")
    .limit(q.perPage)
    .offset((q.page - 1) * q.perPage)
    .execute();
  return { rows, total: Number(total.n) };
}

export async function getSinkMessage(db: Db, id: string) {
  return db.selectFrom("mail_sink_messages").selectAll().where("id", "=", id).executeTakeFirst();
}

export async function getOutboxMessage(db: Db, id: string) {
  return db.selectFrom("mail_outbox").selectAll().where("id", "=", id).executeTakeFirst();
}
