// GET /api/builds/:buildId/config answers the stored config and its version; PUT replaces it
// after validation, only from the version it was read at. Nothing is stored on any failure.
import { readJsonBody, requireField } from "~/lib/web/body.server";
import { loadBuildFor } from "~/lib/auth/build-access.server";
import { requireViewer } from "~/lib/auth/auth.server";
import { storeCheckedConfig } from "~/lib/checks/save.server";
import { apiAnswer, fail, json } from "~/lib/web/http.server";
import { INT4_MAX, isInt4 } from "~/lib/input/edges";
import type { Route } from "./+types/api.builds.$buildId.config";

export function loader({ request, params }: Route.LoaderArgs) {
  return apiAnswer(async () => {
    const v = await requireViewer(request, "view:builds");
    const b = await loadBuildFor(v, params.buildId);
    return json({ config: b.config, version: b.config_version });
  });
}

export function action({ request, params }: Route.ActionArgs) {
  return apiAnswer(async () => {
    const v = await requireViewer(request, "edit:build");
    if (request.method !== "PUT") fail(405, 'Replace the config with PUT and a JSON body { "config": ..., "version": n }.');
    const b = await loadBuildFor(v, params.buildId);
    const body = await readJsonBody(request);
    const config = requireField(body, "config");
    const version = requireField(body, "version");
    if (!isInt4(version)) fail(400, `"version" must be the whole number config version the config was read at (GET answers it), from 0 to ${INT4_MAX}.`);
    const r = await storeCheckedConfig(v, b.id, config, version);
    if (r.kind === "invalid") return json({ error: r.message, diagnostics: r.diagnostics }, { status: 422 });
    if (r.kind === "stale") return json({ error: r.message, currentVersion: r.currentVersion }, { status: 409 });
    return json({ version: r.version, diagnostics: r.diagnostics });
  });
}
