// The Bundle tab: choose a revision, template, name mode and card; see every file the card will
// hold with its size and SHA-256, the findings (names that clash after sanitising, the card's
// capacity, fonts still to come), and download the zip with a progress bar.
import { Link } from "react-router";
import { BundleDownload } from "~/components/bundle/BundleDownload";
import { BundleQueryForm } from "~/components/bundle/BundleQueryForm";
import { FindingList } from "~/components/bundle/FindingList";
import { requireViewer } from "~/lib/auth/auth.server";
import { loadBuildFor } from "~/lib/auth/build-access.server";
import { formatBytes } from "~/lib/bundle/card-check";
import { openBundlePage } from "~/lib/bundle/page.server";
import type { Route } from "./+types/builds.$buildId.bundle";

export const meta: Route.MetaFunction = ({ data }) => [{ title: `Bundle · ${data?.buildName ?? "Build"} · Hiltbench` }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const v = await requireViewer(request, "make:bundle");
  const b = await loadBuildFor(v, params.buildId);
  return openBundlePage(v, b, new URL(request.url).searchParams);
}

const share = (used: number, of: number) => `${((100 * used) / of).toLocaleString("en", { maximumFractionDigits: used / of < 0.01 ? 2 : 0 })} %`;

export default function BundlePage({ loaderData }: Route.ComponentProps) {
  const page = loaderData;
  const { plan, problem } = page;
  const errors = plan?.findings.filter((f) => f.severity === "error") ?? [];
  const checkHref = `/builds/${page.buildId}/bundle/check?${page.apiHref.split("?")[1]}`;
  return (
    <div className="space-y-5">
      <h2>SD card bundle</h2>
      <BundleQueryForm page={page} submitLabel="Show the card" />
      {problem ? (
        <p role="alert" className="card text-signal-error">
          {problem.message}
        </p>
      ) : null}
      {plan ? (
        <>
          <section aria-labelledby="bundle-summary-h" className="card space-y-3">
            <h3 id="bundle-summary-h">
              {plan.name}
            </h3>
            <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm" data-testid="bundle-summary">
              <dt className="text-iron-400">Revision</dt>
              <dd>
                {plan.revision}
                {plan.latest ? " (today's config)" : ""}
              </dd>
              <dt className="text-iron-400">Template</dt>
              <dd>
                {plan.template.name} v{plan.template.version}
              </dd>
              <dt className="text-iron-400">Files</dt>
              <dd>
                {plan.files.length} files, {formatBytes(plan.totalBytes)} ({plan.totalBytes.toLocaleString("en")} bytes)
              </dd>
              <dt className="text-iron-400">On the card</dt>
              <dd>
                {formatBytes(plan.cardUsedBytes)} in 32 KiB clusters, of {formatBytes(plan.cardBytes)} ({plan.cardBytes.toLocaleString("en")} bytes, decimal as cards are sold)
              </dd>
            </dl>
            <div className="h-2 w-full overflow-hidden rounded bg-soot-700" role="img" aria-label={`The bundle takes ${share(plan.cardUsedBytes, plan.cardBytes)} of the card`}>
              <div className={`h-full ${plan.cardUsedBytes > plan.cardBytes * 0.97 ? "bg-signal-error" : "bg-ember-500"}`} style={{ width: `${Math.min(100, Math.max(0.5, (100 * plan.cardUsedBytes) / plan.cardBytes))}%` }} />
            </div>
            <p className="text-xs text-iron-400">The handoff sheet on the card (handoff.html) carries the charging and battery cautions for the client.</p>
          </section>

          <section aria-labelledby="bundle-findings-h" className="space-y-2">
            <h3 id="bundle-findings-h">Findings</h3>
            <FindingList findings={plan.findings} />
          </section>

          <section aria-labelledby="bundle-download-h" className="card space-y-2">
            <h3 id="bundle-download-h">Download</h3>
            <BundleDownload
              href={page.apiHref}
              name={plan.name}
              approxBytes={plan.totalBytes}
              blocked={errors.length ? `The card cannot be built until ${errors.length === 1 ? "this error is" : `these ${errors.length} errors are`} fixed: ${errors.map((e) => e.message).join(" ")}` : null}
            />
            <p className="text-sm">
              <Link to={checkHref}>Check a card against this bundle</Link> — compare a card's files (or a zip) with this manifest, in your browser.
            </p>
          </section>

          <section aria-labelledby="bundle-files-h" className="space-y-2">
            <h3 id="bundle-files-h">Files on the card</h3>
            <div className="overflow-x-auto">
              <table className="w-full text-sm" data-testid="bundle-files">
                <caption className="sr-only">Every file of the bundle with its size and SHA-256</caption>
                <thead>
                  <tr className="text-left text-iron-400">
                    <th scope="col" className="py-1 pr-4">File</th>
                    <th scope="col" className="py-1 pr-4 text-right">Size (bytes)</th>
                    <th scope="col" className="py-1">SHA-256</th>
                  </tr>
                </thead>
                <tbody>
                  {plan.files.map((f, i) => (
                    // Two files may have the same card name (a clash the findings report): key by position.
                    <tr key={i} className="border-t border-soot-700">
                      <td className="py-1 pr-4 font-mono">{f.path}</td>
                      <td className="py-1 pr-4 text-right tabular-nums">{f.size.toLocaleString("en")}</td>
                      <td className="py-1 font-mono text-xs break-all text-iron-300">{f.sha256}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          </section>
        </>
      ) : null}
    </div>
  );
}
