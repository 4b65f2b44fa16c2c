// One review: the revision's rendered text with line numbers, comment threads on its lines (and
// threads from earlier revisions carried onto unchanged lines, or listed as outdated), threads on
// model paths, the reviewers' verdicts, and the forms each person may use.
import { useState } from "react";
import { Form, Link, redirect, useNavigation } from "react-router";
import { requireViewer } from "~/lib/auth/auth.server";
import { loadBuildFor } from "~/lib/auth/build-access.server";
import { ModelChanges } from "~/components/revisions/ModelChanges";
import { addComment, giveVerdict, setThreadResolved } from "~/lib/review/service.server";
import type { Thread } from "~/lib/review/threads";
import { actorOf, readReviewForm, reviewDeps } from "~/lib/review/web.server";
import { fail } from "~/lib/web/http.server";
import { openReviewPage } from "~/lib/review/pages.server";
import type { Route } from "./+types/builds.$buildId.reviews.$requestId";

export const meta: Route.MetaFunction = ({ data }) => [{ title: `Review of revision ${data?.request.revision ?? ""} · Hiltbench` }];

const STATE_LABELS = { open: "In review", approved: "Approved", "changes-requested": "Changes requested" } as const;

export async function loader({ request, params }: Route.LoaderArgs) {
  const v = await requireViewer(request, "view:reviews");
  return openReviewPage(v, params.buildId, params.requestId);
}

export async function action({ request, params }: Route.ActionArgs) {
  const v = await requireViewer(request, "view:reviews");
  const b = await loadBuildFor(v, params.buildId);
  const form = await readReviewForm(request);
  const intent = form.get("intent");
  const d = reviewDeps();
  const a = actorOf(v);
  const here = `/builds/${b.id}/reviews/${params.requestId}`;
  switch (intent) {
    case "comment": {
      const line = form.get("line");
      const lineNo = line === null || line === "" ? null : Number(line);
      if (lineNo !== null && !Number.isInteger(lineNo)) fail(400, "The line must be a whole number.");
      const id = await addComment(d, a, b, params.requestId, { body: form.get("body") ?? "", line: lineNo, modelPath: form.get("modelPath") || null });
      return redirect(`${here}#comment-${id}`);
    }
    case "reply": {
      const thread = form.get("thread") ?? "";
      await addComment(d, a, b, params.requestId, { body: form.get("body") ?? "", threadId: thread || "-" });
      return redirect(`${here}#comment-${thread}`);
    }
    case "resolve":
    case "reopen":
      await setThreadResolved(d, a, b, form.get("thread") ?? "", intent === "resolve");
      return redirect(here);
    case "verdict": {
      const verdict = form.get("verdict");
      if (verdict !== "approved" && verdict !== "changes-requested") fail(400, "Choose approve or ask for changes.");
      await giveVerdict(d, a, b, params.requestId, { verdict, note: form.get("note") ?? "" });
      return redirect(here);
    }
    default:
      fail(400, "Unknown action.");
  }
}

function ThreadView({ t, canReply, canResolve }: { t: Thread; canReply: boolean; canResolve: boolean }) {
  const nav = useNavigation();
  return (
    <div id={`comment-${t.id}`} className="my-2 rounded-md border border-soot-600 bg-soot-800 p-3 font-sans text-sm" data-testid="thread" data-resolved={t.resolved ? "true" : "false"}>
      <p className="text-xs text-iron-400">
        {t.line !== null ? `Line ${t.line}` : t.modelPath ? `Model path ${t.modelPath}` : `Line ${t.originalLine} of revision ${t.madeOnRevision}`}
        {t.madeOnRevision ? ` · made on revision ${t.madeOnRevision}` : ""}
        {t.outdated ? " · outdated: the line changed" : ""}
        {t.resolved ? ` · resolved${t.resolved.by ? ` by ${t.resolved.by}` : ""}` : ""}
      </p>
      {t.outdated && t.lineText !== null ? <pre tabIndex={0} className="mt-1 overflow-x-auto text-xs text-iron-400">{t.lineText}</pre> : null}
      <ol className="mt-2 space-y-2">
        {t.comments.map((c) => (
          <li key={c.id} id={c.id === t.id ? undefined : `comment-${c.id}`}>
            <span className="font-medium">{c.author}</span> <span className="text-xs text-iron-400">{c.at.slice(0, 16).replace("T", " ")}</span>
            <p className="whitespace-pre-wrap">{c.body}</p>
          </li>
        ))}
      </ol>
      <div className="mt-2 flex flex-wrap items-start gap-2">
        {canReply ? (
          <Form method="post" className="flex flex-1 gap-2">
            <input type="hidden" name="thread" value={t.id} />
            <label className="sr-only" htmlFor={`reply-${t.id}`}>
              Reply
            </label>
            <input id={`reply-${t.id}`} name="body" className="field" placeholder="Reply…" required maxLength={8000} />
            <button className="btn" type="submit" name="intent" value="reply" disabled={nav.state !== "idle"}>
              Reply
            </button>
          </Form>
        ) : null}
        {canResolve ? (
          <Form method="post">
            <input type="hidden" name="thread" value={t.id} />
            <button className="btn" type="submit" name="intent" value={t.resolved ? "reopen" : "resolve"}>
              {t.resolved ? "Reopen" : "Resolve"}
            </button>
          </Form>
        ) : null}
      </div>
    </div>
  );
}

