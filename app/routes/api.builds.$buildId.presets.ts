// POST /api/builds/:buildId/presets: add a library preset to the build
// { libraryPresetId, version? (latest), fontId, configVersion, name? }: 201 with the new preset's
// id and the notes (roles skipped, channels with no look); 409 released or stale; 422 errors.
// GET lists where the build's presets came from.
import { requireViewer } from "~/lib/auth/auth.server";
import { loadBuildFor } from "~/lib/auth/build-access.server";
import { presetAddedAnswer, presetOriginsAnswer } from "~/lib/api-doc/shapes";
import { addFromLibraryFor, refused, updatesForBuild } from "~/lib/library/service.server";
import { addBody, firstIssue } from "~/lib/library/requests";
import { readJsonBody } from "~/lib/web/body.server";
import { apiAnswer, fail, jsonAs, refusalAnswer } from "~/lib/web/http.server";
import type { Route } from "./+types/api.builds.$buildId.presets";

export function loader({ request, params }: Route.LoaderArgs) {
  return apiAnswer(async () => {
    const v = await requireViewer(request, "view:library");
    const b = await loadBuildFor(v, params.buildId);
    const { origins } = await updatesForBuild(v, b);
    return jsonAs(presetOriginsAnswer, { origins });
  });
}

export function action({ request, params }: Route.ActionArgs) {
  return apiAnswer(async () => {
    const v = await requireViewer(request, "apply:library");
    if (request.method !== "POST") fail(405, "Add a library preset with POST.");
    const b = await loadBuildFor(v, params.buildId);
    const parsed = addBody.safeParse(await readJsonBody(request, 16 * 1024));
    if (!parsed.success) fail(400, firstIssue(parsed.error));
    const d = parsed.data;
    const r = await addFromLibraryFor(v, { buildId: b.id, libraryPresetId: d.libraryPresetId, version: d.version ?? null, fontId: d.fontId, configVersion: d.configVersion, name: d.name });
    if (refused(r)) return refusalAnswer(r);
    return jsonAs(presetAddedAnswer, r.body, { status: r.status });
  });
}
