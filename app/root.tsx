import { Links, Meta, Outlet, Scripts, ScrollRestoration } from "react-router";
import { ErrorPage } from "~/components/ErrorPage";
import type { Route } from "./+types/root";
import { useEffect } from "react";
import "./app.css";
import { requestGuard } from "./lib/web/guard.server";

/** Every request: cross-site refusal and text PostgreSQL cannot store (decision 011). */
export const middleware: Route.MiddlewareFunction[] = [requestGuard];

export function Layout({ children }: { children: React.ReactNode }) {
  // Marks the document once React has taken over, so browser tests act on a live page rather
  // than on server HTML whose buttons do nothing yet.
  useEffect(() => {
    document.documentElement.dataset.hydrated = "true";
  }, []);
  return (
    <html lang="en">
      <head>
        <meta charSet="utf-8" />
        <meta name="viewport" content="width=device-width, initial-scale=1" />
        <link rel="icon" href="/favicon.svg" type="image/svg+xml" />
        <Meta />
        <Links />
      </head>
      <body className="min-h-screen">
        {children}
        <ScrollRestoration />
        <Scripts />
      </body>
    </html>
  );
}

export default function App() {
  return <Outlet />;
}

/** A friendly page for every failure: the status, what went wrong in words, what to do, a way back. */
export function ErrorBoundary({ error }: Route.ErrorBoundaryProps) {
  return <ErrorPage error={error} back={[{ to: "/builds", label: "Back to builds" }]} page />;
}
