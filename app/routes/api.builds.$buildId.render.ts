// GET /api/builds/:buildId/render?template=<id or built-in name>[&version=n][&download=1]: the
// build's current config rendered as text (its pinned template when none is named).
import { requireViewer } from "~/lib/auth/auth.server";
import { loadBuildFor } from "~/lib/auth/build-access.server";
import { apiAnswer, fail, json } from "~/lib/web/http.server";
import { downloadName } from "~/lib/rendering/render";
import { API_LIMITS, apiErrors, pinnedTemplate, renderBuildWith, resolveTemplate } from "~/lib/rendering/service.server";
import type { Route } from "./+types/api.builds.$buildId.render";

export function loader({ request, params }: Route.LoaderArgs) {
  return apiAnswer(async () => {
    const v = await requireViewer(request, "view:builds");
    const b = await loadBuildFor(v, params.buildId);
    const url = new URL(request.url);
    const ref = url.searchParams.get("template");
    const versionText = url.searchParams.get("version");
    let version: number | undefined;
    if (versionText !== null) {
      version = Number(versionText);
      if (!Number.isInteger(version) || version < 1) fail(400, "'version' must be a whole number from 1.");
    }
    let t;
    if (!ref) t = await pinnedTemplate(v, b);
    else if (version === undefined && ref === b.pinned_template_id) t = await resolveTemplate(v, ref, b.pinned_template_version ?? undefined);
    else t = await resolveTemplate(v, ref, version);
    const r = await renderBuildWith(v, b, t, API_LIMITS);
    if (!r.ok) return json({ errors: apiErrors(r, API_LIMITS) }, { status: 422 });
    const headers = new Headers({ "Content-Type": "text/plain; charset=utf-8", "Cache-Control": "no-store", "X-Template": `${t.name}@${t.version}` });
    if (url.searchParams.get("download")) headers.set("Content-Disposition", `attachment; filename="${downloadName(b.name, t.name, r.target)}"`);
    return new Response(r.output, { headers });
  });
}

export function action({ request }: Route.ActionArgs) {
  return apiAnswer(async () => {
    await requireViewer(request, "view:builds");
    fail(405, "Read a render with GET; POST /api/render renders posted configs or templates.");
  });
}
