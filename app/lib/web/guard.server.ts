// The request guard: the one middleware (root.tsx) every request passes before any loader or
// action runs (decision 011). It refuses, with a 4xx and a message naming what is wrong:
// - a state-changing request from another site (web/origin.ts), logout and sign-in included;
// - an address whose path or query holds text PostgreSQL cannot store (input/edges.ts), or that
//   is not valid percent-encoded UTF-8, so no route parameter ever reaches a query with it;
// - a form (URL-encoded or multipart, up to FORM_CHECK_BYTES) with such text in a field.
// JSON bodies are checked where they are read (web/body.server.ts), with the JSON path.
// Under /api it also turns the router's bare 405 (a method no route offers) into the one error shape.
import { data, isRouteErrorResponse, type MiddlewareFunction } from "react-router";
import { crossSiteReason } from "./origin";
import { env } from "../env.server";
import { badTextReason, findBadFormField } from "../input/edges";
import { apiError } from "./http.server";
import { urlEncodedFieldWithNul } from "./read-form.server";

/** Forms larger than this are left to their route, which caps its own body (a template is ≤ 1 MB). */
export const FORM_CHECK_BYTES = 4 * 1024 * 1024;

const isApi = (url: URL) => url.pathname === "/api" || url.pathname.startsWith("/api/");

function refuse(url: URL, status: number, message: string, field?: string): never {
  if (isApi(url)) throw apiError(status, message, field !== undefined ? { field } : {});
  throw data({ message, ...(field !== undefined ? { field } : {}) }, { status });
}

/** What is wrong with the address, or null. */
export function badAddress(url: URL): { message: string; field?: string } | null {
  for (const segment of url.pathname.split("/")) {
    let decoded: string;
    try {
      decoded = decodeURIComponent(segment);
    } catch {
      return { message: "The address is not valid percent-encoded UTF-8 text." };
    }
    const reason = badTextReason(decoded);
    if (reason) return { message: `A part of the address ${reason}.` };
  }
  for (const [name, value] of url.searchParams) {
    const reason = badTextReason(name) ?? badTextReason(value);
    if (reason) {
      const shown = name.replace(/[\u0000\ud800-\udfff]/g, "\ufffd").slice(0, 40);
      return { message: `The query parameter '${shown}' ${reason}.`, field: shown };
    }
  }
  return null;
}

function ownOrigins(request: Request): string[] {
  const mine = new URL(request.url).origin;
  const app = new URL(env().APP_URL).origin;
  return mine === app ? [mine] : [mine, app];
}

export const requestGuard: MiddlewareFunction<Response> = async ({ request }, next) => {
  const url = new URL(request.url);
  const crossSite = crossSiteReason(request, ownOrigins(request));
  if (crossSite) refuse(url, 403, `Cross-site request refused: ${crossSite}. Changes must come from Hiltbench's own pages or carry an API token.`);
  const address = badAddress(url);
  if (address) refuse(url, 400, address.message, address.field);
  const method = request.method.toUpperCase();
  if (method !== "GET" && method !== "HEAD" && request.body) {
    const type = (request.headers.get("Content-Type") ?? "").toLowerCase();
    const declared = Number(request.headers.get("Content-Length") ?? Number.NaN);
    if (type.startsWith("application/x-www-form-urlencoded") && Number.isFinite(declared) && declared <= FORM_CHECK_BYTES) {
      // Only a NUL survives URL-encoding (bytes that are not UTF-8 decode to U+FFFD), and it
      // shows as '%00' in the text: found without decoding the whole form on the event loop.
      const field = urlEncodedFieldWithNul(await request.clone().text());
      if (field !== null) refuse(url, 400, `The field '${field}' ${badTextReason("\u0000")}; nothing was changed.`, field);
    } else if (type.startsWith("multipart/form-data") && Number.isFinite(declared) && declared <= FORM_CHECK_BYTES) {
      let form: FormData | null = null;
      try {
        form = await request.clone().formData();
      } catch {
        form = null; // not readable as a form: the route answers that with its own message
      }
      const bad = form ? findBadFormField(form.entries()) : null;
      if (bad) refuse(url, 400, `The field '${bad.path}' ${bad.reason}; nothing was changed.`, bad.path);
    }
  }
  if (!isApi(url)) return next();
  // A method a route does not offer: the router's own 405 says only "Unexpected Server Error";
  // under /api it answers the one error shape instead (routes' own 405s carry their advice).
  const methodRefused = () => apiError(405, `${method} is not offered at ${url.pathname.slice(0, 200)}; the methods each route takes are listed at /api/docs.`);
  let res: Response;
  try {
    res = await next();
  } catch (e) {
    if (isRouteErrorResponse(e) && e.status === 405) return methodRefused();
    throw e;
  }
  if (res.status === 405) {
    const body = (await res.clone().json().catch(() => null)) as { status?: unknown } | null;
    if (!body || typeof body.status !== "number") return methodRefused();
  }
  return res;
};
