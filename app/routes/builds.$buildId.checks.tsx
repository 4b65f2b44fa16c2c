// A build's checks: the validator's diagnostics over the stored config, grouped by severity and
// linked to where each value is edited; the power summary with its cautions; and importing or
// exporting the whole config as JSON.
import { data, Form, useNavigation } from "react-router";
import { DiagnosticList, type LinkedDiagnostic } from "~/components/checks/DiagnosticList";
import { PowerCard } from "~/components/checks/PowerCard";
import { SafetyCautions } from "~/components/SafetyCautions";
import { MessageField } from "~/components/revisions/MessageField";
import { requireViewer } from "~/lib/auth/auth.server";
import { MAX_CONFIG_BYTES } from "~/lib/web/body.server";
import { loadBuildFor } from "~/lib/auth/build-access.server";
import { storeCheckedConfig } from "~/lib/checks/save.server";
import { readConfigUpload } from "~/lib/forms/config-upload.server";
import { diagnosticHref } from "~/lib/config/links";
import { powerModeFor } from "~/lib/checks/power-mode";
import { validateConfig, type Diagnostic } from "~/lib/checks/validate";
import { can } from "~/lib/auth/permissions";
import { failureOf } from "~/lib/web/http.server";
import type { Route } from "./+types/builds.$buildId.checks";

export const meta: Route.MetaFunction = ({ matches }) => {
  const build = (matches.find((m) => m?.id === "routes/builds.$buildId")?.data as { build?: { name?: string } } | undefined)?.build;
  return [{ title: `Checks · ${build?.name ?? "Build"} · Hiltbench` }];
};

export async function loader({ request, params }: Route.LoaderArgs) {
  const v = await requireViewer(request, "view:builds");
  const b = await loadBuildFor(v, params.buildId);
  const mode = powerModeFor(b.config);
  const { config, diagnostics, power } = validateConfig(b.config, { power: mode });
  const linked: LinkedDiagnostic[] = diagnostics.map((d) => ({ ...d, href: diagnosticHref(b.id, d.path, b.config) }));
  const rig = config?.rig.power;
  return {
    buildId: b.id,
    buildName: b.name,
    version: b.config_version,
    canEdit: can(v.role, "edit:build"),
    maxImportMb: MAX_CONFIG_BYTES / (1024 * 1024),
    diagnostics: linked,
    power,
    powerSource: mode,
    presetNames: Object.fromEntries((config?.presets ?? []).map((p) => [p.id, p.name])),
    rig: rig ? { brightnessCap: rig.brightnessCap, cellCapacityMah: rig.cellCapacityMah, cellNominalVolts: rig.cellNominalVolts, wireGaugeAwg: rig.wireGaugeAwg, wireLengthMm: rig.wireLengthMm } : null,
  };
}

type ImportAnswer = { ok: boolean; message: string; problems: Diagnostic[]; warnings: Diagnostic[] };

export async function action({ request, params }: Route.ActionArgs) {
  const v = await requireViewer(request, "edit:build");
  const b = await loadBuildFor(v, params.buildId);
  const answer = (status: number, a: ImportAnswer, headers?: HeadersInit) => data(a, { status, headers });
  try {
    const upload = await readConfigUpload(request);
    const r = await storeCheckedConfig(v, b.id, upload.input, upload.version, { message: upload.message });
    if (r.kind === "invalid") return answer(422, { ok: false, message: `"${upload.fileName}" was not imported: ${r.message}`, problems: r.diagnostics, warnings: [] });
    if (r.kind === "stale") return answer(409, { ok: false, message: r.message, problems: [], warnings: [] });
    const warnings = r.diagnostics.filter((d) => d.severity !== "info");
    return answer(200, { ok: true, message: `Imported "${upload.fileName}" as version ${r.version}.`, problems: [], warnings });
  } catch (e) {
    // A refused upload is shown beside the form, not as an error page.
    const f = failureOf(e);
    if (f) return answer(f.status, { ok: false, message: f.message, problems: [], warnings: [] }, f.headers);
    throw e;
  }
}

export default function ChecksPage({ loaderData, actionData }: Route.ComponentProps) {
  const { buildId, buildName, version, canEdit, maxImportMb, diagnostics, power, powerSource, presetNames, rig } = loaderData;
  const busy = useNavigation().state === "submitting";
  const errors = diagnostics.filter((d) => d.severity === "error").length;
  const warnings = diagnostics.filter((d) => d.severity === "warning").length;
  return (
    <div className="space-y-6">
      <p className="text-sm text-iron-300" data-testid="checks-summary">
        Version {version}: {errors === 0 ? "no errors" : `${errors} error${errors === 1 ? "" : "s"}`}, {warnings === 0 ? "no warnings" : `${warnings} warning${warnings === 1 ? "" : "s"}`}.
      </p>
      <DiagnosticList diagnostics={diagnostics} />
      {power && rig ? <PowerCard power={power} source={powerSource} presetNames={presetNames} rig={rig} /> : <p className="card text-sm text-iron-300">No power figures: the config's structure has to be fixed first.</p>}
      <SafetyCautions />
      <section className="card space-y-3" aria-labelledby="import-export-heading">
        <h2 id="import-export-heading" className="text-lg">
          Import / export
        </h2>
        <p className="text-sm text-iron-300">
          Export the config as a <code>hiltbench.config/2</code> JSON file, edit or keep it, and import it back (an older <code>hiltbench.config/1</code> file is
          read too: its layers get ids). An import replaces the whole config; it is checked first, and a file with errors changes nothing.
        </p>
        <a className="btn" href={`/builds/${buildId}/config.json`} download>
          Export {buildName} as JSON
        </a>
        {canEdit ? (
          <Form method="post" encType="multipart/form-data" className="flex flex-wrap items-end gap-3" aria-label="Import a config">
            <input type="hidden" name="version" value={version} />
            <div>
              <label className="label" htmlFor="import-file">
                Config file <span className="normal-case text-iron-400">(JSON, up to {maxImportMb} MB)</span>
              </label>
              <input id="import-file" name="file" type="file" accept="application/json,.json" required className="field" />
            </div>
            <MessageField id="import-message" className="min-w-64 flex-1" />
            <button type="submit" className="btn btn-primary" disabled={busy}>
              {busy ? "Importing…" : "Import"}
            </button>
          </Form>
        ) : (
          <p className="text-sm text-iron-400">Your role can export the config but not import one.</p>
        )}
        {actionData ? (
          <div role={actionData.ok ? "status" : "alert"} data-testid="import-result" className="space-y-3">
            <p className={actionData.ok ? "text-signal-ok" : "text-signal-error"}>{actionData.message}</p>
            {actionData.problems.length > 0 ? <DiagnosticList diagnostics={actionData.problems} idPrefix="import-problems" headingLevel={3} /> : null}
            {actionData.warnings.length > 0 ? (
              <p className="text-sm text-signal-warning">
                Stored with {actionData.warnings.length} warning{actionData.warnings.length === 1 ? "" : "s"}; they are listed above.
              </p>
            ) : null}
          </div>
        ) : null}
      </section>
    </div>
  );
}
