// Cross-site request refusal (CSRF), decided once for every request by the request guard
// (web/guard.server.ts), before any action runs. Pure, so the table of cases is unit-tested.

/** Methods that never change anything here; everything else must come from our own pages. */
const SAFE_METHODS = new Set(["GET", "HEAD", "OPTIONS"]);

/**
 * Why this request is refused as cross-site, or null when it may go on.
 *
 * - Safe methods (GET, HEAD, OPTIONS) pass: no loader changes data.
 * - A request with an `Authorization` header authenticates by its bearer token only (the session
 *   cookie is ignored then), and a browser cannot add that header cross-site without a CORS
 *   preflight we never grant: scripts need no Origin.
 * - Otherwise a browser's `Sec-Fetch-Site` must be `same-origin` (or `none`: typed by the person),
 *   an `Origin` must be one of ours, and, with neither header, a `Referer` must be ours too. A
 *   client that sends none of them (curl, a test) is not a browser riding on someone's cookie.
 */
export function crossSiteReason(request: Request, ownOrigins: readonly string[]): string | null {
  if (SAFE_METHODS.has(request.method.toUpperCase())) return null;
  const h = request.headers;
  if (h.has("Authorization")) return null;
  const site = h.get("Sec-Fetch-Site");
  if (site !== null && site !== "same-origin" && site !== "none") return `the browser marked it ${site} (Sec-Fetch-Site)`;
  const origin = h.get("Origin");
  if (origin !== null) return ownOrigins.includes(origin) ? null : `it comes from ${origin.slice(0, 80)}, not from this app`;
  if (site !== null) return null;
  const referer = h.get("Referer");
  if (referer !== null) {
    let from: string;
    try {
      from = new URL(referer).origin;
    } catch {
      return "its Referer is not an address";
    }
    if (!ownOrigins.includes(from)) return `it comes from a page on ${from.slice(0, 80)}, not from this app`;
  }
  return null;
}
