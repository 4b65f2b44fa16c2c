// GET /api/openapi.json: the API's OpenAPI 3.1 document, public, generated from the routes' own
// zod schemas (app/lib/api-doc, decision 020).
import { apiDocument } from "~/lib/api-doc/document";
import { json } from "~/lib/web/http.server";

export function loader() {
  return json(apiDocument());
}
