// GET /api/builds/:buildId/revisions/:n: one revision's config and metadata.
import { requireViewer } from "~/lib/auth/auth.server";
import { loadBuildFor } from "~/lib/auth/build-access.server";
import { revisionOf } from "~/lib/revisions/compare.server";
import { readRevisionNumber } from "~/lib/revisions/params";
import { apiAnswer, fail, jsonAs } from "~/lib/web/http.server";
import { revisionAnswer } from "~/lib/api-doc/shapes";
import type { Route } from "./+types/api.builds.$buildId.revisions.$n";

export function loader({ request, params }: Route.LoaderArgs) {
  return apiAnswer(async () => {
    const v = await requireViewer(request, "view:revisions");
    const b = await loadBuildFor(v, params.buildId);
    const n = readRevisionNumber(params.n, "n");
    if (!n.ok) fail(400, n.error);
    const { config, ...r } = await revisionOf(v, b, n.value);
    return jsonAs(revisionAnswer, { buildId: b.id, ...r, createdAt: r.createdAt.toISOString(), current: r.number === b.config_version, review: null, config });
  });
}
