// GET /api/builds/:buildId/preset-updates: the build's presets that came from an older library
// version, each with the library's changes in words and the collisions with local edits.
// POST { presetId, configVersion, choices? } applies the newest version (a normal config save);
// every collision needs a choice ("mine" or "theirs") by its path, else 409 listing them.
import { requireViewer } from "~/lib/auth/auth.server";
import { loadBuildFor } from "~/lib/auth/build-access.server";
import { presetUpdatedAnswer, presetUpdatesAnswer } from "~/lib/api-doc/shapes";
import { applyUpdateFor, refused, updatesForBuild } from "~/lib/library/service.server";
import { applyBody, firstIssue } from "~/lib/library/requests";
import { readJsonBody } from "~/lib/web/body.server";
import { apiAnswer, fail, jsonAs, refusalAnswer } from "~/lib/web/http.server";
import type { Route } from "./+types/api.builds.$buildId.preset-updates";

export function loader({ request, params }: Route.LoaderArgs) {
  return apiAnswer(async () => {
    const v = await requireViewer(request, "view:library");
    const b = await loadBuildFor(v, params.buildId);
    const { updates } = await updatesForBuild(v, b);
    return jsonAs(presetUpdatesAnswer, { updates: updates.map((u) => ({ ...u, changes: u.changes.map((c) => c.text), notes: u.notes.map((n) => n.text) })) });
  });
}

export function action({ request, params }: Route.ActionArgs) {
  return apiAnswer(async () => {
    const v = await requireViewer(request, "apply:library");
    if (request.method !== "POST") fail(405, "Apply an update with POST.");
    const b = await loadBuildFor(v, params.buildId);
    const parsed = applyBody.safeParse(await readJsonBody(request, 256 * 1024));
    if (!parsed.success) fail(400, firstIssue(parsed.error));
    const r = await applyUpdateFor(v, { buildId: b.id, presetId: parsed.data.presetId, configVersion: parsed.data.configVersion, choices: parsed.data.choices ?? {} });
    if (refused(r)) return refusalAnswer(r);
    return jsonAs(presetUpdatedAnswer, r.body, { status: r.status });
  });
}
