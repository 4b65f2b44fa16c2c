// POST /api/presets/:presetId/versions: publish a new version { baseVersion, changelog, preset }.
// 201 with the version; 409 when another version was published since baseVersion; 422 with
// the validator's diagnostics when the preset has errors. GET lists the versions.
import { requireViewer } from "~/lib/auth/auth.server";
import { libraryVersionsAnswer, presetPublishedAnswer } from "~/lib/api-doc/shapes";
import { getLibraryPresetFor, publishFor, refused } from "~/lib/library/service.server";
import { MAX_PRESET_DOCUMENT_BYTES } from "~/lib/library/exchange.server";
import { firstIssue, publishBody } from "~/lib/library/requests";
import { readJsonBody } from "~/lib/web/body.server";
import { apiAnswer, fail, jsonAs, refusalAnswer } from "~/lib/web/http.server";
import type { Route } from "./+types/api.presets.$presetId.versions";

export function loader({ request, params }: Route.LoaderArgs) {
  return apiAnswer(async () => {
    const v = await requireViewer(request, "view:library");
    const p = await getLibraryPresetFor(v, params.presetId);
    if (!p) fail(404, "No library preset with this id in your workshop.");
    return jsonAs(libraryVersionsAnswer, { versions: p.versions.map((x) => ({ ...x, createdAt: x.createdAt.toISOString() })) });
  });
}

export function action({ request, params }: Route.ActionArgs) {
  return apiAnswer(async () => {
    const v = await requireViewer(request, "publish:library");
    if (request.method !== "POST") fail(405, "Publish a version with POST and a JSON body { baseVersion, changelog, preset }.");
    const body = await readJsonBody(request, MAX_PRESET_DOCUMENT_BYTES, "The preset is too large; a library preset is at most 1 MB.");
    const parsed = publishBody.safeParse(body);
    if (!parsed.success) fail(400, firstIssue(parsed.error));
    const r = await publishFor(v, { presetId: params.presetId, baseVersion: parsed.data.baseVersion, body: parsed.data.preset, changelog: parsed.data.changelog });
    if (refused(r)) return refusalAnswer(r);
    return jsonAs(presetPublishedAnswer, r.body, { status: r.status });
  });
}
