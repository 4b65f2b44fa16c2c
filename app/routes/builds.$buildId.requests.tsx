// A build's client requests, for the workshop: what the client asked for after handoff, each
// with its status and reply. Owners and builders take a request in hand, close or decline it
// (the client reads the reply and gets an e-mail), and log a request a client made by phone.
// Reviewers read. Clients ask and read on their handoff page, not here.
import { data, Form, useNavigation } from "react-router";
import { requireViewer } from "~/lib/auth/auth.server";
import { loadBuildFor } from "~/lib/auth/build-access.server";
import { can } from "~/lib/auth/permissions";
import { answerBody, askBody, firstProblem, KIND_LABEL, MAX_MESSAGE, MAX_REQUEST_BODY_BYTES, REQUEST_KINDS, REQUEST_STATUSES, STATUS_LABEL } from "~/lib/requests/rules";
import { answerRequestFor, askRequestFor, listRequestsFor, refused } from "~/lib/requests/service.server";
import { readFormLimited } from "~/lib/web/body.server";
import { fail } from "~/lib/web/http.server";
import { int4From } from "~/lib/input/edges";
import type { Route } from "./+types/builds.$buildId.requests";

export const meta: Route.MetaFunction = ({ matches }) => {
  const build = (matches.find((m) => m?.id === "routes/builds.$buildId")?.data as { build?: { name?: string } } | undefined)?.build;
  return [{ title: `Requests · ${build?.name ?? "Build"} · Hiltbench` }];
};

export async function loader({ request, params }: Route.LoaderArgs) {
  const v = await requireViewer(request, "view:requests");
  if (v.role === "client") fail(403, "Clients read and send their requests on their handoff page.");
  const b = await loadBuildFor(v, params.buildId);
  const rows = await listRequestsFor(v, b.id);
  return {
    clientName: b.client_name,
    canAnswer: can(v.role, "answer:request"),
    canAsk: can(v.role, "ask:request"),
    requests: rows.map((r) => ({ id: r.id, kindLabel: r.kindLabel, message: r.message, status: r.status, statusLabel: r.statusLabel, reply: r.reply, askedByName: r.askedByName, handledByName: r.handledByName, askedAt: r.askedAt.toISOString(), updatedAt: r.updatedAt.toISOString(), version: r.version, open: r.open })),
  };
}

type ActionResult = { ok: boolean; message: string };

export async function action({ request, params }: Route.ActionArgs) {
  const v = await requireViewer(request, "view:requests");
  if (v.role === "client") fail(403, "Clients send their requests on their handoff page.");
  if (!can(v.role, "answer:request") && !can(v.role, "ask:request")) fail(403, "Only owners and builders answer or log client requests.");
  const b = await loadBuildFor(v, params.buildId);
  const form = await readFormLimited(request, MAX_REQUEST_BODY_BYTES, "The form is larger than 16 KB; a message is at most 2,000 characters. Nothing was saved.");
  const intent = form.get("intent");
  const refusal = (status: number, message: string) => data<ActionResult>({ ok: false, message }, { status });
  if (intent === "answer") {
    if (!can(v.role, "answer:request")) fail(403, "Only owners and builders answer client requests.");
    const version = int4From(form.get("version"), 1);
    const parsed = answerBody.safeParse({ status: form.get("status"), reply: form.get("reply") ?? undefined, version: version ?? undefined });
    if (!parsed.success) return refusal(400, firstProblem(parsed.error));
    const r = await answerRequestFor(v, b, String(form.get("id") ?? ""), parsed.data);
    if (refused(r)) return refusal(r.status, r.body.error);
    return { ok: true, message: `Saved: ${STATUS_LABEL[parsed.data.status].toLowerCase()}.` } satisfies ActionResult;
  }
  if (intent === "ask") {
    if (!can(v.role, "ask:request")) fail(403, "Only owners and builders log requests for a client.");
    const parsed = askBody.safeParse({ kind: form.get("kind"), message: form.get("message") });
    if (!parsed.success) return refusal(400, firstProblem(parsed.error));
    const r = await askRequestFor(v, b, parsed.data);
    if (refused(r)) return refusal(r.status, r.body.error);
    return { ok: true, message: "Request logged for the client." } satisfies ActionResult;
  }
  return refusal(400, "Unknown action: use intent 'answer' or 'ask'.");
}

const when = (iso: string) => new Date(iso).toLocaleString("en-GB", { dateStyle: "medium", timeStyle: "short", timeZone: "UTC" }) + " UTC";

