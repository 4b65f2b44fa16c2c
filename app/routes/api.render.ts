// POST /api/render: a config (or a build's) through a template (a built-in, a workshop template
// version, or posted source). Answers the output as text/plain, or 422 with the errors.
import { z } from "zod";
import { requireViewer } from "~/lib/auth/auth.server";
import { readJsonBody } from "~/lib/web/body.server";
import { loadBuildFor } from "~/lib/auth/build-access.server";
import { validateConfig } from "~/lib/checks/validate";
import { apiAnswer, fail, json } from "~/lib/web/http.server";
import { renderOffThread } from "~/lib/rendering/pool.server";
import { BUILTIN_VERSION, metaForBuild } from "~/lib/rendering/render";
import { API_LIMITS, apiErrors, partialsFor, resolveTemplate, type ResolvedTemplate } from "~/lib/rendering/service.server";
import type { Route } from "./+types/api.render";

/** Templates are tens of kilobytes and configs a few hundred; a render request stays under 1 MB. */
export const MAX_RENDER_BYTES = 1024 * 1024;

const Body = z.union([
  z.object({ config: z.unknown(), buildId: z.undefined().optional(), template: z.unknown() }),
  z.object({ buildId: z.string(), config: z.undefined().optional(), template: z.unknown() }),
]);
const TemplateRef = z.union([
  z.object({ id: z.string().min(1), version: z.number().int().min(1).optional() }).strict(),
  z.object({ source: z.string() }).strict(),
  z.object({ builtin: z.string() }).strict(),
]);

const USAGE = 'Send JSON { "config": {...} | "buildId": "...", "template": { "id": "...", "version": n } | { "source": "..." } | { "builtin": "generic-header" } }.';

export function loader({ request }: Route.LoaderArgs) {
  return apiAnswer(async () => {
    await requireViewer(request, "use:api");
    fail(405, `Render with POST. ${USAGE}`);
  });
}

export function action({ request }: Route.ActionArgs) {
  return apiAnswer(async () => {
    const v = await requireViewer(request, "use:api");
    if (request.method !== "POST") fail(405, `Render with POST. ${USAGE}`);
    const raw = await readJsonBody(request, MAX_RENDER_BYTES).catch((e) => {
      // The shared reader speaks of configs; a render body is mostly template text.
      if (typeof e === "object" && e && (e as { init?: { status?: number } }).init?.status === 413)
        fail(413, `The request body is larger than 1 MB; a template or config that big is refused.`);
      throw e;
    });
    if (typeof raw !== "object" || raw === null || Array.isArray(raw)) fail(400, `The body must be a JSON object. ${USAGE}`);
    const hasConfig = Object.hasOwn(raw, "config");
    const hasBuild = Object.hasOwn(raw, "buildId");
    if (hasConfig === hasBuild) fail(400, `Give exactly one of "config" and "buildId". ${USAGE}`);
    const body = Body.safeParse(raw);
    if (!body.success) fail(400, `"buildId" must be a build id text. ${USAGE}`);
    const ref = TemplateRef.safeParse(body.data.template);
    if (!ref.success) fail(400, `"template" must be one of { "id", "version"? }, { "source" } or { "builtin" }. ${USAGE}`);

    let t: ResolvedTemplate;
    if ("source" in ref.data) t = { kind: "source", id: null, name: "posted", version: BUILTIN_VERSION, source: ref.data.source };
    else if ("builtin" in ref.data) {
      if (!["generic-header", "readable-copy", "config-json"].includes(ref.data.builtin)) fail(404, `No built-in template '${ref.data.builtin.slice(0, 80)}'.`);
      t = await resolveTemplate(v, ref.data.builtin);
    } else t = await resolveTemplate(v, ref.data.id, ref.data.version);

    let build: { name: string; client_name: string; config_saved_at: Date; config_version?: number };
    let config: unknown;
    if (body.data.buildId !== undefined) {
      const b = await loadBuildFor(v, body.data.buildId);
      build = b;
      config = b.config;
    } else {
      const checked = validateConfig(body.data.config);
      if (!checked.config) {
        // The same 422 shape as a template error; `path` names the config field.
        const errors = checked.diagnostics
          .filter((d) => d.severity === "error")
          .map((d) => ({ stage: "config" as const, message: d.message, line: null, column: null, path: d.path }));
        return json({ error: "The config does not have the model's shape; fix it before rendering.", errors }, { status: 422 });
      }
      config = checked.config;
      build = { name: "Posted config", client_name: "", config_saved_at: new Date(0) };
    }
    const partials = (await partialsFor(v, t)).sources;
    const r = await renderOffThread(t.source, config as never, metaForBuild(build, t), { partials, limits: API_LIMITS });
    if (!r.ok) return json({ errors: apiErrors(r, API_LIMITS) }, { status: 422 });
    return new Response(r.output, { headers: { "Content-Type": "text/plain; charset=utf-8", "Cache-Control": "no-store", "X-Template": `${t.name}@${t.version}` } });
  });
}
