// The time-by-pixel picture of one channel's look in one preset of a build's current config:
// the demonstration sequence, one row per frame at 60 fps, base on the left. Used by the Looks
// page and by scripts; the ETag follows the config version so browsers revalidate cheaply.
import { requireViewer } from "~/lib/auth/auth.server";
import { loadBuildFor } from "~/lib/auth/build-access.server";
import type { Config } from "~/lib/config/schema";
import { lookTimePng } from "~/lib/effects/png.server";
import { apiAnswer, fail } from "~/lib/web/http.server";
import type { Route } from "./+types/api.builds.$buildId.looks-png";

function listIds(items: readonly { id: string }[]): string {
  return items.length ? items.map((i) => i.id).join(", ") : "none";
}

export function loader({ request, params }: Route.LoaderArgs) {
  return apiAnswer(async () => {
    const v = await requireViewer(request, "view:builds");
    const b = await loadBuildFor(v, params.buildId);
    const config = b.config as Config;
    const url = new URL(request.url);
    const presetId = url.searchParams.get("preset");
    const channelId = url.searchParams.get("channel");
    if (!presetId) fail(400, `Say which preset: add ?preset=<preset id> (this build has: ${listIds(config.presets)}).`);
    if (!channelId) fail(400, `Say which channel: add &channel=<channel id> (this build has: ${listIds(config.rig.channels)}).`);
    if (!config.presets.some((p) => p.id === presetId)) fail(400, `This build has no preset "${presetId}" (it has: ${listIds(config.presets)}).`);
    if (!config.rig.channels.some((c) => c.id === channelId)) fail(400, `This build's rig has no channel "${channelId}" (it has: ${listIds(config.rig.channels)}).`);

    const etag = `"v${b.config_version}-${presetId}-${channelId}"`;
    const headers = { "Content-Type": "image/png", "Cache-Control": "private, no-cache", ETag: etag };
    if (request.headers.get("If-None-Match") === etag) return new Response(null, { status: 304, headers });
    const png = lookTimePng(config, presetId, channelId);
    return new Response(new Uint8Array(png), { headers: { ...headers, "Content-Length": String(png.byteLength) } });
  });
}
