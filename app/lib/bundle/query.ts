// What a bundle request asks for (`?revision=&template=&names=&card=&check=`), read for the API
// and the Bundle page alike. Pure: a value, or a message for a 400.
import { z } from "zod";
import { readRevisionNumber, type Read } from "../revisions/params";
import type { NameMode } from "./names";

/** Card sizes offered on the Bundle page, in decimal GB as cards are sold; the API takes any size up to 2 TB. */
export const CARD_SIZES = [1, 2, 4, 8, 16, 32, 64, 128, 256] as const;

export type BundleQuery = { revision: number | null; template: string | null; templateVersion: number | null; mode: NameMode; cardGb: number; check: boolean };

const schema = z.object({
  template: z.string().trim().min(1).max(100).optional().meta({ description: "A template id or built-in name; the build's pinned template when absent." }),
  version: z.coerce
    .number({ message: "version is a template version number, e.g. 2" })
    .int("version is a whole number")
    .min(1, "version is at least 1")
    .max(2147483647, "version is too large")
    .optional()
    .meta({ description: "The template's version (of `template`, else of the revision's own template); its newest (or, for the build's own template, its pinned) version when absent. A release's download names it, so the released bytes come back after the template is edited." }),
  names: z.enum(["long", "8.3"], { message: "names is long or 8.3" }).default("long").meta({ description: "Long FAT32 names, or 8.3 names for boards that read only those." }),
  card: z.coerce
    .number({ message: "card is the card's size in GB, e.g. 32" })
    .positive("card is the card's size in GB, e.g. 32")
    .max(2048, "card is at most 2048 GB")
    .default(32)
    .meta({ description: "The card's size in decimal GB, as cards are sold; a bundle that does not fit is refused." }),
  check: z.enum(["1"]).optional().meta({ description: "1: answer the plan (files, sizes, SHA-256, findings) as JSON instead of the zip." }),
});

/** The query as the API document shows it: the schema above, and the revision (read by readRevisionNumber). */
export const bundleQuerySchema = schema.extend({
  revision: z.string().regex(/^[1-9][0-9]*$/).optional().meta({ description: "A revision number of this build; today's config (the newest revision) when absent." }),
});

export function readBundleQuery(params: URLSearchParams): Read<BundleQuery> {
  const raw = Object.fromEntries([...params.entries()].filter(([, v]) => v !== ""));
  let revision: number | null = null;
  if (raw.revision !== undefined) {
    const r = readRevisionNumber(raw.revision, "revision");
    if (!r.ok) return r;
    revision = r.value;
  }
  const { revision: _, ...rest } = raw;
  const parsed = schema.safeParse(rest);
  if (!parsed.success) return { ok: false, error: `Bad query: ${parsed.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`).join("; ")}` };
  const q = parsed.data;
  return { ok: true, value: { revision, template: q.template ?? null, templateVersion: q.version ?? null, mode: q.names, cardGb: q.card, check: q.check === "1" } };
}
