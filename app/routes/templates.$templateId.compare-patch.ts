// GET /templates/:templateId/compare.patch?compare=2..3: the line changes between two versions
// of a workshop template as a unified diff file, the same diff the template page shows.
import { requireViewer } from "~/lib/auth/auth.server";
import { db } from "~/lib/db/db.server";
import { fail } from "~/lib/web/http.server";
import { getTemplate, getTemplateVersion } from "~/lib/repo/templates.server";
import { diffVersions, parseCompare, patchFileName } from "~/lib/rendering/version-diff";
import { isBuiltinName } from "~/lib/rendering/render";
import type { Route } from "./+types/templates.$templateId.compare-patch";

/** Failures as plain text with their status: this address is followed by a download link. */
async function asText(run: () => Promise<Response>): Promise<Response> {
  try {
    return await run();
  } catch (e) {
    if (e instanceof Response) return e;
    const d = e as { type?: string; data?: { message?: string }; init?: ResponseInit | null };
    if (d?.type !== "DataWithResponseInit") throw e;
    return new Response(`${d.data?.message ?? "Request failed"}\n`, { status: d.init?.status ?? 500, headers: { "Content-Type": "text/plain; charset=utf-8", "Cache-Control": "no-store" } });
  }
}

export async function loader({ request, params }: Route.LoaderArgs) {
  return asText(async () => {
    const v = await requireViewer(request, "view:templates");
    if (isBuiltinName(params.templateId)) fail(400, "Built-in templates have a single version; there is nothing to compare.");
    const t = await getTemplate(db(), v.workshop.id, params.templateId);
    if (!t) fail(404, "No template with this id in your workshop.");
    const asked = new URL(request.url).searchParams.get("compare") ?? "";
    const pair = parseCompare(asked);
    if (!pair) fail(400, `'compare' must be two version numbers like 1..2, not '${asked.slice(0, 40)}'.`);
    const [a, b] = await Promise.all(pair.map((n) => getTemplateVersion(db(), v.workshop.id, t.id, n)));
    const latest = await getTemplateVersion(db(), v.workshop.id, t.id);
    const absent = pair.filter((_, i) => ![a, b][i]);
    if (absent.length) fail(404, `This template has no version ${absent[0]}; its versions are 1 to ${latest?.version ?? 1}.`);
    const d = diffVersions(t.name, a!, b!);
    if (d.kind === "too-large") fail(422, `These versions differ in more than ${d.limit} lines (or took too long to compare); no patch was made.`);
    return new Response(d.patch, {
      headers: {
        "Content-Type": "text/x-diff; charset=utf-8",
        "Content-Disposition": `attachment; filename="${patchFileName(t.name, a!.version, b!.version)}"`,
        "Cache-Control": "no-store",
      },
    });
  });
}
