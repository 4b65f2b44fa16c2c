// One message from the development mailbox: headers, the plain-text part with its links made
// clickable, and the HTML part in a sandboxed frame (no scripts, no same-origin access).
import { data, Link } from "react-router";
import { mailboxMessage, requireDevMailbox } from "~/lib/mail/dev-mailbox.server";
import type { Route } from "./+types/dev.mailbox.$messageId";

export const meta: Route.MetaFunction = ({ data }) => [{ title: `${data?.message.subject ?? "Message"} · Mailbox · Hiltbench` }];

export async function loader({ params }: Route.LoaderArgs) {
  requireDevMailbox();
  const m = await mailboxMessage(params.messageId);
  if (!m) throw data({ message: "No message with this id in the mailbox." }, { status: 404 });
  return {
    message: { id: m.id, at: m.received_at.toISOString(), from: m.header_from, to: m.envelope_to.join(", "), subject: m.subject, text: m.text_body ?? "", html: m.html_body, messageId: m.message_id },
  };
}

/** Plain text with http(s) links as anchors. */
function Linkified({ text }: { text: string }) {
  const parts = text.split(/(https?:\/\/[^\s<>"]+)/g);
  return <>{parts.map((p, i) => (i % 2 === 1 ? <a key={i} href={p}>{p}</a> : p))}</>;
}

export default function MailboxMessage({ loaderData }: Route.ComponentProps) {
  const { message } = loaderData;
  return (
    <main className="mx-auto max-w-4xl px-4 py-6">
      <p className="text-sm">
        <Link to="/dev/mailbox">← Mailbox</Link>
      </p>
      <h1 className="mt-2">{message.subject || "(no subject)"}</h1>
      <dl className="mt-3 grid grid-cols-[8rem_1fr] gap-1 text-sm">
        <dt className="text-iron-400">From</dt>
        <dd>{message.from}</dd>
        <dt className="text-iron-400">To</dt>
        <dd data-testid="mail-to">{message.to}</dd>
        <dt className="text-iron-400">Received</dt>
        <dd className="font-mono text-xs">{message.at}</dd>
        <dt className="text-iron-400">Message-ID</dt>
        <dd className="font-mono text-xs">{message.messageId ?? "—"}</dd>
      </dl>
      <h2 className="mt-6 text-base">Plain text</h2>
      <pre className="card mt-2 whitespace-pre-wrap text-sm" data-testid="mail-text">
        <Linkified text={message.text} />
      </pre>
      {message.html ? (
        <>
          <h2 className="mt-6 text-base">HTML</h2>
          <iframe title="HTML part" sandbox="" srcDoc={message.html} className="mt-2 h-80 w-full rounded bg-white" />
        </>
      ) : null}
    </main>
  );
}
