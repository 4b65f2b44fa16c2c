// A build's revisions: every saved config, newest first by default, sortable, filtered by
// author, paged on the server. Any two can be compared; an older one can be restored (a new
// revision with its content; nothing is rewritten).
import { data, Form, Link, useNavigation, useSearchParams } from "react-router";
import { requireViewer } from "~/lib/auth/auth.server";
import { loadBuildFor } from "~/lib/auth/build-access.server";
import { can } from "~/lib/auth/permissions";
import { listRevisionsFor, restoreRevisionFor, revisionAuthorsFor } from "~/lib/revisions/compare.server";
import { readListQuery, readRevisionNumber } from "~/lib/revisions/params";
import { fail } from "~/lib/web/http.server";
import { int4From } from "~/lib/input/edges";
import { Pager } from "~/components/Pager";
import type { Route } from "./+types/builds.$buildId.revisions";

export const meta: Route.MetaFunction = ({ matches }) => {
  const build = (matches.find((m) => m?.id === "routes/builds.$buildId")?.data as { build?: { name?: string } } | undefined)?.build;
  return [{ title: `Revisions · ${build?.name ?? "Build"} · Hiltbench` }];
};

export async function loader({ request, params }: Route.LoaderArgs) {
  const v = await requireViewer(request, "view:revisions");
  const b = await loadBuildFor(v, params.buildId);
  const q = readListQuery(new URL(request.url).searchParams);
  if (!q.ok) fail(400, q.error);
  const [{ rows, total }, authors] = await Promise.all([listRevisionsFor(v, b.id, q.value), revisionAuthorsFor(v, b.id)]);
  return {
    buildId: b.id,
    current: b.config_version,
    query: q.value,
    total,
    authors,
    canRestore: can(v.role, "edit:build"),
    revisions: rows.map((r) => ({ ...r, createdAt: r.createdAt.toISOString() })),
  };
}

export async function action({ request, params }: Route.ActionArgs) {
  const v = await requireViewer(request, "edit:build");
  const b = await loadBuildFor(v, params.buildId);
  const form = await request.formData();
  if (form.get("intent") !== "restore") fail(400, "Unknown action: use intent 'restore'.");
  const n = readRevisionNumber(form.get("n") as string | null, "n");
  if (!n.ok) return data({ ok: false, message: n.error }, { status: 400 });
  const expected = int4From(form.get("version"), 1);
  if (expected === null) return data({ ok: false, message: "The form must carry the config version the page was read at; reload and try again." }, { status: 400 });
  const r = await restoreRevisionFor(v, b.id, n.value, expected);
  if (r.kind === "missing") return data({ ok: false, message: `This build has no revision ${n.value}.` }, { status: 404 });
  if (r.kind === "stale") return data({ ok: false, message: "Someone saved this build since you opened the page; nothing was restored. Reload to see their revision." }, { status: 409 });
  return { ok: true, message: `Revision ${n.value} restored as revision ${r.number}.` };
}

const COLUMNS = [
  { key: "number", label: "Revision" },
  { key: "author", label: "Author" },
  { key: null, label: "Saved" },
  { key: null, label: "Message" },
  { key: null, label: "Review" },
  { key: "errors", label: "Errors" },
  { key: "warnings", label: "Warnings" },
] as const;

