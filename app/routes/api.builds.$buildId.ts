import { requireViewer } from "~/lib/auth/auth.server";
import { loadBuildFor } from "~/lib/auth/build-access.server";
import { apiAnswer, jsonAs } from "~/lib/web/http.server";
import { buildAnswer } from "~/lib/api-doc/shapes";
import type { Route } from "./+types/api.builds.$buildId";

export function loader({ request, params }: Route.LoaderArgs) {
  return apiAnswer(async () => {
    const v = await requireViewer(request, "view:builds");
    const b = await loadBuildFor(v, params.buildId);
    return jsonAs(buildAnswer, {
      id: b.id,
      name: b.name,
      client: b.client_name,
      status: b.status,
      hiltNotes: b.hilt_notes,
      archived: b.archived_at !== null,
      configVersion: b.config_version,
      updatedAt: b.updated_at.toISOString(),
      rig: b.config.rig,
    });
  });
}
