// POST /api/presets/:presetId/rollout { apply }: the newest version for every build using the
// preset. apply false is the dry run (which builds merge cleanly, which need hands); apply true
// saves the clean ones. Released builds are never changed. The owner's.
import { requireViewer } from "~/lib/auth/auth.server";
import { rolloutAnswer } from "~/lib/api-doc/shapes";
import { refused, rollOutFor } from "~/lib/library/service.server";
import { firstIssue, rolloutBody } from "~/lib/library/requests";
import { readJsonBody } from "~/lib/web/body.server";
import { apiAnswer, fail, jsonAs, refusalAnswer } from "~/lib/web/http.server";
import type { Route } from "./+types/api.presets.$presetId.rollout";

export function action({ request, params }: Route.ActionArgs) {
  return apiAnswer(async () => {
    const v = await requireViewer(request, "apply:library-all");
    if (request.method !== "POST") fail(405, "Send POST with { apply: false } for the dry run, { apply: true } to apply.");
    const parsed = rolloutBody.safeParse(await readJsonBody(request, 4096));
    if (!parsed.success) fail(400, firstIssue(parsed.error));
    const r = await rollOutFor(v, params.presetId, parsed.data.apply);
    if (refused(r)) return refusalAnswer(r);
    return jsonAs(rolloutAnswer, r.body, { status: r.status });
  });
}
