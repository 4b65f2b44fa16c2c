// What a failed page tells a person: the status, a title, the server's own message, and what to
// do next. Read from the router's error response (`isRouteErrorResponse`) in every error
// boundary, so a 404, a 403 and a server failure read differently everywhere. Pure; client-safe.
import { isRouteErrorResponse } from "react-router";

export type ErrorView = { status: number; title: string; message: string; advice: string };

const TITLES: Record<number, string> = {
  400: "That request was not right",
  401: "Please sign in",
  403: "Not allowed",
  404: "Not found",
  405: "Not available here",
  409: "Conflict",
  413: "Too large",
  422: "Not accepted",
  429: "Too many requests",
  503: "Busy",
};

function adviceFor(status: number): string {
  if (status === 401) return "Sign in again, then come back to this page.";
  if (status === 403) return "Your role in the workshop does not allow this. Ask the workshop's owner if you need it.";
  if (status === 404) return "It may have been deleted or belong to another workshop, or the address is mistyped. Go back to the list and choose it there.";
  if (status === 409) return "Someone changed it meanwhile. Reload the page to see the latest, then make your change again.";
  if (status === 429) return "Wait the time the message names, then try again.";
  if (status === 503) return "The server is busy; try again in a moment.";
  if (status >= 400 && status < 500) return "Nothing was changed. Go back, correct what the message names, and try again.";
  return "Nothing you saved was lost. Try again in a moment; if it keeps happening, tell whoever runs your workshop's Hiltbench what you were doing.";
}

export function describeError(error: unknown): ErrorView {
  if (isRouteErrorResponse(error)) {
    const status = error.status;
    const m = (error.data as { message?: string } | undefined)?.message ?? (typeof error.data === "string" ? error.data : undefined);
    const title = TITLES[status] ?? (status >= 500 ? "Something went wrong" : "That did not work");
    return { status, title, message: m || error.statusText || "The request failed.", advice: adviceFor(status) };
  }
  return {
    status: 500,
    title: "Something went wrong",
    message: "The workshop server hit an unexpected problem. Nothing you saved was lost; try again in a moment.",
    advice: adviceFor(500),
  };
}

/** The page title for a failure, for route `meta` functions. */
export function errorTitle(error: unknown): string {
  return `${describeError(error).title} · Hiltbench`;
}
