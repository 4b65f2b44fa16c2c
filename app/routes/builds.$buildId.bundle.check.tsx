// Check a card: the bundle's manifest for the chosen revision, template, names and card, and a
// drop zone where the browser compares the card's files with it (Web Crypto; nothing uploaded).
import { Link } from "react-router";
import { BundleQueryForm } from "~/components/bundle/BundleQueryForm";
import { CardCheck } from "~/components/bundle/CardCheck";
import { requireViewer } from "~/lib/auth/auth.server";
import { loadBuildFor } from "~/lib/auth/build-access.server";
import { openBundlePage } from "~/lib/bundle/page.server";
import type { Route } from "./+types/builds.$buildId.bundle.check";

export const meta: Route.MetaFunction = ({ data }) => [{ title: `Check a card · ${data?.buildName ?? "Build"} · Hiltbench` }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const v = await requireViewer(request, "make:bundle");
  const b = await loadBuildFor(v, params.buildId);
  return openBundlePage(v, b, new URL(request.url).searchParams);
}

export default function CheckCardPage({ loaderData }: Route.ComponentProps) {
  const page = loaderData;
  const back = `/builds/${page.buildId}/bundle?${page.apiHref.split("?")[1]}`;
  return (
    <div className="space-y-5">
      <h2>Check a card</h2>
      <p className="text-sm text-iron-300">
        Compare a card with the bundle it should hold: files missing, files that are not in the bundle, and files whose size or SHA-256 differ. <Link to={back}>Back to the bundle</Link>
      </p>
      <BundleQueryForm page={page} submitLabel="Use this bundle" />
      {page.problem ? (
        <p role="alert" className="card text-signal-error">
          {page.problem.message}
        </p>
      ) : null}
      {page.plan ? (
        <>
          <p className="text-sm" data-testid="check-against">
            Checking against {page.plan.name}: revision {page.plan.revision}, template {page.plan.template.name} v{page.plan.template.version}, {page.plan.files.length} files.
          </p>
          <CardCheck key={page.apiHref} expected={page.plan.files} />
        </>
      ) : null}
    </div>
  );
}
