import { NavLink, Outlet } from "react-router";
import { SignOutButton } from "~/components/SignOutButton";
import { requireViewer } from "~/lib/auth/auth.server";
import { can } from "~/lib/auth/permissions";
import type { ClientViewer } from "~/lib/auth/viewer";
import type { Route } from "./+types/app-layout";

export async function loader({ request }: Route.LoaderArgs) {
  const v = await requireViewer(request);
  const viewer: ClientViewer = { name: v.user.displayName, role: v.role, workshop: v.workshop.name, login: v.user.githubLogin, email: v.user.email };
  return { viewer };
}

const link = ({ isActive }: { isActive: boolean }) =>
  `rounded px-2 py-1 no-underline ${isActive ? "bg-soot-700 text-iron-100" : "text-iron-300 hover:text-iron-100"}`;

export default function AppLayout({ loaderData }: Route.ComponentProps) {
  const { viewer } = loaderData;
  return (
    <div className="min-h-screen">
      <header className="border-b border-soot-700 bg-soot-900">
        <nav className="mx-auto flex max-w-7xl items-center gap-4 px-4 py-2.5" aria-label="Main">
          <NavLink to="/builds" className="font-mono font-bold text-ember-400 no-underline">
            hiltbench
          </NavLink>
          <span className="text-sm text-iron-400">{viewer.workshop}</span>
          {can(viewer.role, "view:build-list") ? (
            <NavLink to="/builds" className={link} end={false}>
              Builds
            </NavLink>
          ) : (
            <NavLink to="/handoff" className={link}>
              Your builds
            </NavLink>
          )}
          {can(viewer.role, "view:templates") ? (
            <NavLink to="/templates" className={link}>
              Templates
            </NavLink>
          ) : null}
          {can(viewer.role, "view:library") ? (
            <NavLink to="/library" className={link}>
              Library
            </NavLink>
          ) : null}
          {can(viewer.role, "view:members") ? (
            <NavLink to="/workshop" className={link}>
              Workshop
            </NavLink>
          ) : null}
          <NavLink to="/account" className={link}>
            Account
          </NavLink>
          <span className="ml-auto text-sm text-iron-300" data-testid="who">
            {viewer.name} · <span className="text-brass-300">{viewer.role}</span>
          </span>
          <SignOutButton />
        </nav>
      </header>
      <main className="mx-auto max-w-7xl px-4 py-6">
        <Outlet />
      </main>
    </div>
  );
}
