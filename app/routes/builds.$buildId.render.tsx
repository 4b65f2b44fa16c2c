// A build rendered through a template: the output (C highlighted, or plain text), a template
// picker, copy and download, pinning a workshop template version, and reading a generic header
// (possibly hand-edited) back into the model to check it and make it the build's config.
import { MessageField } from "~/components/revisions/MessageField";
import { readMessage } from "~/lib/forms/revision-message";
import { useState } from "react";
import { data, Form, Link, useFetcher, useSubmit } from "react-router";
import { CodeFrame } from "~/components/templates/CodeFrame";
import { CodeView } from "~/components/templates/CodeView";
import { requirePermission, requireViewer } from "~/lib/auth/auth.server";
import { loadBuildFor } from "~/lib/auth/build-access.server";
import { can, isRenderViewAction, RENDER_VIEW_ACTIONS } from "~/lib/auth/permissions";
import type { Diagnostic } from "~/lib/checks/validate";
import { readAndCheck, type ReadError } from "~/lib/readback";
import { applyHeader } from "~/lib/readback/apply.server";
import { openRenderView, pinForBuild } from "~/lib/rendering/library.server";
import { readFormLimited } from "~/lib/web/body.server";
import { fail } from "~/lib/web/http.server";
import { int4From } from "~/lib/input/edges";
import { cappedNote } from "~/lib/template/error-list";
import type { Route } from "./+types/builds.$buildId.render";

export const meta: Route.MetaFunction = ({ matches }) => {
  const build = (matches.find((m) => m?.id === "routes/builds.$buildId")?.data as { build?: { name?: string } } | undefined)?.build;
  return [{ title: `Render · ${build?.name ?? "Build"} · Hiltbench` }];
};

/** A header file is a few tens of kilobytes; the read-back form refuses more than 2 MB. */
const MAX_HEADER_BYTES = 2 * 1024 * 1024;

export async function loader({ request, params }: Route.LoaderArgs) {
  const v = await requireViewer(request, "view:builds");
  const b = await loadBuildFor(v, params.buildId);
  return { ...(await openRenderView(v, b, new URL(request.url).searchParams.get("template"))), canEdit: can(v.role, "edit:build") };
}

type ReadAnswer =
  | { intent: "read"; errors: ReadError[]; diagnostics: Diagnostic[]; summary: string | null }
  | { intent: "apply"; ok: boolean; message: string; diagnostics: Diagnostic[] };

export async function action({ request, params }: Route.ActionArgs) {
  const v = await requireViewer(request, "view:builds");
  const b = await loadBuildFor(v, params.buildId);
  const form = await readFormLimited(request, MAX_HEADER_BYTES, "The form is larger than 2 MB; a header file is far smaller.");
  const intent = form.get("intent");
  if (!isRenderViewAction(intent)) fail(400, "Unknown action: use intent 'read', 'apply' or 'pin'.");
  requirePermission(v, RENDER_VIEW_ACTIONS[intent]);
  if (intent === "read") {
    const text = form.get("header");
    if (typeof text !== "string" || text.trim() === "") return data<ReadAnswer>({ intent: "read", errors: [{ line: 1, column: 1, message: "Paste a header or choose a file first." }], diagnostics: [], summary: null }, { status: 400 });
    const c = readAndCheck(text);
    return data<ReadAnswer>({ intent: "read", errors: c.errors, diagnostics: c.diagnostics, summary: c.summary }, { status: c.config ? 200 : 422 });
  }
  if (intent === "pin") {
    await pinForBuild(v, b.id, form.get("template"), int4From(form.get("version"), 1));
    return data({ intent: "pin" as const, ok: true });
  }
  const text = form.get("header");
  const expected = int4From(form.get("configVersion"));
  if (typeof text !== "string" || text.trim() === "") fail(400, "The form has no header text.");
  if (expected === null) fail(400, "The form must carry the config version the page was read at.");
  const note = readMessage(form.get("message"));
  if (!note.ok) fail(400, note.error);
  const r = await applyHeader(v, b.id, text, expected, note.message);
  return data<ReadAnswer>({ intent: "apply", ok: r.ok, message: r.message, diagnostics: r.diagnostics }, { status: r.status });
}

