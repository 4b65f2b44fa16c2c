// "hiltbench.preset/1": a library preset as a file, to share between workshops. It holds the
// preset's name, tags and notes and one or more versions (number, changelog, time, body). An
// import is validated like a config import: the format string first (a newer or unknown form is
// refused by name), then the shape (capped: versions, bytes, depth), then every version's body
// through the validator on the stand-in rig. Nothing is stored unless all of it passes.
import { z } from "zod";
import type { Diagnostic } from "../checks/diagnostics";
import { structureDiagnostics } from "../checks/structure";
import { textSchema } from "../config/schema";
import { checkBody } from "./check";
import { presetBodySchema, type PresetBody } from "./format";

export const PRESET_FORMAT = "hiltbench.preset/1" as const;
export const MAX_PRESET_DOCUMENT_BYTES = 1024 * 1024;
export const MAX_IMPORT_VERSIONS = 50;

/** A preset file; POST /api/presets imports one and GET /api/presets/:id/export answers one. */
export const presetDocumentSchema = z.strictObject({
  format: z.literal(PRESET_FORMAT),
  name: textSchema().trim().min(1).max(60),
  tags: presetBodySchema.shape.tags,
  notes: presetBodySchema.shape.notes,
  versions: z
    .array(
      z.strictObject({
        version: z.number().int().min(1).max(1_000_000),
        changelog: textSchema().max(200),
        publishedAt: z.string().max(40).optional(),
        preset: z.unknown(),
      }),
    )
    .min(1, "a preset file holds at least one version")
    .max(MAX_IMPORT_VERSIONS, `a preset file holds at most ${MAX_IMPORT_VERSIONS} versions`),
});

export type PresetDocument = z.infer<typeof presetDocumentSchema>;
export type ExportVersion = { version: number; changelog: string; createdAt: Date; body: unknown };

/** The document for some versions of a preset (oldest first). */
export function exportDocument(p: { name: string; tags: string[]; notes: string }, versions: ExportVersion[]): PresetDocument {
  return {
    format: PRESET_FORMAT,
    name: p.name,
    tags: p.tags,
    notes: p.notes,
    versions: [...versions].sort((a, b) => a.version - b.version).map((v) => ({ version: v.version, changelog: v.changelog, publishedAt: v.createdAt.toISOString(), preset: v.body })),
  };
}

/** Does the body claim to be a preset file (any "hiltbench.preset/…" format)? */
export function isPresetDocument(input: unknown): boolean {
  return typeof input === "object" && input !== null && typeof (input as { format?: unknown }).format === "string" && (input as { format: string }).format.startsWith("hiltbench.preset/");
}

export type ImportCheck =
  | { ok: true; name: string; tags: string[]; notes: string; versions: { changelog: string; body: PresetBody; counts: { errors: number; warnings: number } }[] }
  | { ok: false; message: string; diagnostics: Diagnostic[] };

export function checkImport(input: unknown): ImportCheck {
  const format = (input as { format?: unknown } | null)?.format;
  if (format !== PRESET_FORMAT)
    return { ok: false, message: `This file's format is ${JSON.stringify(format)}; this Hiltbench reads "${PRESET_FORMAT}" preset files. Export it again from a Hiltbench that writes that form.`, diagnostics: [] };
  const parsed = presetDocumentSchema.safeParse(input);
  if (!parsed.success) return { ok: false, message: "The preset file does not have the expected shape; nothing was imported.", diagnostics: structureDiagnostics(parsed.error.issues, input) };
  const doc = parsed.data;
  const numbers = doc.versions.map((v) => v.version);
  if (new Set(numbers).size !== numbers.length) return { ok: false, message: "The preset file numbers two versions the same; nothing was imported.", diagnostics: [] };
  const versions: Extract<ImportCheck, { ok: true }>["versions"] = [];
  for (const v of [...doc.versions].sort((a, b) => a.version - b.version)) {
    const c = checkBody(v.preset);
    if (!c.body) {
      const prefixed = c.diagnostics.map((d) => ({ ...d, path: `versions[v${v.version}].${d.path}` }));
      return { ok: false, message: `Version ${v.version} in the file has errors; nothing was imported.`, diagnostics: prefixed };
    }
    versions.push({ changelog: v.changelog.trim() || `Imported version ${v.version}`, body: c.body, counts: c.counts });
  }
  return { ok: true, name: doc.name, tags: doc.tags, notes: doc.notes, versions };
}
