// One library preset: its version history (changelog, author, time, validation counts), a
// compare of any two versions in the model diff's words, the builds using it, exports, deleting
// an unused version, and for the owner the roll-out of the newest version to every build using
// it: a dry run first, then apply to the clean ones (released builds are never changed).
import { data, Form, Link, useActionData, useNavigation } from "react-router";
import { ErrorPage } from "~/components/ErrorPage";
import { ModelChanges } from "~/components/revisions/ModelChanges";
import { requirePermission, requireViewer } from "~/lib/auth/auth.server";
import { can } from "~/lib/auth/permissions";
import { compareParam } from "~/lib/library/requests";
import { buildsUsingFor, compareVersionsFor, deleteVersionFor, getLibraryPresetFor, rollOutFor, type RolloutReport } from "~/lib/library/service.server";
import { readFormLimited } from "~/lib/web/body.server";
import { errorTitle } from "~/lib/web/errors";
import { fail } from "~/lib/web/http.server";
import type { Route } from "./+types/library.$presetId";

export const meta: Route.MetaFunction = ({ data: d, error }) => [{ title: error ? errorTitle(error) : `${d?.preset.name ?? "Preset"} · Library · Hiltbench` }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const v = await requireViewer(request, "view:library");
  const p = await getLibraryPresetFor(v, params.presetId);
  if (!p) fail(404, "No library preset with this id in your workshop.");
  const url = new URL(request.url);
  // "?compare=1..2", or the form's "?from=1&to=2".
  const fromTo = url.searchParams.has("from") ? `${url.searchParams.get("from")}..${url.searchParams.get("to")}` : null;
  const raw = url.searchParams.get("compare") ?? fromTo;
  const pair = raw === null ? null : compareParam(raw);
  if (raw !== null && !pair) fail(400, 'Compare two versions as "?compare=1..2".');
  const latest = p.versions[0]?.version ?? 0;
  const [from, to] = pair ?? [p.versions[1]?.version ?? latest, latest];
  const changes = from && to ? await compareVersionsFor(v, p.id, from, to) : [];
  if (changes === null) fail(404, `This preset has no version ${p.versions.some((x) => x.version === from) ? to : from}.`);
  const builds = await buildsUsingFor(v, p.id);
  return {
    preset: { id: p.id, name: p.name, tags: p.tags, notes: p.notes, latest },
    versions: p.versions.map((x) => ({ ...x, createdAt: x.createdAt.toISOString() })),
    compare: { from, to, changes },
    builds,
    canPublish: can(v.role, "publish:library"),
    canRollOut: can(v.role, "apply:library-all"),
  };
}

type Answer = { intent: string; error?: string; ok?: string; report?: RolloutReport };

export async function action({ request, params }: Route.ActionArgs) {
  const v = await requireViewer(request, "view:library");
  const form = await readFormLimited(request, 8192, "The form is too large.");
  const intent = String(form.get("intent") ?? "");
  if (intent === "delete-version") {
    requirePermission(v, "publish:library");
    const n = Number(form.get("version"));
    if (!Number.isInteger(n) || n < 1 || n > 2147483647) return data<Answer>({ intent, error: "Choose a version to delete." }, { status: 400 });
    const r = await deleteVersionFor(v, params.presetId, n);
    if (r.kind === "missing") return data<Answer>({ intent, error: `There is no version ${n} of this preset.` }, { status: 404 });
    if (r.kind === "last") return data<Answer>({ intent, error: "This is the preset's only version; it stays." }, { status: 409 });
    if (r.kind === "in-use") return data<Answer>({ intent, error: `Version ${n} is used by ${[...new Set(r.builds.map((b) => b.buildName))].join(", ")}; it stays. Update those builds first.` }, { status: 409 });
    return data<Answer>({ intent, ok: `Deleted version ${n}.` });
  }
  if (intent === "dry-run" || intent === "apply-all") {
    requirePermission(v, "apply:library-all");
    const r = await rollOutFor(v, params.presetId, intent === "apply-all");
    if (r.status >= 400) return data<Answer>({ intent, error: (r.body as { error: string }).error }, { status: r.status });
    return data<Answer>({ intent, report: r.body as RolloutReport });
  }
  return data<Answer>({ intent, error: "Unknown action on this page." }, { status: 400 });
}

export function ErrorBoundary({ error }: Route.ErrorBoundaryProps) {
  return <ErrorPage error={error} back={[{ to: "/library", label: "Back to the library" }]} />;
}

const OUTCOME: Record<string, string> = { clean: "merges cleanly", conflicts: "needs hands", released: "released: never changed", current: "already on it", missing: "preset no longer in the build" };