export default function RevisionsPage({ loaderData, actionData }: Route.ComponentProps) {
  const { buildId, current, query, total, authors, canRestore, revisions } = loaderData;
  const [params] = useSearchParams();
  const busy = useNavigation().state !== "idle";
  const pages = Math.max(1, Math.ceil(total / query.perPage));
  const withParams = (changes: Record<string, string | null>) => {
    const p = new URLSearchParams(params);
    for (const [k, v] of Object.entries(changes)) (v === null ? p.delete(k) : p.set(k, v));
    return `?${p.toString()}`;
  };
  return (
    <div className="space-y-4">
      {actionData ? (
        <p role={actionData.ok ? "status" : "alert"} className={actionData.ok ? "text-signal-ok" : "text-signal-error"} data-testid="restore-message">
          {actionData.message}
        </p>
      ) : null}
      <div className="flex flex-wrap items-end gap-6">
        <Form method="get" className="flex flex-wrap items-end gap-3" role="search" aria-label="Filter revisions">
          <div>
            <label className="label" htmlFor="author">
              Author
            </label>
            <select id="author" name="author" defaultValue={query.author ?? ""} className="field">
              <option value="">Anyone</option>
              {authors.map((a) => (
                <option key={a.id ?? "none"} value={a.id ?? "none"}>
                  {a.name ?? "Unknown (before revisions began, or account removed)"}
                </option>
              ))}
            </select>
          </div>
          <div>
            <label className="label" htmlFor="state">
              Review
            </label>
            <select id="state" name="state" className="field" disabled title="Reviews are not available yet">
              <option>Any</option>
            </select>
          </div>
          <input type="hidden" name="sort" value={query.sort} />
          <input type="hidden" name="dir" value={query.dir} />
          <button className="btn" type="submit">
            Apply
          </button>
        </Form>
        <Form method="get" action={`/builds/${buildId}/compare`} className="flex flex-wrap items-end gap-3" aria-label="Compare two revisions">
          <div>
            <label className="label" htmlFor="cmp-from">
              From revision
            </label>
            <input id="cmp-from" name="from" type="number" min={1} max={current} defaultValue={Math.max(1, current - 1)} className="field w-24" />
          </div>
          <div>
            <label className="label" htmlFor="cmp-to">
              To revision
            </label>
            <input id="cmp-to" name="to" type="number" min={1} max={current} defaultValue={current} className="field w-24" />
          </div>
          <button className="btn" type="submit">
            Compare
          </button>
        </Form>
      </div>
      <table className="table" data-testid="revisions-table">
        <thead>
          <tr>
            {COLUMNS.map((c) => {
              if (!c.key) return <th key={c.label}>{c.label}</th>;
              const active = query.sort === c.key;
              const nextDir = active && query.dir === "desc" ? "asc" : "desc";
              return (
                <th key={c.key} aria-sort={active ? (query.dir === "asc" ? "ascending" : "descending") : "none"}>
                  <Link to={withParams({ sort: c.key, dir: nextDir, page: null })} className="text-iron-300">
                    {c.label} {active ? (query.dir === "asc" ? "▲" : "▼") : ""}
                  </Link>
                </th>
              );
            })}
            <th>
              <span className="sr-only">Actions</span>
            </th>
          </tr>
        </thead>
        <tbody>
          {revisions.map((r) => (
            <tr key={r.number} data-revision={r.number}>
              <td className="font-mono">
                {r.number}
                {r.number === current ? <span className="ml-2 rounded bg-soot-700 px-1.5 py-0.5 text-xs">current</span> : null}
              </td>
              <td>{r.authorName ?? <span className="text-iron-400">unknown</span>}</td>
              <td className="font-mono text-xs text-iron-300">
                <time dateTime={r.createdAt}>{r.createdAt.slice(0, 19).replace("T", " ")} UTC</time>
              </td>
              <td>{r.message ?? <span className="text-iron-400">—</span>}</td>
              <td className="text-iron-400">—</td>
              <td className={r.errorCount ? "text-signal-error" : ""}>{r.errorCount}</td>
              <td className={r.warningCount ? "text-signal-warning" : ""}>{r.warningCount}</td>
              <td className="flex flex-wrap gap-2">
                {r.number > 1 ? (
                  <Link to={`/builds/${buildId}/compare?from=${r.number - 1}&to=${r.number}`} aria-label={`Changes in revision ${r.number}`}>
                    Changes
                  </Link>
                ) : null}
                {r.number !== current ? (
                  <Link to={`/builds/${buildId}/compare?from=${r.number}&to=${current}`} aria-label={`Compare revision ${r.number} with the current one`}>
                    vs current
                  </Link>
                ) : null}
                {canRestore && r.number !== current ? (
                  <Form method="post" className="inline">
                    <input type="hidden" name="intent" value="restore" />
                    <input type="hidden" name="n" value={r.number} />
                    <input type="hidden" name="version" value={current} />
                    <button type="submit" className="btn px-2 py-0.5 text-xs" disabled={busy} aria-label={`Restore revision ${r.number}`}>
                      Restore
                    </button>
                  </Form>
                ) : null}
              </td>
            </tr>
          ))}
          {revisions.length === 0 ? (
            <tr>
              <td colSpan={8} className="py-8 text-center text-iron-400">
                No revisions match.
              </td>
            </tr>
          ) : null}
        </tbody>
      </table>
      <Pager total={total} noun={["revision", "revisions"]} page={query.page} pages={pages} linkTo={(n) => withParams({ page: String(n) })} />
    </div>
  );
}
