// One template: the source in an editor with our language's highlighting, live diagnostics and
// a live preview rendered in the browser against a build's config. Saving stores a new version
// (only a source that compiles); built-ins and readers without edit:template see it read-only.
// `?compare=2..3` shows the line changes between two versions; people with edit:template can
// delete a workshop template that nothing depends on (decision 006).
import type { Diagnostic as CmDiagnostic } from "@codemirror/lint";
import { useEffect, useMemo, useState, useSyncExternalStore } from "react";
import { data, Form, Link, redirect, useFetcher, useSubmit } from "react-router";
import { CodeFrame } from "~/components/templates/CodeFrame";
import { CodeView } from "~/components/templates/CodeView";
import { DeleteTemplate, type DeleteAnswer } from "~/components/templates/DeleteTemplate";
import { VersionDiff } from "~/components/templates/VersionDiff";
import { ErrorPage } from "~/components/ErrorPage";
import { requireViewer } from "~/lib/auth/auth.server";
import { deleteConfirmed, openTemplatePage, saveTemplateSource, workshopTemplate } from "~/lib/rendering/library.server";
import { useDraftPreview } from "~/lib/rendering/preview";
import { metaForBuild } from "~/lib/rendering/render";
import type { TemplateError } from "~/lib/template";
import { readFormLimited } from "~/lib/web/body.server";
import { errorTitle } from "~/lib/web/errors";
import { fail } from "~/lib/web/http.server";
import { int4From } from "~/lib/input/edges";
import { capErrors, cappedNote, type ErrorKind } from "~/lib/template/error-list";
import type { Route } from "./+types/templates.$templateId";

export const meta: Route.MetaFunction = ({ data, error }) => [{ title: error ? errorTitle(error) : `${data?.template.name ?? "Template"} · Templates · Hiltbench` }];

/** A template's source is at most 256 K characters; the form around it stays under 1 MB. */
const MAX_SAVE_BYTES = 1024 * 1024;

export async function loader({ request, params }: Route.LoaderArgs) {
  const v = await requireViewer(request, "view:templates");
  const url = new URL(request.url);
  // The version picker's plain GET form (from, to) lands on the one address of a comparison.
  const pickedFrom = url.searchParams.get("from");
  const pickedTo = url.searchParams.get("to");
  if (pickedFrom !== null || pickedTo !== null) {
    const to = new URLSearchParams();
    const b = url.searchParams.get("build");
    if (b) to.set("build", b);
    to.set("compare", `${pickedFrom ?? ""}..${pickedTo ?? ""}`);
    throw redirect(`${url.pathname}?${to}`);
  }
  return openTemplatePage(v, params.templateId, { version: url.searchParams.get("version"), compare: url.searchParams.get("compare"), build: url.searchParams.get("build") });
}

type SaveAnswer = { ok: true; version: number } | { ok: false; message: string; errors?: TemplateError[]; total?: number; kinds?: ErrorKind[] };

export async function action({ request, params }: Route.ActionArgs) {
  const v = await requireViewer(request, "edit:template");
  const t = await workshopTemplate(v, params.templateId, 403, "Built-in templates are read-only and cannot be deleted; create a template from one to change it.");
  const form = await readFormLimited(request, MAX_SAVE_BYTES, "The template is larger than 1 MB; nothing was saved.");
  const intent = form.get("intent") ?? "save";
  if (intent === "delete") {
    const r = await deleteConfirmed(v, t, form.get("confirm"));
    if (r.kind === "refused") return data<DeleteAnswer>({ intent: "delete", ok: false, message: r.message, ...(r.dependents ? { dependents: r.dependents } : {}) }, { status: r.status });
    return redirect(`/templates?deleted=${encodeURIComponent(r.name)}&versions=${r.versions}`);
  }
  if (intent !== "save") fail(400, "Unknown action: use intent 'save' or 'delete'.");
  const source = form.get("source");
  const latest = int4From(form.get("latest"), 1);
  if (typeof source !== "string") return data<SaveAnswer>({ ok: false, message: "The form has no template source." }, { status: 400 });
  if (latest === null) return data<SaveAnswer>({ ok: false, message: "The form must say which version the editor was opened at." }, { status: 400 });
  const r = await saveTemplateSource(v, t, source, latest);
  if (!r.ok) return data<SaveAnswer>({ ok: false, message: r.message, ...(r.errors ? { errors: r.errors, total: r.total, kinds: r.kinds } : {}) }, { status: r.status });
  return data<SaveAnswer>(r);
}

