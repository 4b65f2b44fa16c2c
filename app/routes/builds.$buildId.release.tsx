// The Release tab: choose the revision (the newest approved one by default), tick its bench check
// item by item (each tick saves at once), choose the card's template, names and size as on the
// Bundle tab, release, and see every release with its bundle's SHA-256 and a download.
import { data, Form, Link } from "react-router";
import { CardChoiceFields } from "~/components/bundle/BundleQueryForm";
import { BenchChecklist } from "~/components/release/BenchChecklist";
import { SafetyCautions } from "~/components/SafetyCautions";
import { requireViewer } from "~/lib/auth/auth.server";
import { loadBuildFor } from "~/lib/auth/build-access.server";
import { formatBytes } from "~/lib/bundle/card-check";
import { openReleasePage, releasePageAction } from "~/lib/release/page.server";
import { MAX_RELEASE_NOTE_CHARS } from "~/lib/release/requests";
import { readFormLimited } from "~/lib/web/body.server";
import type { Route } from "./+types/builds.$buildId.release";

export const meta: Route.MetaFunction = ({ data }) => [{ title: `Release · ${data?.buildName ?? "Build"} · Hiltbench` }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const v = await requireViewer(request, "view:release");
  const b = await loadBuildFor(v, params.buildId);
  return openReleasePage(v, b, new URL(request.url).searchParams);
}

export async function action({ request, params }: Route.ActionArgs) {
  const v = await requireViewer(request, "view:release");
  const b = await loadBuildFor(v, params.buildId);
  const form = await readFormLimited(request, 16 * 1024, "The form is larger than 16 KB; a release note is far shorter. Nothing was saved.");
  const r = await releasePageAction(v, b, form);
  return data(r, { status: r.ok ? (r.intent === "release" ? 201 : 200) : r.status });
}

const when = (iso: string) => `${iso.slice(0, 16).replace("T", " ")} UTC`;

