// GET /api/presets: the workshop's library, paged (?q= name, ?tag=, ?page=, ?perPage=).
// POST /api/presets: a new library preset ({ preset, changelog }, 201) or an import of a
// "hiltbench.preset/1" document (201 with the new preset's id).
import { requireViewer } from "~/lib/auth/auth.server";
import { libraryListAnswer, presetImportedAnswer, presetPublishedAnswer } from "~/lib/api-doc/shapes";
import { listLibraryFor, publishFor, refused } from "~/lib/library/service.server";
import { importFor, isPresetDocument, MAX_PRESET_DOCUMENT_BYTES } from "~/lib/library/exchange.server";
import { createBody, firstIssue, parseListQuery } from "~/lib/library/requests";
import { readJsonBody } from "~/lib/web/body.server";
import { apiAnswer, fail, jsonAs, refusalAnswer } from "~/lib/web/http.server";
import type { Route } from "./+types/api.presets";

export function loader({ request }: Route.LoaderArgs) {
  return apiAnswer(async () => {
    const v = await requireViewer(request, "view:library");
    const query = parseListQuery(new URL(request.url));
    const { rows, total } = await listLibraryFor(v, query);
    return jsonAs(libraryListAnswer, {
      total,
      page: query.page,
      perPage: query.perPage,
      presets: rows.map((r) => ({ ...r, publishedAt: r.publishedAt.toISOString(), url: `/api/presets/${r.id}` })),
    });
  });
}

export function action({ request }: Route.ActionArgs) {
  return apiAnswer(async () => {
    const v = await requireViewer(request, "publish:library");
    if (request.method !== "POST") fail(405, "Create or import a library preset with POST.");
    const body = await readJsonBody(request, MAX_PRESET_DOCUMENT_BYTES, "The preset document is too large; a library preset file is at most 1 MB.");
    if (isPresetDocument(body)) {
      const r = await importFor(v, body);
      if (refused(r)) return refusalAnswer(r);
      return jsonAs(presetImportedAnswer, r.body, { status: r.status });
    }
    const parsed = createBody.safeParse(body);
    if (!parsed.success) fail(400, firstIssue(parsed.error));
    const r = await publishFor(v, { presetId: null, baseVersion: null, body: parsed.data.preset, changelog: parsed.data.changelog });
    if (refused(r)) return refusalAnswer(r);
    return jsonAs(presetPublishedAnswer, r.body, { status: r.status });
  });
}
