// The mail outbox: a message is a row in `mail_outbox` plus a pg-boss job on `mail.send`,
// both written in the caller's transaction, so a message exists exactly when what caused it
// was saved, and saving never waits for an SMTP server. Workers in any app server (they share
// the job table through PostgreSQL) deliver it with nodemailer; a failed send is recorded on
// the row and pg-boss retries it with exponential backoff. The same boss will carry other
// queues (bundle builds) later.
import { CompiledQuery, type Kysely, type Transaction } from "kysely";
import PgBoss from "pg-boss";
import type { Transporter } from "nodemailer";
import type { Database } from "../db/types";
import type { MailMessage } from "./messages";

export const MAIL_QUEUE = "mail.send";
type Db = Kysely<Database> | Transaction<Database>;

export type MailQueueOptions = {
  connectionString: string;
  db: Kysely<Database>;
  transport: Transporter;
  from: string;
  /** First retry after this many seconds, then doubling (with jitter) up to `retryLimit` times. */
  retryDelaySeconds: number;
  retryLimit?: number;
  pollingIntervalSeconds?: number;
  /** Run a worker in this process (false: only enqueue). */
  work?: boolean;
  onError?: (e: Error) => void;
};

export type MailQueue = {
  boss: PgBoss;
  /** Write the message in `trx` (the caller's transaction); it is delivered after commit. */
  enqueue: (trx: Db, message: MailMessage) => Promise<string>;
  stop: () => Promise<void>;
};

/** Deliver one outbox row; a row already sent is not sent again. Throws on failure (pg-boss retries). */
export async function deliverOutboxMessage(db: Kysely<Database>, transport: Transporter, from: string, outboxId: string): Promise<"sent" | "already-sent"> {
  const row = await db
    .updateTable("mail_outbox")
    .set((eb) => ({ attempts: eb("attempts", "+", 1), last_attempt_at: new Date() }))
    .where("id", "=", outboxId)
    .where("sent_at", "is", null)
    .returningAll()
    .executeTakeFirst();
  if (!row) return "already-sent";
  try {
    const info = await transport.sendMail({
      from,
      to: row.to_address,
      subject: row.subject,
      text: row.text_body,
      html: row.html_body,
      // The outbox id names the message, so a receiver (and the tests) can tell a duplicate.
      messageId: `<${row.id}@hiltbench.outbox>`,
    });
    await db.updateTable("mail_outbox").set({ sent_at: new Date(), last_error: null, smtp_response: String(info.response ?? "") }).where("id", "=", row.id).execute();
    return "sent";
  } catch (e) {
    const message = e instanceof Error ? e.message : String(e);
    await db.updateTable("mail_outbox").set({ last_error: message.slice(0, 2000) }).where("id", "=", row.id).execute();
    throw e;
  }
}

export async function startMailQueue(o: MailQueueOptions): Promise<MailQueue> {
  const boss = new PgBoss({ connectionString: o.connectionString, max: 3, application_name: "hiltbench-queue", schedule: false });
  boss.on("error", (e) => (o.onError ?? ((err: Error) => console.error(`[mail queue] ${err.message}`)))(e));
  await boss.start();
  await boss.createQueue(MAIL_QUEUE);
  const sendOptions = { retryLimit: o.retryLimit ?? 8, retryDelay: o.retryDelaySeconds, retryBackoff: true, expireInSeconds: 120 };

  if (o.work !== false) {
    await boss.work<{ outboxId: string }>(MAIL_QUEUE, { pollingIntervalSeconds: o.pollingIntervalSeconds ?? 2, batchSize: 1 }, async (jobs) => {
      for (const job of jobs) await deliverOutboxMessage(o.db, o.transport, o.from, job.data.outboxId);
    });
  }

  return {
    boss,
    async enqueue(trx, m) {
      const row = await trx
        .insertInto("mail_outbox")
        .values({ kind: m.kind, to_address: m.to, subject: m.subject, text_body: m.text, html_body: m.html })
        .returning("id")
        .executeTakeFirstOrThrow();
      // pg-boss writes its job through our transaction: both rows commit or neither does.
      const executeSql = async (text: string, values: unknown[]) => trx.executeQuery(CompiledQuery.raw(text, values as unknown[])) as Promise<{ rows: any[] }>;
      const jobId = await boss.send(MAIL_QUEUE, { outboxId: row.id }, { ...sendOptions, db: { executeSql } });
      if (!jobId) throw new Error(`pg-boss did not accept the mail job (queue ${MAIL_QUEUE} missing?)`);
      return row.id;
    },
    async stop() {
      await boss.stop({ graceful: true, timeout: 5000, wait: true });
    },
  };
}
