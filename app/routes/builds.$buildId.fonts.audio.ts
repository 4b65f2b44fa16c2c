// GET /builds/:buildId/fonts/audio/:sha256: one of the build's font files, for the browser's
// audio preview, with HTTP Range support so players can seek. Only a viewer who may open the
// build gets it, and only files some upload of this build holds.
import { Readable } from "node:stream";
import { requireViewer } from "~/lib/auth/auth.server";
import { loadBuildFor } from "~/lib/auth/build-access.server";
import { parseRange } from "~/lib/fonts/range";
import { fail } from "~/lib/web/http.server";
import { fontFileOfBuild } from "~/lib/fonts/service.server";
import { storage } from "~/lib/storage/settings.server";
import type { Route } from "./+types/builds.$buildId.fonts.audio";

export async function loader({ request, params }: Route.LoaderArgs) {
  const v = await requireViewer(request, "view:builds");
  const b = await loadBuildFor(v, params.buildId);
  const file = await fontFileOfBuild(b.id, params.sha256);
  if (!file) fail(404, "This build has no font file with that checksum.");
  const range = parseRange(request.headers.get("range"), file.size);
  const headers = new Headers({ "Content-Type": "audio/wav", "Accept-Ranges": "bytes", "Cache-Control": "private, max-age=3600", ETag: `"${file.sha256}"` });
  if (range.kind === "unsatisfiable") {
    headers.set("Content-Range", `bytes */${file.size}`);
    return new Response(null, { status: 416, headers });
  }
  const part = range.kind === "part" ? { start: range.start, end: range.end } : undefined;
  const body = await storage().get(file.key, part);
  headers.set("Content-Length", String(part ? part.end - part.start + 1 : file.size));
  if (part) headers.set("Content-Range", `bytes ${part.start}-${part.end}/${file.size}`);
  return new Response(Readable.toWeb(body) as ReadableStream, { status: part ? 206 : 200, headers });
}
