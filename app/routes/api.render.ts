// POST /api/render: a config (or a build's) through a template (a built-in, a workshop template
// version, or posted source). Answers the output as text/plain, or 422 with the errors.
import { requireViewer } from "~/lib/auth/auth.server";
import { loadBuildFor } from "~/lib/auth/build-access.server";
import { chooseTemplate, renderBuildOrSource, renderFailedMessage } from "~/lib/rendering/service.server";
import { readJsonBody } from "~/lib/web/body.server";
import { apiAnswer, fail, text } from "~/lib/web/http.server";
import { renderBodySchema, templateRefSchema } from "~/lib/rendering/request";
import type { Route } from "./+types/api.render";

/** Templates are tens of kilobytes and configs a few hundred; a render request stays under 1 MB. */
export const MAX_RENDER_BYTES = 1024 * 1024;


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
    // The shared reader speaks of configs; a render body is mostly template text.
    const raw = await readJsonBody(request, MAX_RENDER_BYTES, "The request body is larger than 1 MB; a template or config that big is refused.");
    if (typeof raw !== "object" || raw === null || Array.isArray(raw)) fail(400, `The body must be a JSON object. ${USAGE}`);
    const hasConfig = Object.hasOwn(raw, "config");
    const hasBuild = Object.hasOwn(raw, "buildId");
    if (hasConfig === hasBuild) fail(400, `Give exactly one of "config" and "buildId". ${USAGE}`);
    const body = renderBodySchema.safeParse(raw);
    if (!body.success) fail(400, `"buildId" must be a build id text. ${USAGE}`);
    const ref = templateRefSchema.safeParse(body.data.template);
    if (!ref.success) fail(400, `"template" must be one of { "id", "version"? }, { "source" } or { "builtin" }. ${USAGE}`);
    const build = body.data.buildId !== undefined ? await loadBuildFor(v, body.data.buildId) : null;
    const t = await chooseTemplate(v, ref.data, build ?? undefined);
    const r = await renderBuildOrSource(v, build ? { build } : { config: body.data.config }, t);
    if (r.kind === "bad-config") fail(422, r.message, { errors: r.errors, total: r.total, kinds: r.kinds });
    if (r.kind === "failed") fail(422, renderFailedMessage(r.total), { errors: r.errors, total: r.total, kinds: r.kinds });
    return text(r.output, { headers: { "X-Template": `${t.name}@${t.version}` } });
  });
}
