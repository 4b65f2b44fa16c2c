// A local SMTP server on loopback that keeps every message it receives in PostgreSQL
// (`mail_sink_messages`), standing in for a real mail server in development and tests. The app
// sends to it with nodemailer exactly as it would to any SMTP server; the development mailbox
// page and the tests read the table back. STARTTLS and AUTH are off: the package's bundled
// certificate has expired and nothing leaves the machine.
import pg from "pg";
import { SMTPServer } from "smtp-server";
import { readMessage } from "./mime";

export type MailSink = { url: string; port: number; close: () => Promise<void> };

const MAX_BYTES = 5 * 1024 * 1024;

export async function startMailSink(opts: { port: number; databaseUrl: string; host?: string }): Promise<MailSink> {
  const host = opts.host ?? "127.0.0.1";
  const pool = new pg.Pool({ connectionString: opts.databaseUrl, max: 2 });
  const server = new SMTPServer({
    disabledCommands: ["STARTTLS", "AUTH"],
    authOptional: true,
    logger: false,
    size: MAX_BYTES,
    banner: "Hiltbench local mail sink",
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on("data", (c: Buffer) => chunks.push(c));
      stream.on("end", async () => {
        if ((stream as unknown as { sizeExceeded?: boolean }).sizeExceeded) return callback(Object.assign(new Error("Message too large"), { responseCode: 552 }));
        const raw = Buffer.concat(chunks).toString("utf8");
        const m = readMessage(raw);
        const from = session.envelope.mailFrom ? session.envelope.mailFrom.address : "";
        const to = session.envelope.rcptTo.map((r) => r.address);
        try {
          await pool.query(
            `INSERT INTO mail_sink_messages (message_id, envelope_from, envelope_to, header_from, header_to, subject, text_body, html_body, raw)
             VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9)`,
            [m.messageId, from, to, m.from, m.to, m.subject, m.text, m.html, raw],
          );
          callback();
        } catch (e) {
          // A temporary failure: the sender keeps the message and tries again.
          callback(Object.assign(new Error(`Mail sink could not store the message: ${e instanceof Error ? e.message : e}`), { responseCode: 451 }));
        }
      });
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(opts.port, host, () => resolve());
  });
  server.on("error", (e) => console.error(`[mail sink] ${e.message}`));
  const port = (server.server.address() as { port: number }).port;
  return {
    url: `smtp://${host}:${port}`,
    port,
    close: async () => {
      await new Promise<void>((resolve) => server.close(() => resolve()));
      await pool.end();
    },
  };
}
