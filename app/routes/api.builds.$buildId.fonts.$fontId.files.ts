// POST /api/builds/:buildId/fonts/:fontId/files: a multipart upload of WAV files and/or zips
// for one font of the build. Answers the font report, or a refusal with a specific message;
// a refused upload changes nothing.
import { requireViewer } from "~/lib/auth/auth.server";
import { loadBuildFor } from "~/lib/auth/build-access.server";
import { uploadFont } from "~/lib/fonts/service.server";
import { UploadRefused } from "~/lib/fonts/zip.server";
import { apiAnswer, fail, jsonAs } from "~/lib/web/http.server";
import { fontUploadAnswer } from "~/lib/api-doc/shapes";
import type { Route } from "./+types/api.builds.$buildId.fonts.$fontId.files";

export function action({ request, params }: Route.ActionArgs) {
  return apiAnswer(async () => {
    const v = await requireViewer(request, "upload:font");
    if (request.method !== "POST") fail(405, "Upload a font's files with POST and a multipart/form-data body.");
    const b = await loadBuildFor(v, params.buildId);
    if (!b.config.fonts.some((f) => f.id === params.fontId)) fail(404, `This build has no font "${params.fontId}". Add it on the Fonts tab first.`);
    try {
      const r = await uploadFont(v, b.id, params.fontId, request);
      return jsonAs(fontUploadAnswer, { status: r.report.status, configVersion: r.configVersion, report: r.report });
    } catch (e) {
      if (e instanceof UploadRefused) fail(e.status, e.message);
      throw e;
    }
  });
}
