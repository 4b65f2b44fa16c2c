// A library preset in the look editor, with the live preview, on a stand-in rig of one channel
// per role; the pixel counts are chosen on the page (?px.<role>=n), the looks scaled to them.
// Saving publishes a new version over the one opened (the "What changed" line is its changelog;
// 409 if another version was published meanwhile). Only the stand-in's one preset is published.
import { Form, Link } from "react-router";
import { ErrorPage } from "~/components/ErrorPage";
import { LookEditor, type SaveWith } from "~/components/looks/LookEditor";
import { requireViewer } from "~/lib/auth/auth.server";
import { can } from "~/lib/auth/permissions";
import { bodyFromBuildPreset } from "~/lib/library/adapt";
import { roleLabel, sortedRoles, type PresetBody } from "~/lib/library/format";
import { scaleLook } from "~/lib/library/scale";
import { STANDIN_PRESET_ID, standInConfig } from "~/lib/library/standin";
import { getLibraryPresetFor, getLibraryVersionFor, readBody } from "~/lib/library/service.server";
import { errorTitle } from "~/lib/web/errors";
import { fail } from "~/lib/web/http.server";
import type { Route } from "./+types/library.$presetId.edit";

export const meta: Route.MetaFunction = ({ data: d, error }) => [{ title: error ? errorTitle(error) : `Edit ${d?.name ?? "preset"} · Library · Hiltbench` }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const v = await requireViewer(request, "view:library");
  const p = await getLibraryPresetFor(v, params.presetId);
  if (!p || p.versions.length === 0) fail(404, "No library preset with this id in your workshop.");
  const latest = p.versions[0].version;
  const row = await getLibraryVersionFor(v, p.id, latest);
  if (!row) fail(404, "No library preset with this id in your workshop.");
  const body = readBody(row.body);
  const url = new URL(request.url);
  const pixels: Record<string, number> = {};
  for (const role of Object.keys(body.looks)) {
    const raw = url.searchParams.get(`px.${role}`);
    const n = raw === null ? body.looks[role].pixels : Number(raw);
    if (!Number.isInteger(n) || n < 1 || n > 2048) fail(400, `Pixels for the ${roleLabel(role)} are a whole number from 1 to 2048.`);
    pixels[role] = n;
  }
  const scaled: PresetBody = { ...body, looks: Object.fromEntries(Object.entries(body.looks).map(([r, l]) => [r, { pixels: pixels[r], layers: scaleLook({ layers: l.layers }, l.pixels, pixels[r]).layers }])) };
  return {
    id: p.id,
    name: p.name,
    tags: body.tags,
    notes: body.notes,
    latest,
    roles: sortedRoles(Object.keys(body.looks)).map((r) => ({ role: r, label: roleLabel(r), pixels: pixels[r], madeOn: body.looks[r].pixels })),
    config: standInConfig(scaled),
    canEdit: can(v.role, "publish:library"),
  };
}

export function ErrorBoundary({ error }: Route.ErrorBoundaryProps) {
  return <ErrorPage error={error} back={[{ to: "/library", label: "Back to the library" }]} />;
}

export default function EditLibraryPreset({ loaderData }: Route.ComponentProps) {
  const { id, name, tags, notes, latest, roles, config, canEdit } = loaderData;
  const saveWith: SaveWith = async (cfg, note, version) => {
    const made = bodyFromBuildPreset(cfg, STANDIN_PRESET_ID, { tags, notes });
    if (!made) return { ok: false, status: 400, error: "the stand-in preset is missing" };
    const res = await fetch(`/api/presets/${id}/versions`, {
      method: "POST",
      headers: { "Content-Type": "application/json", Accept: "application/json" },
      body: JSON.stringify({ baseVersion: version, changelog: note, preset: made.body }),
    });
    const b = (await res.json().catch(() => null)) as { version?: number; error?: string; diagnostics?: never } | null;
    if (res.status === 201 && typeof b?.version === "number") return { ok: true, version: b.version, text: `Published as version ${b.version}.` };
    return { ok: false, status: res.status, error: b?.error, diagnostics: b?.diagnostics };
  };
  return (
    <div className="space-y-4">
      <p>
        <Link to={`/library/${id}`}>← {name}</Link>
      </p>
      <h1>Edit {name}</h1>
      <p className="max-w-3xl text-sm text-iron-300">
        Editing version {latest} on a stand-in rig of one channel per role. Saving publishes a new version; write its changelog in "What changed".
      </p>
      <Form method="get" className="flex flex-wrap items-end gap-3" aria-label="Stand-in rig">
        {roles.map((r) => (
          <div key={r.role}>
            <label className="label" htmlFor={`px-${r.role}`}>
              Pixels, {r.label} (made on {r.madeOn})
            </label>
            <input id={`px-${r.role}`} name={`px.${r.role}`} type="number" min={1} max={2048} className="field w-40" defaultValue={r.pixels} />
          </div>
        ))}
        <button type="submit" className="btn">
          Change the stand-in rig
        </button>
      </Form>
      <LookEditor key={`${id}-${latest}-${roles.map((r) => r.pixels).join("-")}`} buildId="" initial={config} version={latest} canEdit={canEdit} saveWith={saveWith} onePreset />
    </div>
  );
}