/** 404 (no such template or version), 403 (read-only) or a server failure, with a way back to the list. */
export function ErrorBoundary({ error }: Route.ErrorBoundaryProps) {
  return <ErrorPage error={error} back={[{ to: "/templates", label: "Back to templates" }]} />;
}

function toCm(errors: TemplateError[]): CmDiagnostic[] {
  return errors.map((e) => ({ from: e.from, to: e.to, severity: e.severity, message: e.message, source: e.stage }));
}

/** `path?k=v…` with the parameters that have a value. */
function withQuery(path: string, params: Record<string, string | null>): string {
  const q = new URLSearchParams();
  for (const [k, v] of Object.entries(params)) if (v !== null) q.set(k, v);
  const text = q.toString();
  return text ? `${path}?${text}` : path;
}

/** The value, once it has stopped changing for `ms`. */
function useDebounced<T>(value: T, ms: number): T {
  const [v, setV] = useState(value);
  useEffect(() => {
    const t = setTimeout(() => setV(value), ms);
    return () => clearTimeout(t);
  }, [value, ms]);
  return v;
}

const noSubscription = () => () => {};
/**
 * False on the server and while hydrating, true after: the draft is checked and previewed in the
 * browser only, so the server never runs an untrusted template inline while drawing this page
 * (server renders go through the worker pool, decision 007).
 */
function useInBrowser(): boolean {
  return useSyncExternalStore(
    noSubscription,
    () => true,
    () => false,
  );
}

