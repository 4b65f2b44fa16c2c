// GET /api/builds/:buildId/bundle?revision=&template=&names=long|8.3&card=32[&check=1]: the SD
// card zip of a revision (today's config without one), streamed (yazl, bounded memory),
// byte-identical for the same inputs. A name clash, a file over FAT32's limit or a card too small
// refuses the zip with the findings (422); `check=1` answers the plan (files, sizes, SHA-256,
// findings) as JSON instead of the zip.
import { requireViewer } from "~/lib/auth/auth.server";
import { can } from "~/lib/auth/permissions";
import { loadBuildFor } from "~/lib/auth/build-access.server";
import { readBundleQuery } from "~/lib/bundle/query";
import { bundleFor, planAnswer } from "~/lib/bundle/service.server";
import { zipResponse } from "~/lib/bundle/zip.server";
import { storage } from "~/lib/storage/settings.server";
import { bundlePlanAnswer } from "~/lib/api-doc/shapes";
import { apiAnswer, fail, jsonAs } from "~/lib/web/http.server";
import type { Route } from "./+types/api.builds.$buildId.bundle";

export function loader({ request, params }: Route.LoaderArgs) {
  return apiAnswer(async () => {
    const v = await requireViewer(request, "view:builds");
    if (!can(v.role, "make:bundle")) fail(403, "Clients download the released card of their build: GET /api/builds/{buildId}/release-bundle.");
    const b = await loadBuildFor(v, params.buildId);
    const q = readBundleQuery(new URL(request.url).searchParams);
    if (!q.ok) fail(400, q.error);
    const plan = await bundleFor(v, b, q.value);
    if (q.value.check) return jsonAs(bundlePlanAnswer, planAnswer(plan));
    const errors = plan.findings.filter((f) => f.severity === "error");
    if (errors.length) fail(422, `The card cannot be built: ${errors.map((e) => e.message).join(" ")}`, { findings: plan.findings });
    return zipResponse(plan, storage(), plan.name, {
      "X-Bundle-Revision": String(plan.revision),
      // The files' bytes: the zip is about this size (text is deflated, each entry adds a header).
      "X-Bundle-Content-Bytes": String(plan.totalBytes),
    });
  });
}
