// GET /api/builds/:buildId/requests: the build's client requests, newest first.
// POST /api/builds/:buildId/requests { kind, message }: the client asks (or the workshop logs a
// request for them); 201 with its id. A client reaches only their own build (loadBuildFor).
import { requireViewer } from "~/lib/auth/auth.server";
import { loadBuildFor } from "~/lib/auth/build-access.server";
import { clientRequestAskedAnswer, clientRequestListAnswer } from "~/lib/api-doc/shapes";
import { askBody, firstProblem, MAX_REQUEST_BODY_BYTES } from "~/lib/requests/rules";
import { askRequestFor, listRequestsFor, refused } from "~/lib/requests/service.server";
import { readJsonBody } from "~/lib/web/body.server";
import { apiAnswer, fail, jsonAs, refusalAnswer } from "~/lib/web/http.server";
import type { Route } from "./+types/api.builds.$buildId.requests";

export function loader({ request, params }: Route.LoaderArgs) {
  return apiAnswer(async () => {
    const v = await requireViewer(request, "view:requests");
    const b = await loadBuildFor(v, params.buildId);
    const rows = await listRequestsFor(v, b.id);
    return jsonAs(clientRequestListAnswer, {
      open: rows.filter((r) => r.open).length,
      requests: rows.map((r) => ({
        id: r.id,
        kind: r.kind,
        kindLabel: r.kindLabel,
        message: r.message,
        status: r.status,
        statusLabel: r.statusLabel,
        reply: r.reply,
        askedBy: r.askedByName,
        askedAt: r.askedAt.toISOString(),
        updatedAt: r.updatedAt.toISOString(),
        version: r.version,
      })),
    });
  });
}

export function action({ request, params }: Route.ActionArgs) {
  return apiAnswer(async () => {
    if (request.method !== "POST") fail(405, "Send a request with POST.");
    const v = await requireViewer(request, "ask:request");
    const b = await loadBuildFor(v, params.buildId);
    const parsed = askBody.safeParse(await readJsonBody(request, MAX_REQUEST_BODY_BYTES, "The request is larger than 16 KB; a message is at most 2,000 characters."));
    if (!parsed.success) fail(400, firstProblem(parsed.error));
    const r = await askRequestFor(v, b, parsed.data);
    if (refused(r)) return refusalAnswer(r);
    return jsonAs(clientRequestAskedAnswer, r.body, { status: 201 });
  });
}