export default function ReleasePage({ loaderData, actionData }: Route.ComponentProps) {
  const p = loaderData;
  const q = p.bundle?.query;
  const choices = p.revision !== null && !p.approved.includes(p.revision) ? [p.revision, ...p.approved] : p.approved;
  const refused = actionData && !actionData.ok ? actionData.error : null;
  const released = actionData && actionData.ok && actionData.intent === "release" ? actionData.release : null;
  return (
    <div className="space-y-5">
      <h2>Release</h2>
      {p.revision === null ? (
        <p className="card" data-testid="release-none-approved">
          No revision of this build is approved yet. A revision is released after a reviewer approves it: <Link to="../reviews">ask for a review on the Reviews tab</Link>.
        </p>
      ) : (
        <>
          <Form method="get" className="card flex flex-wrap items-end gap-3" aria-label="Revision and card">
            <div>
              <label className="label" htmlFor="release-revision">
                Revision
              </label>
              <select id="release-revision" name="revision" className="field w-auto" defaultValue={p.revision}>
                {choices.map((n) => (
                  <option key={n} value={n}>
                    Revision {n}
                    {p.approved.includes(n) ? " (approved)" : " (not approved)"}
                  </option>
                ))}
              </select>
            </div>
            <CardChoiceFields idPrefix="release" templates={p.bundle?.templates ?? []} template={q?.template ?? null} ownLabel="The revision's own" mode={q?.mode ?? "long"} cardGb={q?.cardGb ?? 32} />
            <button type="submit" className="btn">
              Show
            </button>
          </Form>

          {!p.revisionApproved ? (
            <p className="card text-signal-warning" data-testid="release-not-approved">
              Revision {p.revision} is not approved. <Link to="../reviews">Ask for a review on the Reviews tab</Link>; only an approved revision is released.
            </p>
          ) : null}

          {p.check ? (
            <section aria-labelledby="bench-h" className="space-y-3">
              <div className="flex flex-wrap items-baseline gap-3">
                <h3 id="bench-h">Bench check of revision {p.revision}</h3>
                <p aria-live="polite" className="text-sm text-iron-300" data-testid="bench-progress">
                  {p.check.ticked} of {p.check.total} ticked
                </p>
              </div>
              <p className="text-sm text-iron-400">Try each item on the bench with the card in the hilt, and tick it when it is right. Each tick saves at once.</p>
              <BenchChecklist check={p.check} editable={p.may.tick} />
              <SafetyCautions headingLevel={3} />
            </section>
          ) : null}

          <section aria-labelledby="release-form-h" className="card space-y-3">
            <h3 id="release-form-h">Release revision {p.revision}</h3>
            {p.bundle?.plan ? (
              <p className="text-sm text-iron-300">
                The bundle: {p.bundle.plan.name}, template {p.bundle.plan.template.name} v{p.bundle.plan.template.version}, {p.bundle.plan.files.length} files, {formatBytes(p.bundle.plan.totalBytes)}.{" "}
                <Link to={`../bundle?${p.bundle.apiHref.split("?")[1]}`}>See it on the Bundle tab</Link>.
              </p>
            ) : null}
            {p.may.release ? (
              <Form method="post" className="space-y-3" key={p.releases.length}>
                <input type="hidden" name="intent" value="release" />
                <input type="hidden" name="revision" value={p.revision} />
                <input type="hidden" name="template" value={q?.template ?? ""} />
                <input type="hidden" name="names" value={q?.mode ?? "long"} />
                <input type="hidden" name="card" value={String(q?.cardGb ?? 32)} />
                <div>
                  <label className="label" htmlFor="release-note">
                    Note (kept with the release and sent to the client)
                  </label>
                  <textarea id="release-note" name="note" rows={2} maxLength={MAX_RELEASE_NOTE_CHARS} className="field" />
                </div>
                {p.blocked ? (
                  <p id="release-blocked" className="text-sm text-signal-warning" data-testid="release-blocked">
                    {p.blocked}
                  </p>
                ) : null}
                <button type="submit" className="btn btn-primary" disabled={p.blocked !== null} aria-describedby={p.blocked ? "release-blocked" : undefined}>
                  Release
                </button>
              </Form>
            ) : (
              <p className="text-sm text-iron-400">Owners and builders release a build; you can read the bench check and the history.</p>
            )}
            {refused ? (
              <p role="alert" className="rounded-md border border-signal-error px-3 py-2 text-sm" data-testid="release-error">
                {refused}
              </p>
            ) : null}
            {released ? (
              <p role="status" className="text-sm text-signal-ok" data-testid="release-done">
                Released as release {released.number}. The client hears by e-mail when they have an account.
              </p>
            ) : null}
          </section>
        </>
      )}

      <section aria-labelledby="release-history-h" className="space-y-2">
        <h3 id="release-history-h">Release history</h3>
        {p.releases.length === 0 ? (
          <p className="text-sm text-iron-400">Not released yet.</p>
        ) : (
          <div className="overflow-x-auto">
            <table className="w-full text-sm" data-testid="release-history">
              <caption className="sr-only">Every release of this build, newest first</caption>
              <thead>
                <tr className="text-left text-iron-400">
                  <th scope="col" className="py-1 pr-3">Release</th>
                  <th scope="col" className="py-1 pr-3">Revision</th>
                  <th scope="col" className="py-1 pr-3">Bundle SHA-256</th>
                  <th scope="col" className="py-1 pr-3 text-right">Size</th>
                  <th scope="col" className="py-1 pr-3">Who, when</th>
                  <th scope="col" className="py-1 pr-3">Note</th>
                  <th scope="col" className="py-1">Bundle</th>
                </tr>
              </thead>
              <tbody>
                {p.releases.map((r) => (
                  <tr key={r.id} className="border-t border-soot-700" data-testid="release-row">
                    <td className="py-1 pr-3">{r.number}</td>
                    <td className="py-1 pr-3">{r.revision}</td>
                    <td className="py-1 pr-3 font-mono text-xs break-all" data-testid="release-sha256">
                      {r.sha256}
                    </td>
                    <td className="py-1 pr-3 text-right tabular-nums" title={`${r.bytes.toLocaleString("en")} bytes`}>
                      {formatBytes(r.bytes)}
                    </td>
                    <td className="py-1 pr-3">
                      {r.releasedBy ?? "a former member"}, {when(r.releasedAt)}
                    </td>
                    <td className="py-1 pr-3 whitespace-pre-wrap">{r.note}</td>
                    <td className="py-1">
                      <a href={r.download} download data-testid="release-download">
                        Download release {r.number}
                      </a>
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
      </section>
    </div>
  );
}
