// GET /api/builds/:buildId/releases: the build's releases, newest first.
// POST: release an approved, bench-checked revision { revision, note?, template?, names?, card? };
// 201 with the release. Not approved, items unticked or released meanwhile: 409; bundle errors: 422.
import { requireViewer } from "~/lib/auth/auth.server";
import { loadBuildFor } from "~/lib/auth/build-access.server";
import { releaseListAnswer, releaseSchema } from "~/lib/release/answers";
import { readReleaseInput } from "~/lib/release/requests";
import { releaseBuildFor, releasesFor } from "~/lib/release/service.server";
import { readJsonBody } from "~/lib/web/body.server";
import { apiAnswer, fail, jsonAs } from "~/lib/web/http.server";
import type { Route } from "./+types/api.builds.$buildId.releases";

export function loader({ request, params }: Route.LoaderArgs) {
  return apiAnswer(async () => {
    const v = await requireViewer(request, "view:release");
    const b = await loadBuildFor(v, params.buildId);
    return jsonAs(releaseListAnswer, { buildId: b.id, releases: await releasesFor(v, b) });
  });
}

export function action({ request, params }: Route.ActionArgs) {
  return apiAnswer(async () => {
    const v = await requireViewer(request, "release:build");
    if (request.method !== "POST") fail(405, "Release with POST and a JSON body { revision, note?, template?, names?, card? }.");
    const b = await loadBuildFor(v, params.buildId);
    const input = readReleaseInput(await readJsonBody(request, 64 * 1024, "The body is too large; a release is a revision number and a short note."));
    if (!input.ok) fail(400, input.error);
    return jsonAs(releaseSchema, await releaseBuildFor(v, b, input.value), { status: 201 });
  });
}
