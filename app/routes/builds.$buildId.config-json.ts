// GET /builds/:buildId/config.json: the stored config as a file named after the build, for
// keeping, editing by hand or importing into another build.
import { requireViewer } from "~/lib/auth/auth.server";
import { loadBuildFor } from "~/lib/auth/build-access.server";
import type { Route } from "./+types/builds.$buildId.config-json";

/** A file name from the build's name: letters, digits and dashes, never empty. */
function exportFileName(buildName: string): string {
  const slug = buildName
    .normalize("NFKD")
    .replace(/[\u0300-\u036f]/g, "")
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, "-")
    .replace(/^-+|-+$/g, "")
    .slice(0, 60);
  return `${slug || "build"}.hiltbench.json`;
}

export async function loader({ request, params }: Route.LoaderArgs) {
  const v = await requireViewer(request, "view:builds");
  const b = await loadBuildFor(v, params.buildId);
  return new Response(JSON.stringify(b.config, null, 2) + "\n", {
    headers: {
      "Content-Type": "application/json; charset=utf-8",
      "Content-Disposition": `attachment; filename="${exportFileName(b.name)}"`,
      "Cache-Control": "no-store",
      "X-Config-Version": String(b.config_version),
    },
  });
}
