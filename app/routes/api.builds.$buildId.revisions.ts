// GET /api/builds/:buildId/revisions?sort=&dir=&page=&perPage=&author=: the build's revisions,
// newest first by default, paged on the server (metadata only; one revision's config is at
// /api/builds/:buildId/revisions/:n).
import { requireViewer } from "~/lib/auth/auth.server";
import { loadBuildFor } from "~/lib/auth/build-access.server";
import { listRevisionsFor } from "~/lib/revisions/compare.server";
import { readListQuery } from "~/lib/revisions/params";
import { apiAnswer, fail, jsonAs } from "~/lib/web/http.server";
import { revisionListAnswer } from "~/lib/api-doc/shapes";
import type { Route } from "./+types/api.builds.$buildId.revisions";

export function loader({ request, params }: Route.LoaderArgs) {
  return apiAnswer(async () => {
    const v = await requireViewer(request, "view:revisions");
    const b = await loadBuildFor(v, params.buildId);
    const q = readListQuery(new URL(request.url).searchParams);
    if (!q.ok) fail(400, q.error);
    const { rows, total } = await listRevisionsFor(v, b.id, q.value);
    return jsonAs(revisionListAnswer, {
      buildId: b.id,
      current: b.config_version,
      page: q.value.page,
      perPage: q.value.perPage,
      total,
      revisions: rows.map((r) => ({ ...r, createdAt: r.createdAt.toISOString(), review: null })),
    });
  });
}
