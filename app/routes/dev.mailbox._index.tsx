// The development mailbox: every message the local SMTP sink received, newest first. Open to
// anyone who can reach the server (clients read sign-in codes here before they have a session),
// so it is answered only outside production or with HB_DEV_MAILBOX=1 (npm start, the e2e suite).
import { data, Form, Link } from "react-router";
import { z } from "zod";
import { mailboxPage, requireDevMailbox } from "~/lib/mail/dev-mailbox.server";
import type { Route } from "./+types/dev.mailbox._index";

export const meta: Route.MetaFunction = () => [{ title: "Mailbox (development) · Hiltbench" }];

const PER_PAGE = 50;
const query = z.object({ to: z.string().trim().max(320).optional().transform((s) => s || undefined), page: z.coerce.number().int().min(1).max(10_000).catch(1) });

export async function loader({ request }: Route.LoaderArgs) {
  requireDevMailbox();
  const url = new URL(request.url);
  const parsed = query.safeParse(Object.fromEntries(url.searchParams));
  if (!parsed.success) throw data({ message: "The mailbox filter is not valid." }, { status: 400 });
  const { rows, total } = await mailboxPage({ ...parsed.data, perPage: PER_PAGE });
  return {
    to: parsed.data.to ?? "",
    page: parsed.data.page,
    pages: Math.max(1, Math.ceil(total / PER_PAGE)),
    total,
    messages: rows.map((m) => ({ id: m.id, at: m.received_at.toISOString(), to: m.envelope_to.join(", "), from: m.header_from, subject: m.subject })),
  };
}

export default function Mailbox({ loaderData }: Route.ComponentProps) {
  const { messages, to, page, pages, total } = loaderData;
  const pageLink = (p: number) => `?${new URLSearchParams({ ...(to ? { to } : {}), page: String(p) })}`;
  return (
    <main className="mx-auto max-w-5xl px-4 py-6">
      <h1>Mailbox</h1>
      <p className="mt-1 text-sm text-iron-400">
        Development only: what the local SMTP sink received. Production sends through the SMTP server in <code>SMTP_URL</code> and has no such page.
      </p>
      <Form method="get" className="mt-4 flex items-end gap-2">
        <label className="text-sm">
          Recipient
          <input name="to" defaultValue={to} className="field ml-2 inline-block w-64" placeholder="someone@example.test" />
        </label>
        <button className="btn" type="submit">
          Filter
        </button>
      </Form>
      <p className="mt-3 text-sm text-iron-400" role="status">
        {total} message{total === 1 ? "" : "s"}
      </p>
      <table className="table mt-2">
        <thead>
          <tr className="text-left text-iron-400">
            <th scope="col">Received</th>
            <th scope="col">To</th>
            <th scope="col">Subject</th>
          </tr>
        </thead>
        <tbody>
          {messages.map((m) => (
            <tr key={m.id} className="border-t border-soot-700">
              <td className="py-1 pr-3 font-mono text-xs">{m.at.replace("T", " ").slice(0, 19)}</td>
              <td className="pr-3">{m.to}</td>
              <td>
                <Link to={`/dev/mailbox/${m.id}`}>{m.subject || "(no subject)"}</Link>
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      {pages > 1 ? (
        <nav className="mt-3 flex gap-3 text-sm" aria-label="Pages">
          {page > 1 ? <Link to={pageLink(page - 1)}>← Newer</Link> : null}
          <span>
            Page {page} of {pages}
          </span>
          {page < pages ? <Link to={pageLink(page + 1)}>Older →</Link> : null}
        </nav>
      ) : null}
    </main>
  );
}
