// GET /api/presets/:presetId/versions/:v: one version (its preset body, changelog, author, time,
// counts) and its changes from the version before, in words. DELETE removes a version no build
// uses (409 naming the builds that use it; the only version left is never removed).
import { requireViewer, requirePermission } from "~/lib/auth/auth.server";
import { libraryVersionAnswer, libraryVersionDeletedAnswer } from "~/lib/api-doc/shapes";
import { compareVersionsFor, deleteVersionFor, getLibraryPresetFor, getLibraryVersionFor, readBody } from "~/lib/library/service.server";
import { versionParam } from "~/lib/library/requests";
import { apiAnswer, fail, jsonAs } from "~/lib/web/http.server";
import type { Route } from "./+types/api.presets.$presetId.versions.$v";

export function loader({ request, params }: Route.LoaderArgs) {
  return apiAnswer(async () => {
    const v = await requireViewer(request, "view:library");
    const n = versionParam(params.v);
    if (n === null) fail(400, "The version is a whole number from 1.");
    const row = await getLibraryVersionFor(v, params.presetId, n);
    if (!row) fail(404, "No such version of a library preset in your workshop.");
    const p = await getLibraryPresetFor(v, params.presetId);
    const previous = p?.versions.find((x) => x.version < n)?.version;
    const changes = previous ? await compareVersionsFor(v, params.presetId, previous, n) : null;
    return jsonAs(libraryVersionAnswer, { ...row, body: readBody(row.body), createdAt: row.createdAt.toISOString(), previousVersion: previous ?? null, changes: changes?.map((c) => c.text) ?? [] });
  });
}

export function action({ request, params }: Route.ActionArgs) {
  return apiAnswer(async () => {
    const v = await requireViewer(request, "view:library");
    if (request.method !== "DELETE") fail(405, "Versions are immutable; only DELETE (of a version no build uses) is allowed here.");
    requirePermission(v, "publish:library");
    const n = versionParam(params.v);
    if (n === null) fail(400, "The version is a whole number from 1.");
    const r = await deleteVersionFor(v, params.presetId, n);
    if (r.kind === "missing") fail(404, "No such version of a library preset in your workshop.");
    if (r.kind === "last") fail(409, "This is the preset's only version; it stays. Nothing was deleted.");
    if (r.kind === "in-use") {
      const names = [...new Set(r.builds.map((b) => b.buildName))];
      fail(409, `Version ${n} is used by ${names.join(", ")}; it stays. Update those builds first. Nothing was deleted.`, { builds: r.builds });
    }
    return jsonAs(libraryVersionDeletedAnswer, { deleted: n });
  });
}
