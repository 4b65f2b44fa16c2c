// A build's presets and looks: the look editor for builders and owners, the same screen
// read-only for reviewers and clients. Saving and checking go through the JSON API. Above it,
// the preset library: updates available, add from library, save to library (form actions).
import { data, useActionData } from "react-router";
import { LibraryPanel, type Answer } from "~/components/library/LibraryPanel";
import { LookEditor } from "~/components/looks/LookEditor";
import { requirePermission, requireViewer } from "~/lib/auth/auth.server";
import { loadBuildFor } from "~/lib/auth/build-access.server";
import type { Config } from "~/lib/config/schema";
import { can } from "~/lib/auth/permissions";
import { addForm, applyForm, choicesOf, fieldsOf, firstFormIssue, saveForm } from "~/lib/library/forms";
import { addFromLibraryFor, applyUpdateFor, libraryPanelFor, saveFromBuildFor, type Outcome } from "~/lib/library/service.server";
import { readFormLimited } from "~/lib/web/body.server";
import type { Route } from "./+types/builds.$buildId.looks";

export const meta: Route.MetaFunction = ({ matches }) => {
  const build = (matches.find((m) => m?.id === "routes/builds.$buildId")?.data as { build?: { name?: string } } | undefined)?.build;
  return [{ title: `Looks · ${build?.name ?? "Build"} · Hiltbench` }];
};

export async function loader({ request, params }: Route.LoaderArgs) {
  const v = await requireViewer(request, "view:builds");
  const b = await loadBuildFor(v, params.buildId);
  const library = can(v.role, "view:library") ? await libraryPanelFor(v, b) : null;
  return {
    buildId: b.id,
    config: b.config as Config,
    version: b.config_version,
    canEdit: can(v.role, "edit:build"),
    released: b.status === "released",
    library,
    canApply: can(v.role, "apply:library") && can(v.role, "edit:build") && b.status !== "released",
    canPublish: can(v.role, "publish:library"),
  };
}

const answer = (intent: string, r: Outcome, ok: (body: Record<string, unknown>) => string) => {
  const body = r.body as Record<string, unknown>;
  if (r.status >= 400) return data<Answer>({ intent, error: String(body.error), diagnostics: (body.diagnostics as { path: string; message: string }[] | undefined)?.slice(0, 10) }, { status: r.status });
  const notes = (body.notes as { text: string }[] | undefined)?.map((n) => n.text);
  return data<Answer>({ intent, ok: ok(body), notes });
};

export async function action({ request, params }: Route.ActionArgs) {
  const v = await requireViewer(request, "view:builds");
  const form = await readFormLimited(request, 256 * 1024, "The form is too large.");
  const intent = String(form.get("intent") ?? "");
  if (intent === "add-from-library" || intent === "apply-update") requirePermission(v, "apply:library");
  else if (intent === "save-to-library") requirePermission(v, "publish:library");
  else return data<Answer>({ error: "Unknown action on the Looks page." }, { status: 400 });
  requirePermission(v, "edit:build");
  const b = await loadBuildFor(v, params.buildId);
  if (intent === "add-from-library") {
    const p = addForm.safeParse(fieldsOf(form, ["choice", "fontId", "configVersion"]));
    if (!p.success) return data<Answer>({ intent, error: firstFormIssue(p.error) }, { status: 400 });
    const r = await addFromLibraryFor(v, { buildId: b.id, ...p.data.choice, fontId: p.data.fontId, configVersion: p.data.configVersion });
    return answer(intent, r, (x) => `Added from the library as a new preset (saved as revision ${x.version}).`);
  }
  if (intent === "apply-update") {
    const p = applyForm.safeParse(fieldsOf(form, ["presetId", "configVersion"]));
    if (!p.success) return data<Answer>({ intent, error: firstFormIssue(p.error) }, { status: 400 });
    const r = await applyUpdateFor(v, { buildId: b.id, presetId: p.data.presetId, configVersion: p.data.configVersion, choices: choicesOf(form) });
    return answer(intent, r, (x) => `Updated to library version ${x.libraryVersion} (saved as revision ${x.version}).`);
  }
  const p = saveForm.safeParse(fieldsOf(form, ["presetId", "libraryPresetId", "baseVersion", "name", "tags", "changelog"]));
  if (!p.success) return data<Answer>({ intent, error: firstFormIssue(p.error) }, { status: 400 });
  const d = p.data;
  const r = await saveFromBuildFor(v, { buildId: b.id, presetId: d.presetId, name: d.name, tags: d.tags, changelog: d.changelog, libraryPresetId: d.libraryPresetId, baseVersion: d.libraryPresetId ? d.baseVersion : null });
  return answer(intent, r, (x) => `Published to the library as version ${x.version}.`);
}

export default function LooksPage({ loaderData }: Route.ComponentProps) {
  const { buildId, config, version, canEdit, library, canApply, canPublish } = loaderData;
  const result = useActionData<typeof action>() as Answer;
  // A new version (another tab saved, or a reload) starts the editor afresh.
  // The editor first (its pictures load lazily, as they scroll into view); the library below it.
  return (
    <div className="space-y-6">
      <LookEditor key={`${buildId}-${version}`} buildId={buildId} initial={config} version={version} canEdit={canEdit} />
      {library ? (
        <LibraryPanel
          version={version}
          presets={config.presets.map((p) => ({ id: p.id, name: p.name }))}
          fonts={config.fonts.map((f) => ({ id: f.id, name: f.name }))}
          origins={library.origins}
          updates={library.updates}
          library={library.library}
          canApply={canApply}
          canPublish={canPublish}
          answer={result}
        />
      ) : null}
    </div>
  );
}
