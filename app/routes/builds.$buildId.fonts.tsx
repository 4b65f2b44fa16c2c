// The Fonts tab: every font the build names, whether it was promised, arrived or arrived
// broken, an upload per font (files or zips, with progress), its report and a player per file.
// Adding a promised font and a workshop font layout are small forms here too.
import { data, Form, useActionData, useRevalidator } from "react-router";
import { z } from "zod";
import { FontReportView, type ReportFile } from "~/components/fonts/FontReportView";
import { FontUpload } from "~/components/fonts/FontUpload";
import { requireViewer } from "~/lib/auth/auth.server";
import { loadBuildFor } from "~/lib/auth/build-access.server";
import { storeCheckedConfig } from "~/lib/checks/save.server";
import { parseLayoutText } from "~/lib/fonts/layout";
import type { FontReport } from "~/lib/fonts/report";
import { fontUploadsOf, layoutsFor, saveWorkshopLayout } from "~/lib/fonts/service.server";
import { fail } from "~/lib/web/http.server";
import { can } from "~/lib/auth/permissions";
import type { Route } from "./+types/builds.$buildId.fonts";

export const meta: Route.MetaFunction = () => [{ title: "Fonts · Hiltbench" }];

const ARRIVAL = { promised: "Promised", received: "Arrived", invalid: "Arrived broken" } as const;

export async function loader({ request, params }: Route.LoaderArgs) {
  const v = await requireViewer(request, "view:builds");
  const b = await loadBuildFor(v, params.buildId);
  const uploads = await fontUploadsOf(b.id);
  const fonts = await Promise.all(
    b.config.fonts.map(async (f) => {
      const found = uploads.find((u) => u.upload.font_id === f.id);
      const up = found?.upload;
      let files: ReportFile[] = [];
      if (found && up) {
        const rows = found.files;
        const report = up.report as FontReport;
        files = rows.map((r) => {
          const info = report.files.find((x) => x.path === r.path);
          return { path: r.path, sha256: r.sha256, size: r.size, cue: r.cue, durationMs: r.duration_ms, format: info?.format ?? "", peakDbfs: info?.peakDbfs ?? null, clippedSamples: info?.clippedSamples ?? 0 };
        });
      }
      return {
        id: f.id,
        name: f.name,
        folder: f.folder,
        status: f.status,
        cues: f.cues,
        upload: up ? { at: up.created_at.toISOString(), by: up.uploaded_by, report: up.report as FontReport & { ignored?: string[] }, files } : null,
      };
    }),
  );
  return {
    buildId: b.id,
    fonts,
    layouts: (await layoutsFor(v.workshop.id)).map((l) => l.name),
    canUpload: can(v.role, "upload:font"),
    canEdit: can(v.role, "edit:build"),
  };
}

const addFontSchema = z.object({ name: z.string().trim().min(1, "Give the font a name.").max(60, "At most 60 characters.") });
const layoutSchema = z.object({ name: z.string().trim().min(1, "Give the layout a name.").max(60), rules: z.string().max(20000) });

function slug(name: string) {
  return (
    name
      .toLowerCase()
      .normalize("NFKD")
      .replace(/[^a-z0-9]+/g, "-")
      .replace(/^-+|-+$/g, "")
      .slice(0, 40) || "font"
  );
}

export async function action({ request, params }: Route.ActionArgs) {
  const form = await request.formData();
  const intent = form.get("intent");
  if (intent === "add-font") {
    const v = await requireViewer(request, "edit:build");
    const b = await loadBuildFor(v, params.buildId);
    const parsed = addFontSchema.safeParse({ name: form.get("name") });
    if (!parsed.success) return data({ intent, error: parsed.error.issues[0].message }, { status: 400 });
    const config = structuredClone(b.config);
    if (config.fonts.some((f) => f.name.toLowerCase() === parsed.data.name.toLowerCase())) return data({ intent, error: `The build already has a font named “${parsed.data.name}”.` }, { status: 400 });
    let id = slug(parsed.data.name);
    for (let n = 2; config.fonts.some((f) => f.id === id || f.folder.toLowerCase() === id); n++) id = `${slug(parsed.data.name)}-${n}`;
    config.fonts.push({ id, name: parsed.data.name, folder: id, status: "promised", cues: [] });
    const r = await storeCheckedConfig(v, b.id, config, b.config_version);
    if (r.kind !== "saved") return data({ intent, error: r.message }, { status: r.kind === "stale" ? 409 : 422 });
    return { intent, error: null };
  }
  if (intent === "save-layout") {
    const v = await requireViewer(request, "upload:font");
    await loadBuildFor(v, params.buildId);
    const parsed = layoutSchema.safeParse({ name: form.get("name"), rules: form.get("rules") });
    if (!parsed.success) return data({ intent, error: parsed.error.issues[0].message }, { status: 400 });
    if (parsed.data.name.toLowerCase() === "hiltbench default") return data({ intent, error: "That name belongs to the built-in layout; choose another." }, { status: 400 });
    const layout = parseLayoutText(parsed.data.name, parsed.data.rules);
    if (!layout.ok) return data({ intent, error: layout.errors.join(" ") }, { status: 400 });
    await saveWorkshopLayout(v, layout.layout);
    return { intent, error: null };
  }
  fail(400, "Unknown action.");
}