export default function TemplateEditorPage({ loaderData }: Route.ComponentProps) {
  const { template, versions, partials: stored, builds, build, canEdit, compare, dependents, newerPartials } = loaderData;
  const [source, setSource] = useState(template.source);
  // Set by clicking a problem's line:column: the editor puts its cursor there.
  const [jumpTo, setJumpTo] = useState<{ at: number; seq: number } | null>(null);
  // A different template or version loaded: start from its source.
  useEffect(() => setSource(template.source), [template.id, template.version, template.source]);
  const settled = useDebounced(source, 120);
  // As on save: other templates that use this one see the draft, so a cycle through them shows.
  const partials = useMemo(() => (template.kind === "workshop" ? { ...stored, [template.name]: settled } : stored), [stored, template.kind, template.name, settled]);
  const inBrowser = useInBrowser();
  // Checked and rendered in a Web Worker: a runaway draft is stopped there, the tab stays live.
  // With no build to preview with, the draft is still checked so its problems show.
  const meta = useMemo(() => (build ? metaForBuild(build, { name: template.name, version: template.latest }) : null), [build, template.name, template.latest]);
  const draft = useDraftPreview(inBrowser, settled, build ? build.config : null, meta, partials);
  const outcome = draft?.render ?? null;
  // Capped like every error list (decision 011): thousands of problems would stall the page.
  const problemList = useMemo(() => capErrors(draft?.problems ?? []), [draft]);
  const problems = problemList.errors;
  const diagnostics = useMemo(() => toCm(problems), [draft]); // eslint-disable-line react-hooks/exhaustive-deps
  const save = useFetcher<SaveAnswer>();
  const submit = useSubmit();
  const dirty = source !== template.source;
  const answer = save.data;
  // The source a refused save was sent with, so its errors' code frames quote what was refused.
  const [sent, setSent] = useState(template.source);
  const viewingOld = template.kind === "workshop" && template.version !== template.latest;

  return (
    <div className="space-y-4">
      <p className="text-sm">
        <Link to="/templates">← Templates</Link> · <Link to="/templates/reference">Language reference</Link>
      </p>
      <div className="flex flex-wrap items-baseline gap-3">
        <h1 className="font-mono">{template.name}</h1>
        <span className="rounded bg-soot-700 px-2 py-0.5 text-xs" data-testid="template-version">
          {template.kind === "builtin" ? "built-in, read-only" : `version ${template.version}${viewingOld ? ` (latest is ${template.latest})` : ""}`}
        </span>
        {template.kind === "workshop" && !canEdit ? <span className="text-sm text-iron-400">Read-only for your role.</span> : null}
      </div>

      <div className="flex flex-wrap items-end gap-4">
        <Form method="get" className="flex items-end gap-2" onChange={(e) => submit(e.currentTarget, { preventScrollReset: true, replace: true })}>
          {viewingOld ? <input type="hidden" name="version" value={template.version} /> : null}
          {compare ? <input type="hidden" name="compare" value={`${compare.from}..${compare.to}`} /> : null}
          <div>
            <label className="label" htmlFor="preview-build">
              Preview with build
            </label>
            <select id="preview-build" name="build" className="field w-56" defaultValue={build?.id}>
              {builds.map((b) => (
                <option key={b.id} value={b.id}>
                  {b.name}
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
        {canEdit ? (
          <save.Form method="post" className="flex items-center gap-3" onSubmit={() => setSent(source)}>
            <input type="hidden" name="source" value={source} />
            <input type="hidden" name="latest" value={template.latest} />
            <button className="btn btn-primary" type="submit" disabled={save.state !== "idle" || (!dirty && !viewingOld && newerPartials.length === 0)}>
              Save as version {template.latest + 1}
            </button>
            <span role="status" className="text-sm" data-testid="save-status">
              {save.state !== "idle" ? "Saving…" : answer?.ok ? `Saved version ${answer.version}.` : answer ? <span className="text-signal-error">{answer.message}</span> : dirty ? "Unsaved changes" : ""}
            </span>
          </save.Form>
        ) : null}
        {newerPartials.length ? (
          <p className="w-full text-sm text-iron-300" data-testid="newer-partials">
            Newer versions of templates this one uses:{" "}
            {newerPartials.map((p, i) => (
              <span key={p.name}>
                {i ? ", " : ""}
                <span className="font-mono">{p.name}</span> v{p.version}
                {p.was !== null ? ` (version ${template.version} renders with v${p.was})` : ""}
              </span>
            ))}
            . {canEdit ? "Saving, even unchanged, takes them in; builds follow when their pin is moved." : "A builder can save again to take them in."}
          </p>
        ) : null}
        {versions.length > 1 ? (
          <nav aria-label="Versions" className="flex flex-wrap items-center gap-2 text-sm">
            <span className="text-iron-400">Versions:</span>
            {versions.map((x) => (
              <Link key={x.version} to={`?version=${x.version}${build ? `&build=${build.id}` : ""}`} aria-current={x.version === template.version ? "page" : undefined} title={`${x.createdAt.slice(0, 16).replace("T", " ")} UTC${x.author ? ` by ${x.author}` : ""}`}>
                v{x.version}
              </Link>
            ))}
            {!compare ? (
              <Link to={`?compare=${versions[1].version}..${versions[0].version}${build ? `&build=${build.id}` : ""}`} className="btn ml-2">
                Compare versions
              </Link>
            ) : null}
          </nav>
        ) : null}
      </div>

      {canEdit && save.state === "idle" && answer && !answer.ok && answer.errors?.length ? (
        <section aria-label="Why the save was refused" className="rounded-md border border-signal-error/50 p-3 text-sm" data-testid="save-errors">
          <p className="text-signal-error">{answer.message} Fix these in the source and save again:</p>
          <ul className="mt-2 space-y-2">
            {answer.errors.map((e, i) => (
              <li key={i} className="text-signal-error" data-testid="save-error">
                <span className="font-mono">
                  {e.line}:{e.column}
                </span>{" "}
                {e.severity} ({e.stage}): {e.message}
                <CodeFrame source={sent} error={e} />
              </li>
            ))}
          </ul>
          {answer.total !== undefined && cappedNote({ errors: answer.errors, total: answer.total, kinds: answer.kinds ?? [] }) ? (
            <p className="mt-2 text-iron-300" data-testid="save-errors-capped">
              {cappedNote({ errors: answer.errors, total: answer.total, kinds: answer.kinds ?? [] })}
            </p>
          ) : null}
        </section>
      ) : null}

      {compare ? (
        <VersionDiff
          name={template.name}
          versions={versions.map((x) => x.version).reverse()}
          build={build?.id ?? null}
          compare={{ ...compare, closeHref: withQuery(`/templates/${template.id}`, { version: viewingOld ? String(template.version) : null, build: build?.id ?? null }) }}
        />
      ) : null}

      <div className="grid gap-4 lg:grid-cols-2">
        <section aria-labelledby="source-h" className="min-w-0">
          <h2 id="source-h" className="mb-2 text-base">
            Source
          </h2>
          <CodeView value={source} language="template" readOnly={!canEdit} onChange={setSource} diagnostics={diagnostics} label="Template source" testId="template-editor" jumpTo={jumpTo} />
          <div className="mt-2" aria-live="polite">
            {!draft ? (
              <p className="text-sm text-iron-400">Checking the template…</p>
            ) : problems.length === 0 ? (
              <p className="text-sm text-signal-ok" data-testid="problems-none">
                No problems.
              </p>
            ) : (
              <ul aria-label="Problems" className="space-y-1 text-sm" data-testid="problems">
                {problems.map((p, i) => (
                  <li key={i} className={p.severity === "error" ? "text-signal-error" : "text-signal-warning"} data-testid="problem">
                    <button
                      type="button"
                      className="font-mono underline decoration-dotted underline-offset-2"
                      title="Put the cursor there"
                      onClick={() => setJumpTo((j) => ({ at: p.from, seq: (j?.seq ?? 0) + 1 }))}
                    >
                      {p.line}:{p.column}
                    </button>{" "}
                    {p.severity} ({p.stage}): {p.message}
                    <CodeFrame source={settled} error={p} />
                  </li>
                ))}
                {cappedNote(problemList) ? (
                  <li className="text-iron-300" data-testid="problems-capped">
                    {cappedNote(problemList)}
                  </li>
                ) : null}
              </ul>
            )}
          </div>
        </section>
        <section aria-labelledby="preview-h" className="min-w-0">
          <h2 id="preview-h" className="mb-2 text-base">
            Preview {build ? <span className="font-normal text-iron-400">with {build.name}</span> : null}
          </h2>
          {!build ? (
            <p className="text-iron-400">Your workshop has no builds to preview with.</p>
          ) : !draft ? (
            <p className="text-iron-400">Rendering the preview…</p>
          ) : outcome?.ok ? (
            <pre className="h-[32rem] overflow-auto rounded-md border border-soot-600 bg-soot-900 p-3 font-mono text-xs" data-testid="preview" tabIndex={0} aria-label="Rendered preview">
              {outcome.output}
            </pre>
          ) : (
            <p className="rounded-md border border-signal-error/50 p-3 text-sm text-signal-error" data-testid="preview-failed">
              The template does not render yet; fix the problems on the left.
            </p>
          )}
        </section>
      </div>

      {canEdit && dependents ? <DeleteTemplate name={template.name} versions={template.latest} dependents={dependents} /> : null}
    </div>
  );
}
