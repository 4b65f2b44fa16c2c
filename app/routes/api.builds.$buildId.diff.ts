// GET /api/builds/:buildId/diff?from=a&to=b&template=: two revisions compared, the model diff in
// words and the text diff of their rendered output, as JSON; with `Accept: text/x-diff` the
// unified diff alone, which `patch` applies to the `from` render. `from` after `to` answers
// the reverse diff.
import { requireViewer } from "~/lib/auth/auth.server";
import { loadBuildFor } from "~/lib/auth/build-access.server";
import { compareFromUrl } from "~/lib/revisions/compare.server";
import { apiAnswer, fail, jsonAs } from "~/lib/web/http.server";
import { diffAnswer } from "~/lib/api-doc/shapes";
import type { Route } from "./+types/api.builds.$buildId.diff";

export function loader({ request, params }: Route.LoaderArgs) {
  return apiAnswer(async () => {
    const v = await requireViewer(request, "view:revisions");
    const b = await loadBuildFor(v, params.buildId);
    const c = await compareFromUrl(v, b, new URL(request.url));
    if ((request.headers.get("Accept") ?? "").toLowerCase().includes("text/x-diff")) {
      if (c.text.kind === "too-large") fail(422, `The rendered outputs differ in more than ${c.text.limit} lines; compare nearer revisions.`);
      return new Response(c.text.patch, { headers: { "Content-Type": "text/x-diff; charset=utf-8", "Cache-Control": "no-store", "X-Template": `${c.template.name}@${c.template.version}` } });
    }
    return jsonAs(diffAnswer, c);
  });
}
