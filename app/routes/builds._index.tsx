import { Form, Link, redirect, useSearchParams } from "react-router";
import { requireViewer } from "~/lib/auth/auth.server";
import { parseBuildQuery, STATUS_LABELS } from "~/lib/forms/build-forms";
import { BUILD_STATUSES } from "~/lib/db/types";
import { can } from "~/lib/auth/permissions";
import { buildsFor } from "~/lib/builds/builds.server";
import { Pager } from "~/components/Pager";
import type { Route } from "./+types/builds._index";

export const meta: Route.MetaFunction = () => [{ title: "Builds · Hiltbench" }];

export async function loader({ request }: Route.LoaderArgs) {
  const v = await requireViewer(request, "view:builds");
  // Clients land on their own list, the handoff (decision 023).
  if (!can(v.role, "view:build-list")) throw redirect("/handoff");
  const query = parseBuildQuery(new URL(request.url));
  const { rows, total } = await buildsFor(v, query);
  return {
    query,
    total,
    canCreate: can(v.role, "create:build"),
    builds: rows.map((r) => ({ ...r, updated_at: r.updated_at.toISOString(), created_at: r.created_at.toISOString() })),
  };
}

const COLUMNS = [
  { key: "name", label: "Build" },
  { key: "client", label: "Client" },
  { key: "status", label: "Status" },
  { key: "updated", label: "Updated" },
  { key: "created", label: "Created" },
] as const;

export default function Builds({ loaderData }: Route.ComponentProps) {
  const { query, total, builds, canCreate } = loaderData;
  const [params] = useSearchParams();
  const pages = Math.max(1, Math.ceil(total / query.perPage));
  const withParams = (changes: Record<string, string | null>) => {
    const p = new URLSearchParams(params);
    for (const [k, v] of Object.entries(changes)) (v === null ? p.delete(k) : p.set(k, v));
    return `?${p.toString()}`;
  };
  return (
    <div>
      <div className="flex items-center gap-4">
        <h1>Builds</h1>
        {canCreate ? (
          <Link to="/builds/new" className="btn btn-primary ml-auto">
            New build
          </Link>
        ) : null}
      </div>
      <Form method="get" className="mt-4 flex flex-wrap items-end gap-3" role="search">
        <div>
          <label className="label" htmlFor="q">
            Search
          </label>
          <input id="q" name="q" defaultValue={query.q ?? ""} className="field w-64" placeholder="Build, client or notes" />
        </div>
        <div>
          <label className="label" htmlFor="status">
            Status
          </label>
          <select id="status" name="status" defaultValue={query.status ?? ""} className="field">
            <option value="">Any</option>
            {BUILD_STATUSES.map((s) => (
              <option key={s} value={s}>
                {STATUS_LABELS[s]}
              </option>
            ))}
          </select>
        </div>
        <label className="flex items-center gap-2 text-sm">
          <input type="checkbox" name="archived" value="1" defaultChecked={query.archived} /> Archived
        </label>
        <input type="hidden" name="sort" value={query.sort} />
        <input type="hidden" name="dir" value={query.dir} />
        <button className="btn" type="submit">
          Apply
        </button>
      </Form>
      <table className="table mt-4" data-testid="builds-table">
        <thead>
          <tr>
            {COLUMNS.map((c) => {
              const active = query.sort === c.key;
              const nextDir = active && query.dir === "asc" ? "desc" : "asc";
              return (
                <th key={c.key} aria-sort={active ? (query.dir === "asc" ? "ascending" : "descending") : "none"}>
                  <Link to={withParams({ sort: c.key, dir: nextDir, page: null })} className="text-iron-300">
                    {c.label} {active ? (query.dir === "asc" ? "▲" : "▼") : ""}
                  </Link>
                </th>
              );
            })}
          </tr>
        </thead>
        <tbody>
          {builds.map((b) => (
            <tr key={b.id}>
              <td>
                <Link to={`/builds/${b.id}`}>{b.name}</Link>
              </td>
              <td>{b.client_name}</td>
              <td>
                <span className="rounded bg-soot-700 px-2 py-0.5 text-xs">{STATUS_LABELS[b.status]}</span>
              </td>
              <td className="font-mono text-xs text-iron-300">{b.updated_at.slice(0, 16).replace("T", " ")}</td>
              <td className="font-mono text-xs text-iron-300">{b.created_at.slice(0, 10)}</td>
            </tr>
          ))}
          {builds.length === 0 ? (
            <tr>
              <td colSpan={5} className="py-8 text-center text-iron-400">
                No builds match.
              </td>
            </tr>
          ) : null}
        </tbody>
      </table>
      <Pager total={total} noun={["build", "builds"]} page={query.page} pages={pages} linkTo={(n) => withParams({ page: String(n) })} className="mt-4" />
    </div>
  );
}
