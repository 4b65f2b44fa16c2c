// GET /templates/:templateId/compare.patch?compare=2..3: the line changes between two versions
// of a workshop template as a unified diff file, the same diff the template page shows.
import { requireViewer } from "~/lib/auth/auth.server";
import { compareVersions, workshopTemplate } from "~/lib/rendering/library.server";
import { patchFileName } from "~/lib/rendering/version-diff";
import { fail, text, textAnswer } from "~/lib/web/http.server";
import type { Route } from "./+types/templates.$templateId.compare-patch";

// Failures answer as plain text with their status: this address is followed by a download link.
export async function loader({ request, params }: Route.LoaderArgs) {
  return textAnswer(async () => {
    const v = await requireViewer(request, "view:templates");
    const t = await workshopTemplate(v, params.templateId, 400, "Built-in templates have a single version; there is nothing to compare.");
    const c = await compareVersions(v, { ...t, kind: "workshop" }, new URL(request.url).searchParams.get("compare") ?? "");
    if (c.diff.kind === "too-large") fail(422, `These versions differ in more than ${c.diff.limit} lines (or took too long to compare); no patch was made.`);
    return text(c.diff.patch, { headers: { "Content-Type": "text/x-diff; charset=utf-8", "Content-Disposition": `attachment; filename="${patchFileName(t.name, c.from, c.to)}"` } });
  });
}
