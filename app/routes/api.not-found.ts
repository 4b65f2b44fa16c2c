// Any address under /api that no route serves: a JSON 404 in the API's one error shape (never
// the HTML error page), for every method, pointing at the reference.
import { apiError } from "~/lib/web/http.server";
import type { Route } from "./+types/api.not-found";

function notFound(request: Request): Response {
  const path = new URL(request.url).pathname;
  return apiError(404, `There is no API route at ${request.method} ${path.slice(0, 200)}. Every route is listed at /api/docs (and /api/openapi.json).`);
}

export function loader({ request }: Route.LoaderArgs) {
  return notFound(request);
}

export function action({ request }: Route.ActionArgs) {
  return notFound(request);
}
