// GET /api/builds/:buildId/release-bundle: the card zip of the build's newest release, exactly
// as released (its revision, template, name rules and card size), streamed. The client's one
// way to a bundle (decision 023); the SHA-256 recorded at release is in X-Bundle-SHA256.
import { requireViewer } from "~/lib/auth/auth.server";
import { zipResponse } from "~/lib/bundle/zip.server";
import { releaseBundleFor } from "~/lib/handoff/service.server";
import { storage } from "~/lib/storage/settings.server";
import { apiAnswer, fail } from "~/lib/web/http.server";
import type { Route } from "./+types/api.builds.$buildId.release-bundle";

export function loader({ request, params }: Route.LoaderArgs) {
  return apiAnswer(async () => {
    const v = await requireViewer(request, "view:handoff");
    const asked = [...new URL(request.url).searchParams.keys()];
    if (asked.length)
      fail(400, `This download takes no parameters (got ${asked.slice(0, 3).join(", ")}): it is the newest release's card exactly as released.`, { field: asked[0] });
    const { plan, release } = await releaseBundleFor(v, params.buildId);
    return zipResponse(plan, storage(), release.fileName, { "X-Release-Number": String(release.number), "X-Bundle-SHA256": release.sha256 });
  });
}
