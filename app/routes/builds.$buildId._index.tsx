import { data, Form, Link, useActionData, useNavigation } from "react-router";
import { BuildMetaFields } from "~/components/BuildMetaFields";
import { requireViewer } from "~/lib/auth/auth.server";
import { loadBuildFor } from "~/lib/auth/build-access.server";
import { buildMetaSchema, STATUS_LABELS } from "~/lib/forms/build-forms";
import { fieldErrors } from "~/lib/forms/form-errors";
import { fail } from "~/lib/web/http.server";
import { can } from "~/lib/auth/permissions";
import { clientsOf, setArchivedFor, updateDetails } from "~/lib/builds/builds.server";
import { outdatedPresetsFor } from "~/lib/library/service.server";
import type { Route } from "./+types/builds.$buildId._index";

export async function loader({ request, params }: Route.LoaderArgs) {
  const v = await requireViewer(request, "view:builds");
  const b = await loadBuildFor(v, params.buildId);
  const canEdit = can(v.role, "edit:build");
  const cfg = b.config;
  return {
    build: {
      id: b.id,
      name: b.name,
      client_name: b.client_name,
      client_user_id: b.client_user_id,
      client_email: b.client_email,
      hilt_notes: b.hilt_notes,
      status: b.status,
      archived: b.archived_at !== null,
      updated_at: b.updated_at.toISOString(),
    },
    summary: {
      channels: cfg.rig.channels.map((c) => `${c.name} (${c.pixels} px${c.parallelStrips > 1 ? ` × ${c.parallelStrips}` : ""})`),
      presets: cfg.presets.map((p) => p.name),
      fonts: cfg.fonts.map((f) => ({ name: f.name, status: f.status, usedBy: cfg.presets.filter((p) => p.fontId === f.id).map((p) => p.name) })),
    },
    canEdit,
    outdated: can(v.role, "view:library") ? await outdatedPresetsFor(v, b) : [],
    canArchive: can(v.role, "archive:build"),
    clients: canEdit ? await clientsOf(v) : [],
  };
}

export async function action({ request, params }: Route.ActionArgs) {
  const form = await request.formData();
  const intent = form.get("intent");
  if (intent === "archive" || intent === "unarchive") {
    const v = await requireViewer(request, "archive:build");
    await loadBuildFor(v, params.buildId);
    await setArchivedFor(v, params.buildId, intent === "archive");
    return { ok: true as const, errors: undefined };
  }
  if (intent !== "save") fail(400, "Unknown action.");
  const v = await requireViewer(request, "edit:build");
  const current = await loadBuildFor(v, params.buildId);
  const parsed = buildMetaSchema.safeParse(Object.fromEntries(form));
  if (!parsed.success) return data({ ok: false as const, errors: fieldErrors(parsed.error) }, { status: 400 });
  const r = await updateDetails(v, current, parsed.data);
  if (!r.ok) return data({ ok: false as const, errors: r.errors }, { status: 400 });
  return { ok: true as const, errors: undefined };
}

export default function BuildOverview({ loaderData }: Route.ComponentProps) {
  const { build, summary, canEdit, canArchive, clients, outdated } = loaderData;
  const result = useActionData<typeof action>();
  const nav = useNavigation();
  return (
    <div className="grid gap-6 lg:grid-cols-[2fr_1fr]">
      <section className="card">
        <h2>Details</h2>
        {canEdit ? (
          <Form method="post" className="mt-4" key={build.updated_at}>
            <BuildMetaFields clients={clients} errors={result?.errors} values={build} />
            <div className="mt-4 flex items-center gap-3">
              <button type="submit" name="intent" value="save" className="btn btn-primary" disabled={nav.state !== "idle"}>
                Save details
              </button>
              {result?.ok ? <span className="text-sm text-signal-ok" role="status">Saved.</span> : null}
            </div>
          </Form>
        ) : (
          <dl className="mt-4 grid grid-cols-[10rem_1fr] gap-2 text-sm">
            <dt className="text-iron-400">Client</dt>
            <dd>{build.client_name || "—"}</dd>
            <dt className="text-iron-400">Status</dt>
            <dd>{STATUS_LABELS[build.status]}</dd>
            <dt className="text-iron-400">Hilt notes</dt>
            <dd className="whitespace-pre-wrap">{build.hilt_notes || "—"}</dd>
          </dl>
        )}
      </section>
      <aside className="space-y-4">
        {outdated.length ? (
          <section className="card border border-signal-warning text-sm" data-testid="overview-updates" aria-labelledby="updates-h">
            <h3 id="updates-h">Update available</h3>
            <ul className="mt-2 space-y-1">
              {outdated.map((o) => (
                <li key={o.presetName}>
                  {o.presetName}: {o.libraryName} v{o.from} → v{o.to}
                </li>
              ))}
            </ul>
            <Link to="looks" className="mt-2 inline-block">
              See the changes on Looks
            </Link>
          </section>
        ) : null}
        <section className="card text-sm">
          <h3>Channels</h3>
          <ul className="mt-2 list-inside list-disc text-iron-300">{summary.channels.map((c) => <li key={c}>{c}</li>)}</ul>
          <h3 className="mt-4">Presets</h3>
          <ol className="mt-2 list-inside list-decimal text-iron-300">{summary.presets.map((p) => <li key={p}>{p}</li>)}</ol>
          <h3 className="mt-4">
            <Link to="fonts">Fonts</Link>
          </h3>
          <ul className="mt-2 space-y-1 text-iron-300" aria-label="Font arrival">
            {summary.fonts.map((f) => (
              <li key={f.name} data-testid={`arrival-${f.name}`}>
                {f.name}{" "}
                <span className={f.status === "received" ? "text-signal-ok" : f.status === "invalid" ? "text-signal-error" : "text-signal-warning"}>
                  {f.status === "received" ? "arrived" : f.status === "invalid" ? "arrived broken" : "promised, still to come"}
                </span>
                {f.status !== "received" && f.usedBy.length ? <span className="block text-xs text-iron-400">used by {f.usedBy.join(", ")}</span> : null}
              </li>
            ))}
          </ul>
        </section>
        {canArchive ? (
          <Form method="post" className="card">
            <h3>{build.archived ? "Archived" : "Archive"}</h3>
            <p className="mt-1 text-sm text-iron-400">
              {build.archived ? "This build is hidden from the main list." : "Hide a finished or abandoned build from the main list. Nothing is deleted."}
            </p>
            <button className="btn mt-3" type="submit" name="intent" value={build.archived ? "unarchive" : "archive"}>
              {build.archived ? "Restore to the list" : "Archive build"}
            </button>
          </Form>
        ) : null}
      </aside>
    </div>
  );
}
