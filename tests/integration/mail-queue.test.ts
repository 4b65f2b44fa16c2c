// The mail outbox end to end on a real PostgreSQL: pg-boss delivers through nodemailer to the
// local SMTP sink (scripts/fakes/mail-sink.ts), which stores what it received. A message is
// written with the transaction that caused it (a rollback sends nothing), and a message sent
// while the sink is down is recorded as failed, retried with backoff, and arrives exactly once.
import { sql, type Kysely } from "kysely";
import nodemailer from "nodemailer";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Database } from "~/lib/db/types";
import { composeMail } from "~/lib/mail/messages";
import { startMailQueue, type MailQueue } from "~/lib/mail/queue.server";
import { startMailSink, type MailSink } from "../../scripts/fakes/mail-sink";
import { freshDatabase, hasDatabase } from "./db";

async function until<T>(what: string, probe: () => Promise<T | undefined | null | false>, ms = 15_000): Promise<T> {
  const end = Date.now() + ms;
  for (;;) {
    const v = await probe();
    if (v) return v;
    if (Date.now() > end) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

const message = (subject: string) =>
  composeMail({ kind: "test", to: "reviewer@ember-anvil.example.test", subject, paragraphs: ["Revision 3 of Kestrel waits for you."], action: { label: "Open", url: "http://127.0.0.1:1/builds/x" } });

describe.runIf(hasDatabase)("mail outbox through pg-boss to the local SMTP sink", () => {
  let db: Kysely<Database>;
  let url: string;
  let sink: MailSink;
  let queue: MailQueue;
  const received = (outboxId: string) =>
    db.selectFrom("mail_sink_messages").selectAll().where("message_id", "=", `${outboxId}@hiltbench.outbox`).execute();
  const outbox = (id: string) => db.selectFrom("mail_outbox").selectAll().where("id", "=", id).executeTakeFirstOrThrow();

  beforeAll(async () => {
    ({ db, url } = await freshDatabase());
    sink = await startMailSink({ port: 0, databaseUrl: url });
    const transport = nodemailer.createTransport({ url: sink.url, connectionTimeout: 2000 } as never);
    queue = await startMailQueue({ connectionString: url, db, transport, from: "Hiltbench <no-reply@hiltbench.localhost>", retryDelaySeconds: 1, pollingIntervalSeconds: 0.5 });
  });

  afterAll(async () => {
    await queue?.stop();
    await sink?.close().catch(() => {});
  });

  it("delivers a message enqueued in a committed transaction, as text and HTML with its link", async () => {
    const id = await db.transaction().execute((trx) => queue.enqueue(trx, message("Review requested: Kestrel, revision 3")));
    const [got] = await until("the message in the sink", async () => (await received(id)).length > 0 && received(id));
    expect(got.subject).toBe("Review requested: Kestrel, revision 3");
    expect(got.envelope_to).toEqual(["reviewer@ember-anvil.example.test"]);
    expect(got.text_body).toContain("Open: http://127.0.0.1:1/builds/x");
    expect(got.html_body).toContain('<a href="http://127.0.0.1:1/builds/x">Open</a>');
    const row = await until("sent_at", async () => (await outbox(id)).sent_at !== null && outbox(id));
    expect(row.attempts).toBe(1);
    expect(row.last_error).toBeNull();
  });

  it("sends nothing when the transaction that wrote the message rolls back", async () => {
    let id = "";
    await expect(
      db.transaction().execute(async (trx) => {
        id = await queue.enqueue(trx, message("never"));
        throw new Error("the save failed");
      }),
    ).rejects.toThrow("the save failed");
    expect(await db.selectFrom("mail_outbox").select("id").where("id", "=", id).execute()).toEqual([]);
    const jobs = await sql<{ n: number }>`SELECT count(*)::int AS n FROM pgboss.job WHERE data->>'outboxId' = ${id}`.execute(db);
    expect(jobs.rows[0].n).toBe(0);
  });

  it("records a failed send while the sink is down, retries with backoff, and delivers exactly once", async () => {
    const port = sink.port;
    await sink.close();
    const id = await db.transaction().execute((trx) => queue.enqueue(trx, message("While the sink was down")));
    const failed = await until("a recorded failure", async () => {
      const r = await outbox(id);
      return r.last_error !== null && r;
    });
    expect(failed.sent_at).toBeNull();
    expect(failed.last_error).toMatch(/ECONNREFUSED|connect/i);
    sink = await startMailSink({ port, databaseUrl: url });
    const row = await until("delivery after the sink is back", async () => (await outbox(id)).sent_at !== null && outbox(id), 30_000);
    expect(row.attempts).toBeGreaterThanOrEqual(2);
    expect(row.last_error).toBeNull();
    // Give any duplicate (a second worker, a retry racing the first success) time to show up.
    await new Promise((r) => setTimeout(r, 2500));
    expect(await received(id)).toHaveLength(1);
  });
});
