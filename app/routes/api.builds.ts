import { requireViewer } from "~/lib/auth/auth.server";
import { parseBuildQuery } from "~/lib/forms/build-forms";
import { apiAnswer, jsonAs } from "~/lib/web/http.server";
import { buildListAnswer } from "~/lib/api-doc/shapes";
import { buildsFor } from "~/lib/builds/builds.server";
import type { Route } from "./+types/api.builds";

export function loader({ request }: Route.LoaderArgs) {
  return apiAnswer(async () => {
    const v = await requireViewer(request, "view:builds");
    const query = parseBuildQuery(new URL(request.url));
    const { rows, total } = await buildsFor(v, query);
    return jsonAs(buildListAnswer, {
      total,
      page: query.page,
      perPage: query.perPage,
      builds: rows.map((r) => ({ id: r.id, name: r.name, client: r.client_name, status: r.status, updatedAt: r.updated_at.toISOString(), createdAt: r.created_at.toISOString(), archived: r.archived_at !== null })),
    });
  });
}
