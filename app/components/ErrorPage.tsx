// The error page every boundary shows: the status, what went wrong in the server's words, what
// to do about it (404 vs 403 vs a server failure), and links back. Focus moves to its heading so
// a keyboard or screen-reader user lands on the explanation, and every way out is a link or button.
import { useEffect, useRef } from "react";
import { Link } from "react-router";
import { describeError } from "~/lib/web/errors";

export type Way = { to: string; label: string };

export function ErrorPage({ error, back, page = false }: { error: unknown; back: Way[]; /** The whole page (the root boundary) rather than a part of the app's frame. */ page?: boolean }) {
  const e = describeError(error);
  const heading = useRef<HTMLHeadingElement>(null);
  useEffect(() => heading.current?.focus(), []);
  const Frame = page ? "main" : "section";
  return (
    <Frame className={page ? "mx-auto max-w-xl p-10" : "max-w-xl py-4"} aria-labelledby="error-h" data-testid="error-page">
      <title>{`${e.title} · Hiltbench`}</title>
      <p className="font-mono text-sm text-ember-400">{e.status}</p>
      <h1 id="error-h" ref={heading} tabIndex={-1} className="mt-2 outline-none">
        {e.title}
      </h1>
      <p className="mt-4 text-iron-300" data-testid="error-message">
        {e.message}
      </p>
      <p className="mt-2 text-sm text-iron-400" data-testid="error-advice">
        {e.advice}
      </p>
      <p className="mt-8 flex flex-wrap gap-3">
        {back.map((w) => (
          <Link key={w.to} to={w.to} className="btn">
            {w.label}
          </Link>
        ))}
        {e.status >= 500 || e.status === 409 ? (
          <button type="button" className="btn" onClick={() => window.location.reload()}>
            Reload
          </button>
        ) : null}
      </p>
    </Frame>
  );
}