export default function RequestsPage({ loaderData, actionData }: Route.ComponentProps) {
  const { clientName, canAnswer, canAsk, requests } = loaderData;
  const busy = useNavigation().state !== "idle";
  const open = requests.filter((r) => r.open).length;
  return (
    <div className="max-w-4xl space-y-5">
      <p className="text-sm text-iron-300">
        What {clientName || "the client"} asked for after handoff. {open === 0 ? "Nothing is waiting for an answer." : `${open} waiting for an answer.`} The client reads your reply on their handoff page and gets an e-mail when you reply or close a request.
      </p>
      {actionData ? (
        <p role={actionData.ok ? "status" : "alert"} className={actionData.ok ? "text-signal-ok" : "text-signal-error"} data-testid="request-message">
          {actionData.message}
        </p>
      ) : null}
      {requests.length === 0 ? <p className="text-iron-400">No requests yet.</p> : null}
      <ol className="space-y-4" aria-label="Client requests">
        {requests.map((r) => (
          <li key={r.id} className="card space-y-3" data-testid="client-request" aria-labelledby={`req-${r.id}`}>
            <div className="flex flex-wrap items-baseline gap-3">
              <h2 id={`req-${r.id}`} className="text-base">
                {r.kindLabel}
              </h2>
              <span className={`rounded px-2 py-0.5 text-xs ${r.open ? "border border-signal-warning" : "bg-soot-700"}`} data-testid="request-status">
                {r.statusLabel}
              </span>
              <span className="text-xs text-iron-400">
                {r.askedByName ?? "Someone whose account is gone"}, {when(r.askedAt)}
              </span>
            </div>
            <blockquote className="whitespace-pre-wrap border-l-2 border-ember-500 pl-3 text-sm">{r.message}</blockquote>
            {canAnswer ? (
              <Form method="post" className="grid gap-3 sm:grid-cols-[12rem_minmax(0,1fr)]" aria-label={`Answer: ${r.kindLabel}`}>
                <input type="hidden" name="intent" value="answer" />
                <input type="hidden" name="id" value={r.id} />
                <input type="hidden" name="version" value={r.version} />
                <div>
                  <label className="label" htmlFor={`status-${r.id}`}>
                    Status
                  </label>
                  <select id={`status-${r.id}`} name="status" className="field w-full" defaultValue={r.status}>
                    {REQUEST_STATUSES.map((s) => (
                      <option key={s} value={s}>
                        {STATUS_LABEL[s]}
                      </option>
                    ))}
                  </select>
                </div>
                <div>
                  <label className="label" htmlFor={`reply-${r.id}`}>
                    Reply the client reads
                  </label>
                  <textarea id={`reply-${r.id}`} name="reply" className="field w-full" rows={2} maxLength={MAX_MESSAGE} defaultValue={r.reply} />
                </div>
                <div className="sm:col-span-2 flex items-center gap-3">
                  <button type="submit" className="btn btn-primary" disabled={busy}>
                    Save the answer
                  </button>
                  {r.handledByName ? <span className="text-xs text-iron-400">Last answered by {r.handledByName}, {when(r.updatedAt)}</span> : null}
                </div>
              </Form>
            ) : r.reply ? (
              <p className="text-sm">
                <span className="text-iron-400">Reply: </span>
                {r.reply}
              </p>
            ) : null}
          </li>
        ))}
      </ol>
      {canAsk ? (
        <Form method="post" className="card space-y-3" aria-labelledby="log-h">
          <h2 id="log-h" className="text-base">
            Log a request for the client
          </h2>
          <p className="text-xs text-iron-400">For what {clientName || "the client"} asked by phone or in person, so it is not forgotten.</p>
          <input type="hidden" name="intent" value="ask" />
          <div className="grid gap-3 sm:grid-cols-[12rem_minmax(0,1fr)]">
            <div>
              <label className="label" htmlFor="log-kind">
                What kind
              </label>
              <select id="log-kind" name="kind" className="field w-full" defaultValue="font">
                {REQUEST_KINDS.map((k) => (
                  <option key={k} value={k}>
                    {KIND_LABEL[k]}
                  </option>
                ))}
              </select>
            </div>
            <div>
              <label className="label" htmlFor="log-message">
                What they asked
              </label>
              <textarea id="log-message" name="message" className="field w-full" rows={2} maxLength={MAX_MESSAGE} required />
            </div>
          </div>
          <button type="submit" className="btn" disabled={busy}>
            Log the request
          </button>
        </Form>
      ) : null}
    </div>
  );
}
