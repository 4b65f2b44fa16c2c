// The one HTTP module: answers with the right status and a message a person can read. Pages throw
// `fail(...)` (shown by the error boundaries); `failureOf` reads such a throw back, and
// `apiAnswer` / `textAnswer` turn it into a JSON or plain-text answer for scripts and downloads.
// Every API error has one shape, `ApiErrorBody` (documented once in app/lib/api-doc, decision 020).
import { data } from "react-router";
import type { z } from "zod";
import { DATABASE_DOWN_MESSAGE, isDatabaseUnavailable } from "../db/unavailable";

/**
 * What may ride along with an API error, where it applies: the form field or query parameter at
 * fault, the validator's diagnostics, positioned template/config errors (the first 50, their
 * total and kinds), the bundle's findings, the version a stale save should start from; for the
 * preset library, the newest version a stale publish missed, the merge collisions that need a
 * choice, and the builds that keep a version from being deleted.
 */
export type ApiErrorDetails = {
  field?: string;
  diagnostics?: readonly object[];
  errors?: readonly object[];
  total?: number;
  kinds?: readonly object[];
  findings?: readonly object[];
  currentVersion?: number | null;
  latestVersion?: number | null;
  conflicts?: readonly object[];
  builds?: readonly object[];
};

/** The one error shape of the API: the HTTP status again, a message for a person, and the details that apply. */
export type ApiErrorBody = { status: number; error: string } & ApiErrorDetails;

export type Failure = { message: string; details?: ApiErrorDetails };

/** Stop a loader or action with a status and a message meant for a person (and, for the API, details). */
export function fail(status: number, message: string, details?: ApiErrorDetails): never {
  throw data<Failure>(details ? { message, details } : { message }, { status });
}

/** An API error answer in the one shape. */
export function apiError(status: number, message: string, details: ApiErrorDetails = {}, init: ResponseInit = {}): Response {
  const body: ApiErrorBody = { status, error: message, ...details };
  return json(body, { ...init, status });
}

/** A concern's refusal (`{ status, body: { error, ...details } }`, e.g. the library's) as an API error answer. */
export function refusalAnswer(r: { status: number; body: { error: string } & ApiErrorDetails }): Response {
  const { error, ...details } = r.body;
  return apiError(r.status, error, details);
}

export function json(body: unknown, init: ResponseInit = {}): Response {
  const headers = new Headers(init.headers);
  headers.set("Content-Type", "application/json; charset=utf-8");
  headers.set("Cache-Control", "no-store");
  return new Response(JSON.stringify(body), { ...init, headers });
}

/**
 * A JSON answer whose body must have the documented shape: `schema` is the zod schema the API
 * document shows for this answer (app/lib/api-doc/shapes.ts), checked by the compiler here and
 * against the document in the tests.
 */
export function jsonAs<S extends z.ZodType>(_schema: S, body: z.input<S>, init: ResponseInit = {}): Response {
  return json(body, init);
}

/** Plain text (a patch, a rendered header) that is never cached. */
export function text(body: string, init: ResponseInit = {}): Response {
  const headers = new Headers(init.headers);
  if (!headers.has("Content-Type")) headers.set("Content-Type", "text/plain; charset=utf-8");
  headers.set("Cache-Control", "no-store");
  return new Response(body, { ...init, headers });
}

export type ThrownFailure = { status: number; message: string; headers?: HeadersInit; details?: ApiErrorDetails };

/**
 * A failure thrown with `fail(...)` or the router's `data(..., { status })` (the server-side
 * form of what `isRouteErrorResponse` recognises in a boundary), read back; null for anything
 * else (a Response, a bug).
 */
export function failureOf(e: unknown): ThrownFailure | null {
  if (typeof e !== "object" || e === null || (e as { type?: string }).type !== "DataWithResponseInit") return null;
  const d = e as { data?: unknown; init?: ResponseInit | null };
  const { message, details } = (d.data ?? {}) as Partial<Failure>;
  const f: ThrownFailure = { status: d.init?.status ?? 500, message: typeof message === "string" ? message : "Request failed", headers: d.init?.headers };
  if (details && typeof details === "object") f.details = details;
  return f;
}

/**
 * A PostgreSQL "data exception" (SQLSTATE class 22: a NUL or bad Unicode in text, a number
 * outside its column's range, text that is not a uuid): the input was wrong, not the server.
 * The edges refuse these first with the field's name (decision 011); this is the backstop.
 */
export function isDataException(e: unknown): boolean {
  const code = typeof e === "object" && e !== null ? (e as { code?: unknown }).code : undefined;
  return typeof code === "string" && /^22[0-9A-Z]{3}$/.test(code);
}

/**
 * Wrap an API handler so every thrown failure becomes a JSON answer with its status; a
 * redirect meant for a page becomes a 401, since scripts cannot follow it to a sign-in form.
 * Unexpected errors become JSON too: a 400 for data PostgreSQL refused, else a logged 500.
 */
export async function apiAnswer(run: () => Promise<Response>): Promise<Response> {
  try {
    return await run();
  } catch (e) {
    if (e instanceof Response) {
      if (e.status >= 300 && e.status < 400) return apiError(401, "Sign in or send a valid bearer token.");
      return e;
    }
    const f = failureOf(e);
    if (f) return apiError(f.status, f.message, f.details, { headers: f.headers });
    // A connection error that did not come through the app's pool (db/outage.server.ts maps those).
    if (isDatabaseUnavailable(e)) return apiError(503, DATABASE_DOWN_MESSAGE, {}, { headers: { "Retry-After": "10" } });
    if (isDataException(e)) return apiError(400, "The request holds a value the database cannot store (text with a NUL character or broken Unicode, or a number out of range); nothing was changed.");
    console.error(e);
    return apiError(500, "The server hit an unexpected problem; nothing was changed. Try again, and tell the workshop owner if it keeps happening.");
  }
}

/**
 * Under /api nothing answers an HTML error page: when the router fails a request before any API
 * route runs (an address whose percent-encoding it cannot decode, say), the document renderer
 * would draw the error page; this gives the API's one error shape instead. Null elsewhere.
 */
export function apiErrorInsteadOfPage(request: Request, status: number, errors: Record<string, unknown> | null | undefined, headers?: Headers): Response | null {
  const path = new URL(request.url).pathname;
  if (status < 400 || !(path === "/api" || path.startsWith("/api/"))) return null;
  const first = Object.values(errors ?? {})[0] as { data?: unknown; statusText?: string } | undefined;
  const data = first?.data;
  const said = typeof data === "object" && data !== null && typeof (data as Failure).message === "string" ? (data as Failure).message : null;
  const message =
    said ??
    (status === 400
      ? "The address is not valid percent-encoded UTF-8 text (or holds text that cannot be stored)."
      : status === 404
        ? "There is no API route at this address. Every route is listed at /api/docs."
        : "The server hit an unexpected problem; nothing was changed.");
  const init: ResponseInit = headers ? { headers } : {};
  return apiError(status, message, {}, init);
}

/** The same for an address a person downloads from: failures answer as plain text with their status. */
export async function textAnswer(run: () => Promise<Response>): Promise<Response> {
  try {
    return await run();
  } catch (e) {
    if (e instanceof Response) return e;
    const f = failureOf(e);
    if (f) return text(`${f.message}\n`, { status: f.status });
    throw e;
  }
}
