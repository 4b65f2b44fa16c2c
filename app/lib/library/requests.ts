// The library's request bodies and query strings, read at the edge: a failed parse names the
// field, and the route answers 400 with it (never a 500, never a partial change).
import { z } from "zod";
import { textSchema } from "../config/schema";
import { INT4_MAX } from "../input/edges";
import { tagSchema } from "./format";

const version = z.number().int().min(1).max(INT4_MAX);
const uuid = z.string().regex(/^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i, "a library preset id");
const changelog = textSchema().max(200);

export const publishBody = z.strictObject({ baseVersion: version, changelog, preset: z.unknown() });
export const createBody = z.strictObject({ changelog, preset: z.unknown() });
export const addBody = z.strictObject({
  libraryPresetId: uuid,
  version: version.optional(),
  fontId: z.string().max(48),
  configVersion: z.number().int().min(0).max(INT4_MAX),
  name: textSchema().trim().min(1).max(60).optional(),
});
export const applyBody = z.strictObject({
  presetId: z.string().max(48),
  configVersion: z.number().int().min(0).max(INT4_MAX),
  choices: z.record(z.string().max(2000), z.enum(["mine", "theirs"])).optional(),
});
export const rolloutBody = z.strictObject({ apply: z.boolean() });

/** The first issue of a failed parse, as one sentence naming the field. */
export function firstIssue(e: z.ZodError): string {
  const i = e.issues[0];
  const at = i.path.length ? `"${i.path.join(".")}"` : "The body";
  return `${at}: ${i.message}; nothing was changed.`;
}

/** ?q=&tag=&page=&perPage= with sane bounds; anything odd falls back to the default (the API document shows it). */
export const libraryListQuerySchema = z.object({
  q: z
    .string()
    .optional()
    .transform((s) => {
      const q = (s ?? "").trim().slice(0, 60);
      return q && !/[\u0000\uD800-\uDFFF]/.test(q) ? q : undefined;
    })
    .catch(undefined)
    .meta({ description: "Part of a preset's name (at most 60 characters are used)." }),
  tag: z
    .string()
    .optional()
    .transform((s) => {
      const t = (s ?? "").trim();
      return tagSchema.safeParse(t).success ? t : undefined;
    })
    .catch(undefined)
    .meta({ description: "Only presets with this tag." }),
  page: z.coerce.number().int().min(1).max(100000).catch(1).meta({ description: "The page, from 1." }),
  perPage: z.coerce.number().int().min(1).max(100).catch(20).meta({ description: "Presets per page, 1 to 100 (20)." }),
});

export type ListQuery = { q?: string; tag?: string; page: number; perPage: number };

export function parseListQuery(url: URL): ListQuery {
  return libraryListQuerySchema.parse(Object.fromEntries(url.searchParams));
}

/** A version number in a path: a whole number from 1. */
export function versionParam(s: string | undefined): number | null {
  if (!s || !/^[1-9][0-9]{0,9}$/.test(s)) return null;
  const n = Number(s);
  return n <= INT4_MAX ? n : null;
}

/** "2..5" → [2, 5] */
export function compareParam(s: string | null): [number, number] | null {
  const m = /^([0-9]{1,10})\.\.([0-9]{1,10})$/.exec(s ?? "");
  if (!m) return null;
  const a = versionParam(m[1]);
  const b = versionParam(m[2]);
  return a && b ? [a, b] : null;
}
