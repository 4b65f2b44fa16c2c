// POST /api/validate: the validator over a posted config, for scripts (bearer token) and the
// app's own editors (session). A config with errors is still a 200: the diagnostics are the answer.
import { readJsonBody, requireField } from "~/lib/web/body.server";
import { powerModeFor } from "~/lib/checks/power-mode";
import { validateConfig } from "~/lib/checks/validate";
import { requireViewer } from "~/lib/auth/auth.server";
import { apiAnswer, fail, jsonAs } from "~/lib/web/http.server";
import { validateAnswer } from "~/lib/api-doc/shapes";
import type { Route } from "./+types/api.validate";

export function loader({ request }: Route.LoaderArgs) {
  return apiAnswer(async () => {
    await requireViewer(request, "use:api");
    fail(405, 'Send the config with POST, as a JSON body { "config": ... }.');
  });
}

export function action({ request }: Route.ActionArgs) {
  return apiAnswer(async () => {
    await requireViewer(request, "use:api");
    if (request.method !== "POST") fail(405, 'Send the config with POST, as a JSON body { "config": ... }.');
    const config = requireField(await readJsonBody(request), "config");
    const powerMode = powerModeFor(config);
    const { diagnostics, power } = validateConfig(config, { power: powerMode });
    return jsonAs(validateAnswer, { diagnostics, power, powerSource: power ? powerMode : null });
  });
}
