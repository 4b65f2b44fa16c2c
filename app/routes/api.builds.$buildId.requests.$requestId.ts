// PUT /api/builds/:buildId/requests/:requestId { status, reply?, version }: the workshop answers a
// client request (in hand, done, declined with a reason); 409 when someone answered since.
import { requireViewer } from "~/lib/auth/auth.server";
import { loadBuildFor } from "~/lib/auth/build-access.server";
import { clientRequestAnsweredAnswer } from "~/lib/api-doc/shapes";
import { answerBody, firstProblem, MAX_REQUEST_BODY_BYTES } from "~/lib/requests/rules";
import { answerRequestFor, refused } from "~/lib/requests/service.server";
import { readJsonBody } from "~/lib/web/body.server";
import { apiAnswer, fail, jsonAs, refusalAnswer } from "~/lib/web/http.server";
import type { Route } from "./+types/api.builds.$buildId.requests.$requestId";

export function action({ request, params }: Route.ActionArgs) {
  return apiAnswer(async () => {
    if (request.method !== "PUT") fail(405, "Answer a request with PUT.");
    const v = await requireViewer(request, "answer:request");
    const b = await loadBuildFor(v, params.buildId);
    const parsed = answerBody.safeParse(await readJsonBody(request, MAX_REQUEST_BODY_BYTES, "The answer is larger than 16 KB; a reply is at most 2,000 characters."));
    if (!parsed.success) fail(400, firstProblem(parsed.error));
    const r = await answerRequestFor(v, b, params.requestId, parsed.data);
    if (refused(r)) return refusalAnswer(r);
    return jsonAs(clientRequestAnsweredAnswer, r.body);
  });
}
