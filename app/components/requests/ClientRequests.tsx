// The client's side of requests, for their handoff page: what they asked, the workshop's status
// and reply, and a form to ask for one more font, a colour change or a fix. It sends through the
// API (the page's own session) and reloads the page's data, so nothing is kept here but the form.
import { useState } from "react";
import { useRevalidator } from "react-router";
import { KIND_LABEL, MAX_MESSAGE, REQUEST_KINDS } from "~/lib/requests/rules";

export type ClientRequestItem = { id: string; kindLabel: string; message: string; statusLabel: string; reply: string; askedAt: string; open: boolean };

export function ClientRequests({ buildId, requests, canAsk }: { buildId: string; requests: ClientRequestItem[]; canAsk: boolean }) {
  const [kind, setKind] = useState<(typeof REQUEST_KINDS)[number]>("font");
  const [message, setMessage] = useState("");
  const [state, setState] = useState<{ tone: "ok" | "error" | "busy"; text: string } | null>(null);
  const revalidator = useRevalidator();

  async function send(e: React.FormEvent) {
    e.preventDefault();
    if (state?.tone === "busy") return;
    setState({ tone: "busy", text: "Sending…" });
    try {
      const res = await fetch(`/api/builds/${buildId}/requests`, { method: "POST", headers: { "Content-Type": "application/json", Accept: "application/json" }, body: JSON.stringify({ kind, message }) });
      const body = (await res.json().catch(() => null)) as { error?: string } | null;
      if (res.status === 201) {
        setMessage("");
        setState({ tone: "ok", text: "Sent. The workshop has been told and will answer here; you will get an e-mail." });
        revalidator.revalidate();
      } else setState({ tone: "error", text: `Not sent: ${body?.error ?? `the server answered ${res.status}`}` });
    } catch {
      setState({ tone: "error", text: "Not sent: the server could not be reached. Your message is still here." });
    }
  }

  return (
    <section className="card space-y-4" aria-labelledby="requests-h">
      <h2 id="requests-h">Ask the workshop</h2>
      {requests.length > 0 ? (
        <ol className="space-y-3" aria-label="Your requests">
          {requests.map((r) => (
            <li key={r.id} className="rounded border border-soot-700 p-3 text-sm" data-testid="my-request">
              <p>
                <strong>{r.kindLabel}</strong> · <span data-testid="my-request-status">{r.statusLabel}</span>
              </p>
              <p className="mt-1 whitespace-pre-wrap text-iron-300">{r.message}</p>
              {r.reply ? (
                <p className="mt-2" data-testid="my-request-reply">
                  <span className="text-iron-400">The workshop: </span>
                  {r.reply}
                </p>
              ) : null}
            </li>
          ))}
        </ol>
      ) : null}
      {canAsk ? (
        <form className="space-y-3" onSubmit={send} aria-label="Send a request">
          <div className="grid gap-3 sm:grid-cols-[14rem_minmax(0,1fr)]">
            <div>
              <label className="label" htmlFor="ask-kind">
                What would you like?
              </label>
              <select id="ask-kind" className="field w-full" value={kind} onChange={(e) => setKind(e.target.value as typeof kind)}>
                {REQUEST_KINDS.map((k) => (
                  <option key={k} value={k}>
                    {KIND_LABEL[k]}
                  </option>
                ))}
              </select>
            </div>
            <div>
              <label className="label" htmlFor="ask-message">
                In your words
              </label>
              <textarea id="ask-message" className="field w-full" rows={3} maxLength={MAX_MESSAGE} value={message} onChange={(e) => setMessage(e.target.value)} required />
            </div>
          </div>
          <button type="submit" className="btn btn-primary" disabled={state?.tone === "busy"}>
            Send to the workshop
          </button>
          {state && state.tone !== "busy" ? (
            <p role={state.tone === "ok" ? "status" : "alert"} className={state.tone === "ok" ? "text-signal-ok" : "text-signal-error"}>
              {state.text}
            </p>
          ) : null}
        </form>
      ) : null}
    </section>
  );
}