function NewComment({ line, onCancel }: { line: number; onCancel: () => void }) {
  return (
    <Form method="post" className="my-2 rounded-md border border-brass-400/50 bg-soot-800 p-3 font-sans text-sm" aria-label={`Comment on line ${line}`}>
      <input type="hidden" name="line" value={line} />
      <label className="label" htmlFor={`new-${line}`}>
        Comment on line {line}
      </label>
      <textarea id={`new-${line}`} name="body" className="field" rows={3} required maxLength={8000} autoFocus />
      <div className="mt-2 flex gap-2">
        <button className="btn btn-primary" type="submit" name="intent" value="comment">
          Add comment
        </button>
        <button className="btn" type="button" onClick={onCancel}>
          Cancel
        </button>
      </div>
    </Form>
  );
}

export default function Review({ loaderData }: Route.ComponentProps) {
  const { request, lines, threads, reviewers, can: allowed, currentRevision, model } = loaderData;
  const [open, setOpen] = useState<number | null>(null);
  const onLine = new Map<number, Thread[]>();
  for (const t of threads) if (t.line !== null) onLine.set(t.line, [...(onLine.get(t.line) ?? []), t]);
  const elsewhere = threads.filter((t) => t.line === null);
  return (
    <div className="space-y-6">
      <p className="text-sm">
        <Link to="..">← Reviews</Link>
      </p>
      <header className="flex flex-wrap items-baseline gap-3">
        <h2>Revision {request.revision}</h2>
        <span className="rounded bg-soot-700 px-2 py-0.5 text-xs" data-testid="request-state">
          {STATE_LABELS[request.state]}
        </span>
        <span className="text-sm text-iron-400">
          asked by {request.by} · rendered with {request.template}
        </span>
        {request.revision !== currentRevision ? <span className="text-sm text-signal-warning">Revision {currentRevision} has been saved since.</span> : null}
      </header>
      {request.note ? <blockquote className="border-l-2 border-ember-500 pl-3 text-sm whitespace-pre-wrap">{request.note}</blockquote> : null}

      <section className="card" aria-label="Reviewers">
        <h3>Reviewers</h3>
        <ul className="mt-2 text-sm">
          {reviewers.map((r) => (
            <li key={r.id} data-testid="reviewer">
              {r.name}: {r.verdict === "approved" ? "approved" : r.verdict === "changes-requested" ? "asked for changes" : "not yet"}
              {r.note ? <span className="text-iron-400"> — {r.note}</span> : null}
            </li>
          ))}
        </ul>
        {allowed.verdict ? (
          <Form method="post" className="mt-3 space-y-2">
            <label className="block">
              <span className="label">Verdict note (optional)</span>
              <textarea name="note" className="field" rows={2} maxLength={2000} />
            </label>
            <input type="hidden" name="intent" value="verdict" />
            <div className="flex gap-2">
              <button className="btn btn-primary" type="submit" name="verdict" value="approved">
                Approve revision {request.revision}
              </button>
              <button className="btn" type="submit" name="verdict" value="changes-requested">
                Ask for changes
              </button>
            </div>
          </Form>
        ) : null}
      </section>

      <section className="card" aria-label="Model changes">
        <h3>
          {model ? `Changes since revision ${model.from}${model.approved ? " (last approved)" : ""}` : "Changes"}
        </h3>
        <div className="mt-2">
          {model ? (
            <ModelChanges changes={model.changes} testId="review-model-diff" />
          ) : (
            <p className="text-sm text-iron-300">This is the first revision on record; there is nothing earlier to compare with.</p>
          )}
        </div>
        {model ? (
          <p className="mt-2 text-sm">
            <Link to={`/builds/${loaderData.buildId}/compare?from=${model.from}&to=${request.revision}`}>
              Compare revisions {model.from} and {request.revision}
            </Link>
          </p>
        ) : null}
      </section>

      <section aria-label="Rendered config">
        <h3>Rendered config</h3>
        <p className="text-sm text-iron-400">{allowed.startThread ? "Choose a line number to comment on that line." : "Threads are shown under their lines."}</p>
        <div className="mt-2 overflow-x-auto rounded-lg border border-soot-700 bg-soot-900 font-mono text-xs">
          {lines.map((text, i) => {
            const n = i + 1;
            return (
              <div key={n} id={`L${n}`}>
                <div className="flex hover:bg-soot-800">
                  {allowed.startThread ? (
                    <button type="button" className="w-14 shrink-0 pr-3 text-right text-iron-400 hover:text-brass-300" aria-label={`Comment on line ${n}`} onClick={() => setOpen(open === n ? null : n)}>
                      {n}
                    </button>
                  ) : (
                    <span className="w-14 shrink-0 pr-3 text-right text-iron-400">{n}</span>
                  )}
                  <pre className="whitespace-pre">{text || " "}</pre>
                </div>
                {(onLine.get(n) ?? []).map((t) => (
                  <div key={t.id} className="px-4">
                    <ThreadView t={t} canReply={allowed.comment} canResolve={allowed.resolve} />
                  </div>
                ))}
                {open === n ? (
                  <div className="px-4">
                    <NewComment line={n} onCancel={() => setOpen(null)} />
                  </div>
                ) : null}
              </div>
            );
          })}
        </div>
      </section>

      <section aria-label="Other threads">
        <h3>Model paths and outdated threads</h3>
        {elsewhere.length === 0 ? <p className="mt-1 text-sm text-iron-400">None.</p> : elsewhere.map((t) => <ThreadView key={t.id} t={t} canReply={allowed.comment} canResolve={allowed.resolve} />)}
        {allowed.startThread ? (
          <Form method="post" className="card mt-3 space-y-2">
            <label className="block">
              <span className="label">Model path</span>
              <input name="modelPath" className="field font-mono" placeholder="presets.0.looks" required maxLength={300} />
            </label>
            <label className="block">
              <span className="label">Comment</span>
              <textarea name="body" className="field" rows={2} required maxLength={8000} />
            </label>
            <button className="btn" type="submit" name="intent" value="comment">
              Comment on this path
            </button>
          </Form>
        ) : null}
      </section>
    </div>
  );
}