export default function LibraryPresetPage({ loaderData }: Route.ComponentProps) {
  const { preset, versions, compare, builds, canPublish, canRollOut } = loaderData;
  const answer = useActionData<typeof action>() as Answer | undefined;
  const busy = useNavigation().state === "submitting";
  const report = answer?.report;
  const clean = report?.rows.filter((r) => r.outcome === "clean" && !r.applied).length ?? 0;
  return (
    <div className="space-y-6">
      <p>
        <Link to="/library">← Library</Link>
      </p>
      <div className="flex flex-wrap items-baseline gap-3">
        <h1>{preset.name}</h1>
        <Link to={`/library/${preset.id}/edit`}>{canPublish ? "Edit in the look editor" : "Open in the look editor"}</Link>
      </div>
      <p className="text-iron-300">
        {preset.tags.length ? `Tags: ${preset.tags.join(", ")} · ` : ""}latest v{preset.latest}
        {preset.notes ? ` · ${preset.notes}` : ""}
      </p>
      {answer?.error ? (
        <p role="alert" className="rounded-md border border-signal-error px-3 py-2 text-sm" data-testid="preset-error">
          {answer.error}
        </p>
      ) : null}
      {answer?.ok ? (
        <p role="status" className="rounded-md border border-signal-ok/50 px-3 py-2 text-sm">
          {answer.ok}
        </p>
      ) : null}

      <section className="card" aria-labelledby="versions-h">
        <h2 id="versions-h">Versions</h2>
        <table className="table mt-2" data-testid="versions-table">
          <thead>
            <tr>
              <th scope="col">Version</th>
              <th scope="col">Changelog</th>
              <th scope="col">Author</th>
              <th scope="col">Published</th>
              <th scope="col">Errors / warnings</th>
              <th scope="col">
                <span className="sr-only">Actions</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {versions.map((x) => (
              <tr key={x.version}>
                <td>v{x.version}</td>
                <td>{x.changelog}</td>
                <td>{x.authorName ?? "—"}</td>
                <td className="text-iron-300">{x.createdAt.slice(0, 16).replace("T", " ")} UTC</td>
                <td>
                  {x.errorCount} / {x.warningCount}
                </td>
                <td className="flex flex-wrap gap-2">
                  <a href={`/api/presets/${preset.id}/export?version=${x.version}`} download>
                    Export v{x.version}
                  </a>
                  {canPublish && versions.length > 1 ? (
                    <Form method="post">
                      <input type="hidden" name="intent" value="delete-version" />
                      <input type="hidden" name="version" value={x.version} />
                      <button type="submit" className="btn btn-danger" disabled={busy}>
                        Delete v{x.version}
                      </button>
                    </Form>
                  ) : null}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
        <p className="mt-2">
          <a href={`/api/presets/${preset.id}/export`} download>
            Export every version (hiltbench.preset/1)
          </a>
        </p>
      </section>

      <section className="card space-y-3" aria-labelledby="compare-h">
        <h2 id="compare-h">Compare versions</h2>
        <Form method="get" className="flex flex-wrap items-end gap-3">
          <VersionSelect label="From" id="cmp-from" name="from" versions={versions} value={compare.from} />
          <VersionSelect label="To" id="cmp-to" name="to" versions={versions} value={compare.to} />
          <button type="submit" className="btn">
            Compare
          </button>
        </Form>
        <h3 className="text-base">
          v{compare.from} → v{compare.to}
        </h3>
        <ModelChanges changes={compare.changes ?? []} testId="version-changes" empty="No changes between these versions." />
      </section>

      <section className="card" aria-labelledby="builds-h">
        <h2 id="builds-h">Builds using it</h2>
        {builds.length === 0 ? (
          <p className="text-iron-400">No build uses this preset yet.</p>
        ) : (
          <ul className="mt-2 list-disc pl-5" data-testid="builds-using">
            {builds.map((b) => (
              <li key={`${b.buildId}-${b.presetId}`}>
                <Link to={`/builds/${b.buildId}/looks`}>{b.buildName}</Link> — preset <code>{b.presetId}</code> on v{b.version}
                {b.version < preset.latest ? <span className="ml-2 text-signal-warning">update available</span> : null}
                {b.status === "released" ? <span className="ml-2 text-iron-400">(released)</span> : null}
              </li>
            ))}
          </ul>
        )}
      </section>

      {canRollOut ? (
        <section className="card space-y-3" aria-labelledby="rollout-h">
          <h2 id="rollout-h">Apply v{preset.latest} to every build</h2>
          <p className="text-sm text-iron-300">A dry run first: which builds merge cleanly and which need hands. Released builds are never changed.</p>
          <Form method="post">
            <input type="hidden" name="intent" value="dry-run" />
            <button type="submit" className="btn" disabled={busy}>
              Dry run
            </button>
          </Form>
          {report ? (
            <>
              <table className="table" data-testid="rollout-report">
                <caption className="sr-only">Roll-out report</caption>
                <thead>
                  <tr>
                    <th scope="col">Build</th>
                    <th scope="col">Preset</th>
                    <th scope="col">From</th>
                    <th scope="col">Outcome</th>
                  </tr>
                </thead>
                <tbody>
                  {report.rows.map((r) => (
                    <tr key={`${r.buildId}-${r.presetId}`}>
                      <td>
                        <Link to={`/builds/${r.buildId}/looks`}>{r.buildName}</Link>
                      </td>
                      <td>{r.presetName}</td>
                      <td>v{r.fromVersion}</td>
                      <td>
                        {r.applied ? `updated to v${report.target}` : OUTCOME[r.outcome]}
                        {r.error ? ` (${r.error})` : ""}
                        {r.outcome === "conflicts" ? ` (${r.conflicts.length} collision${r.conflicts.length === 1 ? "" : "s"}: open the build to pick)` : ""}
                      </td>
                    </tr>
                  ))}
                </tbody>
              </table>
              {answer?.intent === "dry-run" && clean > 0 ? (
                <Form method="post">
                  <input type="hidden" name="intent" value="apply-all" />
                  <button type="submit" className="btn btn-primary" disabled={busy}>
                    Apply to the {clean} clean build{clean === 1 ? "" : "s"}
                  </button>
                </Form>
              ) : null}
            </>
          ) : null}
        </section>
      ) : null}
    </div>
  );
}

/** One end of a version comparison: v1, v2, … */
function VersionSelect({ label, id, name, versions, value }: { label: string; id: string; name: string; versions: { version: number }[]; value: number }) {
  return (
    <div>
      <label className="label" htmlFor={id}>
        {label}
      </label>
      <select id={id} name={name} className="field w-28" defaultValue={value}>
        {versions.map((x) => (
          <option key={x.version} value={x.version}>
            v{x.version}
          </option>
        ))}
      </select>
    </div>
  );
}
