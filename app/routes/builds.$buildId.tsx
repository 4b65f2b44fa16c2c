import { Link, NavLink, Outlet } from "react-router";
import { requireViewer } from "~/lib/auth/auth.server";
import { STATUS_LABELS } from "~/lib/forms/build-forms";
import { loadBuildFor } from "~/lib/auth/build-access.server";
import { can } from "~/lib/auth/permissions";
import { ErrorPage } from "~/components/ErrorPage";
import { describeError, errorTitle } from "~/lib/web/errors";
import { outdatedPresetsFor } from "~/lib/library/service.server";
import { openRequestCountsFor } from "~/lib/requests/service.server";
import type { Route } from "./+types/builds.$buildId";

export const meta: Route.MetaFunction = ({ data, error }) => [{ title: error ? errorTitle(error) : `${data?.build.name ?? "Build"} · Hiltbench` }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const v = await requireViewer(request, "view:builds");
  const b = await loadBuildFor(v, params.buildId);
  // Client requests are the workshop's tab; clients read theirs on their handoff page.
  const canViewRequests = can(v.role, "view:requests") && v.role !== "client";
  return {
    build: { id: b.id, name: b.name, status: b.status, client_name: b.client_name, archived: b.archived_at !== null },
    canEdit: can(v.role, "edit:build"),
    canViewRevisions: can(v.role, "view:revisions"),
    canViewReviews: can(v.role, "view:reviews"),
    canViewRelease: can(v.role, "view:release"),
    canMakeBundle: can(v.role, "make:bundle"),
    // Presets a version behind the library (a badge on every section of the build).
    outdated: can(v.role, "view:library") ? (await outdatedPresetsFor(v, b)).length : 0,
    canViewRequests,
    openRequests: canViewRequests ? ((await openRequestCountsFor(v, b.id)).get(b.id) ?? 0) : 0,
  };
}

const tab = ({ isActive }: { isActive: boolean }) =>
  `border-b-2 px-3 py-2 text-sm no-underline ${isActive ? "border-ember-500 text-iron-100" : "border-transparent text-iron-300 hover:text-iron-100"}`;

/** The build's sections, in the order the work goes: rig, looks, fonts, checks, then the rendered config. */
const SECTIONS = [
  [".", "Overview"],
  ["rig", "Rig"],
  ["looks", "Looks"],
  ["fonts", "Fonts"],
  ["checks", "Checks"],
  ["render", "Render"],
  ["revisions", "Revisions"],
  ["reviews", "Reviews"],
  ["bundle", "Bundle"],
  ["release", "Release"],
  ["requests", "Requests"],
] as const;

export default function BuildLayout({ loaderData }: Route.ComponentProps) {
  const { build, canViewRevisions, canViewReviews, canViewRelease, canMakeBundle, canViewRequests, openRequests, outdated } = loaderData;
  return (
    <div>
      <div className="flex flex-wrap items-baseline gap-3">
        <h1>{build.name}</h1>
        <span className="rounded bg-soot-700 px-2 py-0.5 text-xs" data-testid="build-status">{STATUS_LABELS[build.status]}</span>
        {build.archived ? <span className="rounded bg-soot-800 px-2 py-0.5 text-xs text-iron-400">Archived</span> : null}
        <span className="text-iron-400">{build.client_name}</span>
        <Link to={`/handoff/${build.id}`} className="text-sm">
          {canMakeBundle ? "Preview the client's handoff" : "Your handoff sheet"}
        </Link>
        {outdated ? (
          <Link to="looks#library-h" className="rounded border border-signal-warning px-2 py-0.5 text-xs no-underline" data-testid="build-update-badge">
            Update available from the library ({outdated} preset{outdated === 1 ? "" : "s"})
          </Link>
        ) : null}
      </div>
      <nav className="mt-3 flex gap-1 border-b border-soot-700" aria-label="Build sections">
        {SECTIONS.filter(([to]) => (to !== "revisions" || canViewRevisions) && (to !== "reviews" || canViewReviews) && (to !== "bundle" || canMakeBundle) && (to !== "release" || canViewRelease) && (to !== "requests" || canViewRequests)).map(([to, label]) => (
          <NavLink key={to} to={to} end={to === "."} className={tab}>
            {label}
            {to === "requests" && openRequests > 0 ? (
              <span className="ml-1.5 rounded-full bg-ember-600 px-1.5 text-xs text-white" data-testid="open-requests" aria-label={`${openRequests} waiting for an answer`}>
                {openRequests}
              </span>
            ) : null}
          </NavLink>
        ))}
      </nav>
      <div className="mt-5">
        <Outlet />
      </div>
    </div>
  );
}

/**
 * A failure in the build or one of its sections: 404 (not this workshop's, or not this client's),
 * 403 (the role does not allow it) or a server failure, with ways back that still work.
 */
export function ErrorBoundary({ error, params }: Route.ErrorBoundaryProps) {
  return (
    <ErrorPage
      error={error}
      back={[
        { to: "/builds", label: "Back to builds" },
        ...(params.buildId && describeError(error).status !== 404 ? [{ to: `/builds/${params.buildId}`, label: "This build's overview" }] : []),
      ]}
    />
  );
}
