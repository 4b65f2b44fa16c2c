// The app server's one mail queue, started lazily from the validated settings (one pg-boss per
// process; several app servers share the work through PostgreSQL) and stopped on SIGTERM/SIGINT.
// Features call `sendMail(trx, message)` inside the transaction that saves what the mail is about.
import type { Kysely, Transaction } from "kysely";
import nodemailer from "nodemailer";
import { db } from "../db/db.server";
import type { Database } from "../db/types";
import { env } from "../env.server";
import { composeMail, linkTo, type MailMessage } from "./messages";
import { startMailQueue, type MailQueue } from "./queue.server";

let starting: Promise<MailQueue> | undefined;

function createQueue(): Promise<MailQueue> {
  const e = env();
  const transport = nodemailer.createTransport({ url: e.SMTP_URL, connectionTimeout: 10_000, greetingTimeout: 10_000, socketTimeout: 30_000 } as never);
  return startMailQueue({ connectionString: e.DATABASE_URL, db: db(), transport, from: e.MAIL_FROM, retryDelaySeconds: e.MAIL_RETRY_DELAY_SECONDS });
}

export function mailQueue(): Promise<MailQueue> {
  if (!starting) {
    starting = createQueue();
    starting.catch(() => (starting = undefined)); // the next call tries again
    const stop = () => void starting?.then((q) => q.stop()).catch(() => {});
    process.once("SIGTERM", stop);
    process.once("SIGINT", stop);
  }
  return starting;
}

/** Start the queue's worker when the server starts, without holding anything up. Not under vitest. */
export function startBackgroundWork() {
  if (process.env.VITEST) return;
  mailQueue().catch((e) => console.error(`[mail queue] could not start: ${e instanceof Error ? e.message : e}`));
}

/** Put a message in the outbox inside `trx`; delivered after the transaction commits. */
export async function sendMail(trx: Kysely<Database> | Transaction<Database>, message: MailMessage): Promise<string> {
  return (await mailQueue()).enqueue(trx, message);
}

/** A link into the app for an e-mail. */
export const appLink = (path: string) => linkTo(env().APP_URL, path);

export { composeMail };
