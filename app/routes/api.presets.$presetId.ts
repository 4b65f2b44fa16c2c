// GET /api/presets/:presetId: a library preset with its versions (newest first) and the builds using it.
import { requireViewer } from "~/lib/auth/auth.server";
import { libraryPresetAnswer } from "~/lib/api-doc/shapes";
import { buildsUsingFor, getLibraryPresetFor } from "~/lib/library/service.server";
import { apiAnswer, fail, jsonAs } from "~/lib/web/http.server";
import type { Route } from "./+types/api.presets.$presetId";

export function loader({ request, params }: Route.LoaderArgs) {
  return apiAnswer(async () => {
    const v = await requireViewer(request, "view:library");
    const p = await getLibraryPresetFor(v, params.presetId);
    if (!p) fail(404, "No library preset with this id in your workshop.");
    const builds = await buildsUsingFor(v, p.id);
    return jsonAs(libraryPresetAnswer, {
      id: p.id,
      name: p.name,
      tags: p.tags,
      notes: p.notes,
      latestVersion: p.versions[0]?.version ?? null,
      publishedAt: p.published_at.toISOString(),
      versions: p.versions.map((x) => ({ ...x, createdAt: x.createdAt.toISOString(), url: `/api/presets/${p.id}/versions/${x.version}` })),
      builds,
    });
  });
}
