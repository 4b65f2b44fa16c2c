// The wiring picture of a build's rig as an SVG file, for scripts, printing and the SD bundle.
// A rig the validator refuses answers 422 with a picture that says why.
import { requireViewer } from "~/lib/auth/auth.server";
import { loadBuildFor } from "~/lib/auth/build-access.server";
import { apiAnswer } from "~/lib/web/http.server";
import { drawWiring } from "~/lib/wiring";
import type { Route } from "./+types/api.builds.$buildId.wiring-svg";

export function loader({ request, params }: Route.LoaderArgs) {
  return apiAnswer(async () => {
    const v = await requireViewer(request, "view:builds");
    const b = await loadBuildFor(v, params.buildId);
    const etag = `"wiring-v${b.config_version}"`;
    const headers = { "Content-Type": "image/svg+xml; charset=utf-8", "Cache-Control": "private, no-cache", ETag: etag, "Content-Security-Policy": "default-src 'none'; style-src 'unsafe-inline'" };
    if (request.headers.get("If-None-Match") === etag) return new Response(null, { status: 304, headers });
    const picture = await drawWiring(b.config, `Wiring of ${b.name}`);
    return new Response(picture.svg, { status: picture.ok ? 200 : 422, headers });
  });
}
