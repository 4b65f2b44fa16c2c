// GET /api/builds/:buildId/config answers the stored config and its version; PUT replaces it
// after validation, only from the version it was read at, with an optional "message" (what
// changed); its answer names the new revision. Nothing is stored on any failure.
import { readJsonBody, requireField } from "~/lib/web/body.server";
import { loadBuildFor } from "~/lib/auth/build-access.server";
import { requireViewer } from "~/lib/auth/auth.server";
import { storeCheckedConfig } from "~/lib/checks/save.server";
import { apiAnswer, fail, jsonAs } from "~/lib/web/http.server";
import { configAnswer, configSavedAnswer } from "~/lib/api-doc/shapes";
import { INT4_MAX, isInt4 } from "~/lib/input/edges";
import { getRevisionFor } from "~/lib/revisions/compare.server";
import { readMessage } from "~/lib/forms/revision-message";
import type { Route } from "./+types/api.builds.$buildId.config";

export function loader({ request, params }: Route.LoaderArgs) {
  return apiAnswer(async () => {
    const v = await requireViewer(request, "view:builds");
    const b = await loadBuildFor(v, params.buildId);
    return jsonAs(configAnswer, { config: b.config, version: b.config_version });
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
    const note = readMessage(body && typeof body === "object" ? (body as { message?: unknown }).message : undefined);
    if (!note.ok) fail(400, note.error);
    const r = await storeCheckedConfig(v, b.id, config, version, { message: note.message });
    if (r.kind === "invalid") fail(422, r.message, { diagnostics: r.diagnostics });
    if (r.kind === "stale") fail(409, r.message, { currentVersion: r.currentVersion });
    const rev = await getRevisionFor(v, b.id, r.version);
    return jsonAs(configSavedAnswer, {
      version: r.version,
      revision: rev ? { number: rev.number, savedAt: rev.createdAt.toISOString(), message: rev.message, url: `/api/builds/${b.id}/revisions/${rev.number}` } : { number: r.version },
      diagnostics: r.diagnostics,
    });
  });
}
