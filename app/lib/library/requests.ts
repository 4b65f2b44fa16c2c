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

export type ListQuery = { q?: string; tag?: string; page: number; perPage: number };

/** ?q=&tag=&page=&perPage= with sane bounds; anything odd falls back to the default. */
export function parseListQuery(url: URL): ListQuery {
  const int = (k: string, d: number, max: number) => {
    const n = Number(url.searchParams.get(k));
    return Number.isInteger(n) && n >= 1 && n <= max ? n : d;
  };
  const q = (url.searchParams.get("q") ?? "").trim().slice(0, 60);
  const tagRaw = (url.searchParams.get("tag") ?? "").trim();
  const tag = tagSchema.safeParse(tagRaw).success ? tagRaw : undefined;
  return { q: q && !/[\u0000\uD800-\uDFFF]/.test(q) ? q : undefined, tag, page: int("page", 1, 100000), perPage: int("perPage", 20, 100) };
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
