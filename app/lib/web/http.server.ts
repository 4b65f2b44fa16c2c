// Helpers for answers with the right status and a message a person can read. Pages throw
// `fail(...)` (shown by the error boundary); API routes turn the same throw into JSON.
import { data } from "react-router";

export type Failure = { message: string };

/** Stop a loader or action with a status and a message meant for a person. */
export function fail(status: number, message: string): never {
  throw data<Failure>({ message }, { status });
}

export function json(body: unknown, init: ResponseInit = {}): Response {
  const headers = new Headers(init.headers);
  headers.set("Content-Type", "application/json; charset=utf-8");
  headers.set("Cache-Control", "no-store");
  return new Response(JSON.stringify(body), { ...init, headers });
}

function isDataWithInit(e: unknown): e is { type: "DataWithResponseInit"; data: unknown; init: ResponseInit | null } {
  return typeof e === "object" && e !== null && (e as { type?: string }).type === "DataWithResponseInit";
}

/**
 * Wrap an API handler so every thrown failure becomes a JSON answer with its status; a
 * redirect meant for a page becomes a 401, since scripts cannot follow it to a sign-in form.
 */
export async function apiAnswer(run: () => Promise<Response>): Promise<Response> {
  try {
    return await run();
  } catch (e) {
    if (e instanceof Response) {
      if (e.status >= 300 && e.status < 400) return json({ error: "Sign in or send a valid bearer token." }, { status: 401 });
      return e;
    }
    if (isDataWithInit(e)) {
      const status = e.init?.status ?? 500;
      const message = (e.data as Failure | undefined)?.message ?? "Request failed";
      return json({ error: message }, { status, headers: e.init?.headers });
    }
    throw e;
  }
}
