// The workshop's preset library: a server-paginated table (name, tags, latest version, the
// builds using it, last published), filtered by tag and searched by name; and an import of a
// "hiltbench.preset/1" file for those who publish.
import { data, Form, Link, useActionData, useNavigation } from "react-router";
import { ErrorPage } from "~/components/ErrorPage";
import { Pager } from "~/components/Pager";
import { requireViewer } from "~/lib/auth/auth.server";
import { can } from "~/lib/auth/permissions";
import { importFor, MAX_PRESET_DOCUMENT_BYTES } from "~/lib/library/exchange.server";
import { parseListQuery } from "~/lib/library/requests";
import { libraryTagsFor, listLibraryFor } from "~/lib/library/service.server";
import { parseJsonText, readFormLimited } from "~/lib/web/body.server";
import { errorTitle } from "~/lib/web/errors";
import { failureOf } from "~/lib/web/http.server";
import type { Route } from "./+types/library._index";
import { RefusalAlert } from "~/components/library/RefusalAlert";

export const meta: Route.MetaFunction = ({ error }) => [{ title: error ? errorTitle(error) : "Library · Hiltbench" }];

export async function loader({ request }: Route.LoaderArgs) {
  const v = await requireViewer(request, "view:library");
  const query = parseListQuery(new URL(request.url));
  const [{ rows, total }, tags] = await Promise.all([listLibraryFor(v, query), libraryTagsFor(v)]);
  return {
    query,
    total,
    tags,
    rows: rows.map((r) => ({ ...r, publishedAt: r.publishedAt.toISOString() })),
    canPublish: can(v.role, "publish:library"),
  };
}

type Answer = { error?: string; diagnostics?: { path: string; message: string }[]; imported?: { id: string; name: string } };

export async function action({ request }: Route.ActionArgs) {
  const v = await requireViewer(request, "publish:library");
  const form = await readFormLimited(request, MAX_PRESET_DOCUMENT_BYTES + 4096, "The preset file is too large; a library preset file is at most 1 MB.");
  const file = form.get("file");
  if (!(file instanceof File) || file.size === 0) return data<Answer>({ error: "Choose a preset file (.preset.json) to import." }, { status: 400 });
  let doc: unknown;
  try {
    doc = parseJsonText(await file.text(), "The preset file");
  } catch (e) {
    const f = failureOf(e);
    if (f) return data<Answer>({ error: f.message }, { status: f.status });
    throw e;
  }
  const r = await importFor(v, doc);
  const body = r.body as { error?: string; diagnostics?: { path: string; message: string }[]; presetId?: string };
  if (r.status >= 400) return data<Answer>({ error: body.error, diagnostics: body.diagnostics?.slice(0, 10) }, { status: r.status });
  return data<Answer>({ imported: { id: body.presetId!, name: (doc as { name: string }).name } });
}

export function ErrorBoundary({ error }: Route.ErrorBoundaryProps) {
  return <ErrorPage error={error} back={[{ to: "/builds", label: "Back to builds" }]} />;
}

export default function LibraryPage({ loaderData }: Route.ComponentProps) {
  const { query, total, tags, rows, canPublish } = loaderData;
  const answer = useActionData<typeof action>() as Answer | undefined;
  const busy = useNavigation().state === "submitting";
  const pages = Math.max(1, Math.ceil(total / query.perPage));
  const linkTo = (page: number) => {
    const p = new URLSearchParams();
    if (query.q) p.set("q", query.q);
    if (query.tag) p.set("tag", query.tag);
    p.set("page", String(page));
    return `/library?${p}`;
  };
  return (
    <div className="space-y-6">
      <h1>Preset library</h1>
      <p className="max-w-3xl text-iron-300">
        The workshop's reusable presets. Each publish is an immutable version with a changelog line; a build's preset remembers the version it came from, and
        shows "update available" when a newer one is published. Publish from a build's Looks page ("Save to library").
      </p>
      <Form method="get" className="flex flex-wrap items-end gap-3" role="search" aria-label="Library presets">
        <div>
          <label className="label" htmlFor="lib-q">
            Name
          </label>
          <input id="lib-q" name="q" className="field w-60" defaultValue={query.q ?? ""} maxLength={60} />
        </div>
        <div>
          <label className="label" htmlFor="lib-tag">
            Tag
          </label>
          <select id="lib-tag" name="tag" className="field w-48" defaultValue={query.tag ?? ""}>
            <option value="">Any tag</option>
            {tags.map((t) => (
              <option key={t} value={t}>
                {t}
              </option>
            ))}
          </select>
        </div>
        <button type="submit" className="btn">
          Filter
        </button>
      </Form>
      {rows.length === 0 ? (
        <p className="text-iron-400">No library presets{query.q || query.tag ? " match" : " yet"}.</p>
      ) : (
        <table className="table" data-testid="library-table">
          <thead>
            <tr>
              <th scope="col">Name</th>
              <th scope="col">Tags</th>
              <th scope="col">Latest version</th>
              <th scope="col">Builds using it</th>
              <th scope="col">Last published</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr key={r.id}>
                <td>
                  <Link to={`/library/${r.id}`}>{r.name}</Link>
                </td>
                <td>{r.tags.join(", ") || <span className="text-iron-400">—</span>}</td>
                <td>{r.latestVersion ? `v${r.latestVersion}` : "—"}</td>
                <td>
                  {r.buildCount}
                  {r.buildNames.length ? <span className="text-iron-300"> ({r.buildNames.join(", ")})</span> : null}
                </td>
                <td className="text-iron-300">{r.publishedAt.slice(0, 16).replace("T", " ")} UTC</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      <Pager total={total} noun={["library preset", "library presets"]} page={query.page} pages={pages} linkTo={linkTo} />

      {canPublish ? (
        <section className="card space-y-2" aria-labelledby="import-h">
          <h2 id="import-h">Import a preset file</h2>
          <p className="text-sm text-iron-300">A "hiltbench.preset/1" file exported from a library (all its versions, or one). It becomes a new preset here.</p>
          {answer?.imported ? (
            <p role="status" data-testid="import-ok">
              Imported <Link to={`/library/${answer.imported.id}`}>{answer.imported.name}</Link>.
            </p>
          ) : null}
          {answer?.error ? <RefusalAlert error={answer.error} diagnostics={answer.diagnostics} testId="import-error" /> : null}
          <Form method="post" encType="multipart/form-data" className="flex flex-wrap items-end gap-3">
            <div>
              <label className="label" htmlFor="import-file">
                Preset file
              </label>
              <input id="import-file" name="file" type="file" accept=".json,application/json" className="field" required />
            </div>
            <button type="submit" className="btn btn-primary" disabled={busy}>
              Import
            </button>
          </Form>
        </section>
      ) : null}
    </div>
  );
}