export default function RenderPage({ loaderData }: Route.ComponentProps) {
  const { buildId, buildName, configVersion, template, pinned, choices, result, canEdit } = loaderData;
  const submit = useSubmit();
  const pin = useFetcher();
  const [copied, setCopied] = useState<string>("");
  const isPinned = template.ref === (pinned.id ?? pinned.name) && template.version === pinned.version;
  const downloadHref = `/api/builds/${buildId}/render?template=${encodeURIComponent(template.ref)}${template.kind === "workshop" ? `&version=${template.version}` : ""}&download=1`;

  async function copy() {
    if (!result.ok) return;
    try {
      await navigator.clipboard.writeText(result.output);
      setCopied("Copied to the clipboard.");
    } catch {
      setCopied("The browser did not allow copying; select the text and copy it instead.");
    }
  }

  return (
    <div className="space-y-6">
      <section aria-labelledby="render-h" className="space-y-3">
        <div className="flex flex-wrap items-end gap-4">
          <h2 id="render-h" className="sr-only">
            Rendered output
          </h2>
          <Form method="get" onChange={(e) => submit(e.currentTarget, { replace: true, preventScrollReset: true })} className="flex items-end gap-2">
            <div>
              <label className="label" htmlFor="render-template">
                Template
              </label>
              <select id="render-template" name="template" className="field w-72" defaultValue={template.ref} key={template.ref}>
                {choices.map((c) => (
                  <option key={c.ref} value={c.ref}>
                    {c.label}
                  </option>
                ))}
              </select>
            </div>
            <noscript>
              <button className="btn" type="submit">
                Show
              </button>
            </noscript>
          </Form>
          <p className="text-sm" data-testid="render-template-used">
            Rendered with <strong className="font-mono">{template.name}</strong> version {template.version}
            {isPinned ? <span className="ml-2 rounded bg-soot-700 px-2 py-0.5 text-xs">this build's template</span> : null}
          </p>
          {template.uses.length ? (
            <p className="text-sm text-iron-300" data-testid="render-template-uses">
              Uses, as they were when version {template.version} was saved:{" "}
              {template.uses.map((u, i) => (
                <span key={u.name}>
                  {i ? ", " : ""}
                  <span className="font-mono">{u.name}</span> v{u.version}
                </span>
              ))}
            </p>
          ) : null}
        </div>

        <div className="flex flex-wrap items-center gap-3">
          <button type="button" className="btn" onClick={copy} disabled={!result.ok}>
            Copy
          </button>
          {result.ok ? (
            <a className="btn" href={downloadHref} download>
              Download
            </a>
          ) : null}
          <span role="status" className="text-sm text-iron-300">
            {copied}
          </span>
          {canEdit && !isPinned && template.pinnable ? (
            <pin.Form method="post">
              <input type="hidden" name="intent" value="pin" />
              <input type="hidden" name="template" value={template.ref} />
              <input type="hidden" name="version" value={template.version} />
              <button className="btn" type="submit" disabled={pin.state !== "idle"}>
                Use {template.name} v{template.version} for this build
              </button>
            </pin.Form>
          ) : null}
          {canEdit && pinned.id && pinned.latest !== null && pinned.latest > pinned.version ? (
            <pin.Form method="post">
              <input type="hidden" name="intent" value="pin" />
              <input type="hidden" name="template" value={pinned.id} />
              <input type="hidden" name="version" value={pinned.latest} />
              <button className="btn btn-primary" type="submit" disabled={pin.state !== "idle"}>
                Move to version {pinned.latest}
              </button>
            </pin.Form>
          ) : null}
        </div>
        <p className="text-sm text-iron-400">
          This build's template: <span className="font-mono">{pinned.name}</span> v{pinned.version}
          {pinned.latest !== null && pinned.latest > pinned.version ? ` (version ${pinned.latest} exists)` : ""}. <Link to="/templates">Templates</Link>
        </p>

        {result.ok ? (
          <CodeView value={result.output} language={result.target === "c" ? "c" : "text"} readOnly label={`${buildName} rendered with ${template.name}`} testId="render-output" height="36rem" />
        ) : (
          <div className="card border-signal-error/50" role="alert">
            <p className="text-signal-error">The template did not render this build:</p>
            <ul className="mt-2 space-y-1 text-sm">
              {result.errors.map((e, i) => (
                <li key={i}>
                  <span className="font-mono">
                    {e.line}:{e.column}
                  </span>{" "}
                  ({e.stage}) {e.message}
                  {e.line !== null && e.line >= 1 ? <CodeFrame source={result.source} error={e} testId="render-error-frame" /> : null}
                </li>
              ))}
            </ul>
            {cappedNote(result) ? <p className="mt-2 text-sm text-iron-300" data-testid="errors-capped">{cappedNote(result)}</p> : null}
          </div>
        )}
      </section>

      <ReadBack configVersion={configVersion} canEdit={canEdit} />
    </div>
  );
}

function ReadBack({ configVersion, canEdit }: { configVersion: number; canEdit: boolean }) {
  const reader = useFetcher<ReadAnswer>();
  const applier = useFetcher<ReadAnswer>();
  const [text, setText] = useState("");
  const [readText, setReadText] = useState<string | null>(null);
  const answer = reader.data?.intent === "read" ? reader.data : undefined;
  const applied = applier.data?.intent === "apply" ? applier.data : undefined;
  const readable = answer && answer.errors.length === 0 && !answer.diagnostics.some((d) => d.severity === "error") && readText === text;
  const lines = text.split("\n");

  return (
    <section aria-labelledby="readback-h" className="card space-y-3">
      <h2 id="readback-h">Read a header back</h2>
      <p className="max-w-3xl text-sm text-iron-300">
        Paste a generic header (or choose the file), possibly edited by hand. Hiltbench reads it back into the model and checks it; a header that reads
        cleanly can become this build's config.
      </p>
      <reader.Form method="post" className="space-y-2" onSubmit={() => setReadText(text)}>
        <input type="hidden" name="intent" value="read" />
        <div>
          <label className="label" htmlFor="header-file">
            Header file
          </label>
          <input
            id="header-file"
            type="file"
            accept=".h,.hpp,.txt,text/plain"
            className="text-sm"
            onChange={async (e) => {
              const f = e.currentTarget.files?.[0];
              if (f) setText(await f.text());
            }}
          />
        </div>
        <div>
          <label className="label" htmlFor="header-text">
            Header text
          </label>
          <textarea id="header-text" name="header" className="field h-48 font-mono text-xs" value={text} onChange={(e) => setText(e.target.value)} spellCheck={false} />
        </div>
        <button className="btn" type="submit" disabled={reader.state !== "idle"}>
          Read and check
        </button>
      </reader.Form>

      {answer ? (
        <div aria-live="polite" data-testid="readback-result">
          {answer.errors.length ? (
            <>
              <p className="text-signal-error">The header does not read back ({answer.errors.length} problem{answer.errors.length === 1 ? "" : "s"}):</p>
              <ul className="mt-2 space-y-2 text-sm">
                {answer.errors.map((e, i) => (
                  <li key={i}>
                    <span className="font-mono text-signal-error">
                      line {e.line}, column {e.column}
                    </span>
                    : {e.message}
                    {lines[e.line - 1] !== undefined ? (
                      <pre tabIndex={0} className="mt-1 overflow-x-auto rounded bg-soot-950 p-2 text-xs">
                        {lines[e.line - 1]}
                        {"\n"}
                        {" ".repeat(Math.max(0, e.column - 1))}^
                      </pre>
                    ) : null}
                  </li>
                ))}
              </ul>
            </>
          ) : (
            <>
              <p className="text-signal-ok">The header reads back: {answer.summary}.</p>
              {answer.diagnostics.length ? (
                <ul className="mt-2 space-y-1 text-sm" aria-label="Checks on the read config">
                  {answer.diagnostics.map((d, i) => (
                    <li key={i} className={d.severity === "error" ? "text-signal-error" : "text-signal-warning"}>
                      {d.severity}: <span className="font-mono">{d.path || "(config)"}</span> — {d.message} <span className="text-iron-400">{d.hint}</span>
                    </li>
                  ))}
                </ul>
              ) : (
                <p className="text-sm text-iron-300">The checks find no problems.</p>
              )}
              {answer.diagnostics.some((d) => d.severity === "error") ? <p className="mt-2 text-sm text-signal-error">Fix the errors before it can become the build's config.</p> : null}
            </>
          )}
        </div>
      ) : null}

      {canEdit && readable ? (
        <applier.Form method="post">
          <input type="hidden" name="intent" value="apply" />
          <input type="hidden" name="header" value={text} />
          <input type="hidden" name="configVersion" value={configVersion} />
          <MessageField id="apply-message" className="mb-3 max-w-xl" />
          <button className="btn btn-primary" type="submit" disabled={applier.state !== "idle"}>
            Make this the build's config
          </button>
        </applier.Form>
      ) : null}
      {applied ? (
        <p role="status" className={applied.ok ? "text-signal-ok" : "text-signal-error"}>
          {applied.message}
        </p>
      ) : null}
    </section>
  );
}
