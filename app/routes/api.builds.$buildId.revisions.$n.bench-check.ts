// GET /api/builds/:buildId/revisions/:n/bench-check: the revision's bench check with its ticks.
// PUT { item, ticked }: tick or untick one item; answers the check as it now stands.
import { requireViewer } from "~/lib/auth/auth.server";
import { loadBuildFor } from "~/lib/auth/build-access.server";
import { benchCheckAnswer } from "~/lib/release/answers";
import { readTickInput } from "~/lib/release/requests";
import { benchCheckAnswerFor, setTickAnswerFor } from "~/lib/release/page.server";
import { readRevisionNumber } from "~/lib/revisions/params";
import { readJsonBody } from "~/lib/web/body.server";
import { apiAnswer, fail, jsonAs } from "~/lib/web/http.server";
import type { Route } from "./+types/api.builds.$buildId.revisions.$n.bench-check";

export function loader({ request, params }: Route.LoaderArgs) {
  return apiAnswer(async () => {
    const v = await requireViewer(request, "view:release");
    const b = await loadBuildFor(v, params.buildId);
    const n = readRevisionNumber(params.n, "n");
    if (!n.ok) fail(400, n.error);
    return jsonAs(benchCheckAnswer, await benchCheckAnswerFor(v, b, n.value));
  });
}

export function action({ request, params }: Route.ActionArgs) {
  return apiAnswer(async () => {
    const v = await requireViewer(request, "check:bench");
    if (request.method !== "PUT") fail(405, "Tick an item with PUT and a JSON body { item, ticked }.");
    const b = await loadBuildFor(v, params.buildId);
    const n = readRevisionNumber(params.n, "n");
    if (!n.ok) fail(400, n.error);
    const input = readTickInput(await readJsonBody(request, 16 * 1024, "The body is too large; a tick is an item key and true or false."));
    if (!input.ok) fail(400, input.error);
    return jsonAs(benchCheckAnswer, await setTickAnswerFor(v, b, n.value, input.value.item, input.value.ticked));
  });
}
