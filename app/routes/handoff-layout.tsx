// The client's frame (decision 023): their builds and their sign-out, none of the workshop's
// tools. Workshop members see the same pages as a read-only preview of what the client sees.
import { Link, NavLink, Outlet } from "react-router";
import { SignOutButton } from "~/components/SignOutButton";
import { ErrorPage } from "~/components/ErrorPage";
import { requireViewer } from "~/lib/auth/auth.server";
import { can } from "~/lib/auth/permissions";
import type { Route } from "./+types/handoff-layout";

export async function loader({ request }: Route.LoaderArgs) {
  const v = await requireViewer(request, "view:handoff");
  return { name: v.user.displayName, workshop: v.workshop.name, preview: can(v.role, "view:build-list") };
}

export default function HandoffLayout({ loaderData }: Route.ComponentProps) {
  const { name, workshop, preview } = loaderData;
  return (
    <div className="min-h-screen">
      <header className="border-b border-soot-700 bg-soot-900">
        <nav className="mx-auto flex max-w-5xl items-center gap-4 px-4 py-2.5" aria-label="Main">
          <NavLink to="/handoff" className="font-mono font-bold text-ember-400 no-underline" end>
            hiltbench
          </NavLink>
          <span className="text-sm text-iron-400">{workshop}</span>
          <NavLink to="/handoff" end className="rounded px-2 py-1 text-iron-300 no-underline hover:text-iron-100">
            Your builds
          </NavLink>
          {preview ? (
            <Link to="/builds" className="rounded px-2 py-1 text-sm">
              Back to the workshop
            </Link>
          ) : null}
          <span className="ml-auto text-sm text-iron-300" data-testid="who">
            {name}
          </span>
          <SignOutButton />
        </nav>
      </header>
      <main className="mx-auto max-w-5xl px-4 py-6">
        {preview ? (
          <p className="mb-4 text-sm text-brass-300" data-testid="handoff-preview">
            Preview: this is what the client sees (read-only).
          </p>
        ) : null}
        <Outlet />
      </main>
    </div>
  );
}

export function ErrorBoundary({ error }: Route.ErrorBoundaryProps) {
  return <ErrorPage error={error} back={[{ to: "/handoff", label: "Back to your builds" }]} page />;
}
