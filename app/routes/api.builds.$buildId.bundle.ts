// GET /api/builds/:buildId/bundle?template=&names=long|8.3&card=32[&check=1]: the SD card zip,
// streamed (yazl, bounded memory), byte-identical for the same inputs. A name clash, a file over
// FAT32's limit or a card too small refuses the zip with the findings (422); `check=1` answers
// the plan (files, sizes, SHA-256, findings) as JSON instead of the zip.
import { Readable } from "node:stream";
import { requireViewer } from "~/lib/auth/auth.server";
import { loadBuildFor } from "~/lib/auth/build-access.server";
import { bundleQuerySchema } from "~/lib/bundle/query";
import { bundleFor } from "~/lib/bundle/service.server";
import { zipBundle } from "~/lib/bundle/zip.server";
import { storage } from "~/lib/storage/settings.server";
import { apiAnswer, fail, jsonAs } from "~/lib/web/http.server";
import { bundlePlanAnswer } from "~/lib/api-doc/shapes";
import type { Route } from "./+types/api.builds.$buildId.bundle";


export function loader({ request, params }: Route.LoaderArgs) {
  return apiAnswer(async () => {
    const v = await requireViewer(request, "view:builds");
    const b = await loadBuildFor(v, params.buildId);
    const parsed = bundleQuerySchema.safeParse(Object.fromEntries(new URL(request.url).searchParams));
    if (!parsed.success) fail(400, `Bad query: ${parsed.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`).join("; ")}`, { field: String(parsed.error.issues[0]?.path[0] ?? "") });
    const q = parsed.data;
    const plan = await bundleFor(v, b, { template: q.template ?? null, mode: q.names, cardGb: q.card });
    const files = plan.entries.map((e) => ({ path: e.path, size: e.size, sha256: e.sha256, stored: e.kind === "stored" }));
    const errors = plan.findings.filter((f) => f.severity === "error");
    if (q.check) return jsonAs(bundlePlanAnswer, { name: plan.name, totalBytes: plan.totalBytes, files, findings: plan.findings });
    if (errors.length) fail(422, `The card cannot be built: ${errors.map((e) => e.message).join(" ")}`, { findings: plan.findings });
    const body = zipBundle(plan, storage());
    return new Response(Readable.toWeb(body) as ReadableStream, {
      headers: { "Content-Type": "application/zip", "Content-Disposition": `attachment; filename="${plan.name}"`, "Cache-Control": "no-store" },
    });
  });
}