export default function Fonts({ loaderData }: Route.ComponentProps) {
  const { buildId, fonts, layouts, canUpload, canEdit } = loaderData;
  const result = useActionData<typeof action>();
  const revalidator = useRevalidator();
  const counts = { promised: 0, received: 0, invalid: 0 };
  for (const f of fonts) counts[f.status]++;
  return (
    <div className="space-y-5">
      <p className="text-sm text-iron-300" data-testid="arrival-summary">
        {counts.received} arrived · {counts.promised} promised · {counts.invalid} arrived broken
      </p>
      {fonts.map((f) => (
        <section key={f.id} className="card" aria-labelledby={`font-${f.id}`} data-testid={`font-${f.id}`}>
          <div className="flex flex-wrap items-baseline gap-3">
            <h2 id={`font-${f.id}`}>{f.name}</h2>
            <span className={`rounded px-2 py-0.5 text-xs ${f.status === "received" ? "bg-soot-600 text-signal-ok" : f.status === "invalid" ? "bg-soot-800 text-signal-error" : "bg-soot-800 text-signal-warning"}`}>
              {ARRIVAL[f.status]}
            </span>
            <span className="text-xs text-iron-400">
              card folder <code>{f.folder}</code>
            </span>
            {f.upload ? (
              <span className="text-xs text-iron-400">
                uploaded {new Date(f.upload.at).toISOString().slice(0, 16).replace("T", " ")} UTC{f.upload.by ? ` by ${f.upload.by}` : ""}
              </span>
            ) : null}
          </div>
          {f.upload ? <FontReportView buildId={buildId} report={f.upload.report} files={f.upload.files} /> : <p className="mt-2 text-sm text-iron-400">No files yet.</p>}
          {canUpload ? (
            <div className="mt-4">
              <FontUpload buildId={buildId} fontId={f.id} fontName={f.name} layouts={layouts} onDone={() => revalidator.revalidate()} />
            </div>
          ) : null}
        </section>
      ))}
      {canEdit ? (
        <Form method="post" className="card flex flex-wrap items-end gap-3">
          <label className="block">
            <span className="label">A font the client promised</span>
            <input name="name" className="field" placeholder="e.g. Squall" required maxLength={60} />
          </label>
          <button className="btn" type="submit" name="intent" value="add-font">
            Add font
          </button>
          {result?.intent === "add-font" && result.error ? (
            <p className="field-error w-full" role="alert">
              {result.error}
            </p>
          ) : null}
        </Form>
      ) : null}
      {canUpload ? (
        <details className="card text-sm">
          <summary className="cursor-pointer">Workshop font layouts</summary>
          <p className="mt-2 text-iron-400">
            The built-in layout reads the cue's name at the start of a file name, with an optional number (<code>hum.wav</code>, <code>clash-2.wav</code>, <code>swing_03.wav</code>), or any WAV in a folder named after the cue (
            <code>swing/low.wav</code>). Add your own as <code>cue: pattern</code> lines; <code>*</code> is any text, <code>{"{n}"}</code> an optional number; the first matching line wins.
          </p>
          <Form method="post" className="mt-3 space-y-2">
            <input name="name" className="field" placeholder="Layout name" aria-label="Layout name" required maxLength={60} />
            <textarea name="rules" className="field h-28 font-mono" aria-label="Layout rules" placeholder={"hum: sfx/loop{n}.wav\nclash: sfx/hit{n}.wav"} />
            <button className="btn" type="submit" name="intent" value="save-layout">
              Save layout
            </button>
            {result?.intent === "save-layout" ? (
              <p className={result.error ? "field-error" : "text-signal-ok"} role={result.error ? "alert" : "status"}>
                {result.error ?? "Saved."}
              </p>
            ) : null}
          </Form>
          <p className="mt-2 text-iron-400">Layouts: {layouts.join(", ")}</p>
        </details>
      ) : null}
    </div>
  );
}
