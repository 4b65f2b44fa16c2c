import { Links, Meta, Outlet, Scripts, ScrollRestoration, isRouteErrorResponse, Link } from "react-router";
import type { Route } from "./+types/root";
import { useEffect } from "react";
import "./app.css";

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

/** A friendly page for every failure: the status, what went wrong in words, a way back. */
export function ErrorBoundary({ error }: Route.ErrorBoundaryProps) {
  let status = 500;
  let title = "Something went wrong";
  let message = "The workshop server hit an unexpected problem. Nothing you saved was lost; try again in a moment.";
  if (isRouteErrorResponse(error)) {
    status = error.status;
    const m = (error.data as { message?: string } | undefined)?.message ?? (typeof error.data === "string" ? error.data : undefined);
    title = { 400: "That request was not right", 401: "Please sign in", 403: "Not allowed", 404: "Not found", 409: "Conflict", 413: "Too large", 422: "Not accepted" }[status] ?? title;
    message = m ?? error.statusText ?? message;
  }
  return (
    <main className="mx-auto max-w-xl p-10">
      <title>{`${title} · Hiltbench`}</title>
      <p className="font-mono text-sm text-ember-400">{status}</p>
      <h1 className="mt-2">{title}</h1>
      <p className="mt-4 text-iron-300" data-testid="error-message">
        {message}
      </p>
      <p className="mt-8">
        <Link to="/builds" className="btn">
          Back to builds
        </Link>
      </p>
    </main>
  );
}
