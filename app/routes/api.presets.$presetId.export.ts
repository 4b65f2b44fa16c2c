// GET /api/presets/:presetId/export[?version=n]: the preset as a "hiltbench.preset/1" file (all
// versions, or one), offered as a download.
import { requireViewer } from "~/lib/auth/auth.server";
import { exportFor } from "~/lib/library/exchange.server";
import { presetDocumentSchema } from "~/lib/library/exchange";
import { versionParam } from "~/lib/library/requests";
import { apiAnswer, fail, jsonAs } from "~/lib/web/http.server";
import type { Route } from "./+types/api.presets.$presetId.export";

export function loader({ request, params }: Route.LoaderArgs) {
  return apiAnswer(async () => {
    const v = await requireViewer(request, "view:library");
    const raw = new URL(request.url).searchParams.get("version");
    const version = raw === null ? undefined : versionParam(raw);
    if (version === null) fail(400, "?version= is a whole number from 1 (leave it out for every version).", { field: "version" });
    const doc = await exportFor(v, params.presetId, version);
    if (!doc) fail(404, "No such library preset (or version) in your workshop.");
    const file = `${doc.name.toLowerCase().replace(/[^a-z0-9]+/g, "-").replace(/^-|-$/g, "") || "preset"}${version ? `-v${version}` : ""}.preset.json`;
    return jsonAs(presetDocumentSchema, doc, { headers: { "Content-Disposition": `attachment; filename="${file}"` } });
  });
}
