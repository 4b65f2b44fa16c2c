// GET /api/builds/:buildId/render?template=<id or built-in name>[&version=n][&download=1]: the
// build's current config rendered as text (its pinned template when none is named);
// `&revision=n` renders that saved revision instead (staff and reviewers).
import { requireViewer } from "~/lib/auth/auth.server";
import { loadBuildFor } from "~/lib/auth/build-access.server";
import { downloadName } from "~/lib/rendering/render";
import { chooseTemplateForBuild, renderBuildOrSource, renderFailedMessage, resolveTemplate } from "~/lib/rendering/service.server";
import { can } from "~/lib/auth/permissions";
import { renderRevision, revisionOf, templateForRevision } from "~/lib/revisions/compare.server";
import { readRevisionNumber } from "~/lib/revisions/params";
import { apiAnswer, fail, text } from "~/lib/web/http.server";
import { INT4_MAX, int4From } from "~/lib/input/edges";
import type { Route } from "./+types/api.builds.$buildId.render";

export function loader({ request, params }: Route.LoaderArgs) {
  return apiAnswer(async () => {
    const v = await requireViewer(request, "view:builds");
    const b = await loadBuildFor(v, params.buildId);
    const url = new URL(request.url);
    const versionText = url.searchParams.get("version");
    const version = versionText === null ? undefined : (int4From(versionText, 1) ?? fail(400, `'version' must be a whole number from 1 to ${INT4_MAX}.`));
    const revisionText = url.searchParams.get("revision");
    if (revisionText !== null) {
      // One saved revision, printing its own number and save time: always the same bytes.
      if (!can(v.role, "view:revisions")) fail(403, `Your role (${v.role}) does not see revisions.`);
      const n = readRevisionNumber(revisionText, "revision");
      if (!n.ok) fail(400, n.error);
      const rev = await revisionOf(v, b, n.value);
      const ref = url.searchParams.get("template");
      const rt = ref ? await resolveTemplate(v, ref, version) : await templateForRevision(v, rev, null);
      const out = await renderRevision(v, b, rev, rt);
      return text(out.output, { headers: { "X-Template": `${rt.name}@${rt.version}` } });
    }
    const t = await chooseTemplateForBuild(v, b, url.searchParams.get("template"), version);
    const r = await renderBuildOrSource(v, { build: b }, t);
    if (r.kind === "failed") fail(422, renderFailedMessage(r.total), { errors: r.errors, total: r.total, kinds: r.kinds });
    const headers = new Headers({ "X-Template": `${t.name}@${t.version}` });
    if (url.searchParams.get("download")) headers.set("Content-Disposition", `attachment; filename="${downloadName(b.name, t.name, r.target)}"`);
    return text(r.output, { headers });
  });
}

export function action({ request }: Route.ActionArgs) {
  return apiAnswer(async () => {
    await requireViewer(request, "view:builds");
    fail(405, "Read a render with GET; POST /api/render renders posted configs or templates.");
  });
}
