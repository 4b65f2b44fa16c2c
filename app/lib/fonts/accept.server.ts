// Accepting a received upload as a font's files: every WAV must read cleanly (a file that is not
// a WAV, is cut off or lies about its size refuses the whole upload), the files go to storage by
// content hash, and then one transaction records them and saves the build's config through the
// checked save path, so the font entry says what arrived. All or nothing: a refusal or a failed
// save leaves the build as it was (bytes already in storage are content-addressed and untouched).
import { createReadStream } from "node:fs";
import type { Kysely } from "kysely";
import { storeCheckedConfigIn } from "../checks/save.server";
import type { Config } from "../config/schema";
import { upgradeStored } from "../config/upgrade";
import type { Database } from "../db/types";
import type { FileStorage } from "../storage/types";
import { compileLayout, type FontLayout } from "./layout";
import { fontReport, type FontReport } from "./report";
import type { StagedFile } from "./stage.server";
import { UploadRefused } from "./zip.server";

export type AcceptInput = {
  workshopId: string;
  buildId: string;
  fontId: string;
  userId: string | null;
  layout: FontLayout;
  files: StagedFile[];
  ignored: string[];
};

export type Accepted = { report: FontReport & { ignored: string[] }; configVersion: number; uploadId: string };

/** The file-level problems that refuse an upload, one line per file. */
export function refusals(files: StagedFile[]): string[] {
  const out: string[] = [];
  for (const f of files) for (const x of f.wav.findings) if (x.severity === "error") out.push(`${f.path}: ${x.message}`);
  return out;
}

/** The font entry after its files were checked. */
export function withFontReport(config: Config, fontId: string, report: FontReport): Config {
  const next = structuredClone(config);
  const font = next.fonts.find((f) => f.id === fontId);
  if (!font) throw new UploadRefused("This build has no font with that id.", 404);
  font.status = report.status;
  font.cues = report.present;
  if (report.igniteMs !== null) font.igniteMs = Math.round(report.igniteMs);
  else delete font.igniteMs;
  if (report.retractMs !== null) font.retractMs = Math.round(report.retractMs);
  else delete font.retractMs;
  return next;
}

export async function acceptUpload(db: Kysely<Database>, storage: FileStorage, input: AcceptInput): Promise<Accepted> {
  const problems = refusals(input.files);
  if (problems.length > 0) {
    const more = problems.length > 8 ? ` (and ${problems.length - 8} more)` : "";
    throw new UploadRefused(`${problems.length} file${problems.length === 1 ? " was" : "s were"} refused, so nothing was stored: ${problems.slice(0, 8).join(" · ")}${more}`, 422);
  }
  const report = fontReport(
    input.files.map((f) => ({ path: f.path, size: f.size, wav: f.wav })),
    compileLayout(input.layout),
  );

  const stored = new Map<string, { key: string; size: number }>();
  for (const f of input.files) {
    if (stored.has(f.sha256)) continue;
    const s = await storage.put(createReadStream(f.tmp));
    if (s.sha256 !== f.sha256) throw new Error(`storage answered a different hash for ${f.path}`);
    stored.set(f.sha256, s);
  }

  return db.transaction().execute(async (trx) => {
    const build = await trx.selectFrom("builds").select(["config", "config_version"]).where("id", "=", input.buildId).where("workshop_id", "=", input.workshopId).forUpdate().executeTakeFirst();
    if (!build) throw new UploadRefused("No build with this id in your workshop.", 404);
    const config = withFontReport(upgradeStored(build.config), input.fontId, report);
    for (const [sha256, s] of stored)
      await trx.insertInto("stored_files").values({ sha256, size: s.size, storage: storage.kind, key: s.key }).onConflict((oc) => oc.column("sha256").doNothing()).execute();
    const full = { ...report, ignored: input.ignored };
    const upload = await trx
      .insertInto("font_uploads")
      .values({ build_id: input.buildId, font_id: input.fontId, layout_name: input.layout.name, status: report.status, report: JSON.stringify(full), uploaded_by: input.userId })
      .returning("id")
      .executeTakeFirstOrThrow();
    const rows = input.files.map((f) => {
      const row = report.files.find((r) => r.path === f.path)!;
      return { upload_id: upload.id, path: f.path, sha256: f.sha256, size: f.size, cue: row.cue, duration_ms: f.wav.durationMs };
    });
    for (let i = 0; i < rows.length; i += 500) await trx.insertInto("font_files").values(rows.slice(i, i + 500)).execute();
    const saved = await storeCheckedConfigIn(trx, input.workshopId, input.buildId, config, build.config_version, { acceptErrors: ["font-invalid"] });
    if (saved.kind === "stale") throw new UploadRefused(saved.message, 409);
    if (saved.kind === "invalid") {
      const first = saved.diagnostics.find((d) => d.severity === "error");
      throw new UploadRefused(`The build's config could not take this font: ${saved.message}${first ? ` First: ${first.message}` : ""}`, 422);
    }
    await trx.updateTable("font_uploads").set({ revision: saved.version }).where("id", "=", upload.id).execute();
    return { report: full, configVersion: saved.version, uploadId: upload.id };
  });
}
