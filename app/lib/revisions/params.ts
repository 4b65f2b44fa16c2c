// Reading the revision numbers, paging and sorting a request asks for. Pure: answers a value or
// a message for a 400, so routes stay thin.
import { z } from "zod";

export type Read<T> = { ok: true; value: T } | { ok: false; error: string };

/** A revision number as written in a URL: digits only, from 1. */
export function readRevisionNumber(raw: string | null | undefined, name: string): Read<number> {
  if (raw === null || raw === undefined || raw.trim() === "") return { ok: false, error: `Say which revision: '${name}' is missing (a revision number of this build, e.g. ${name}=3).` };
  const t = raw.trim();
  if (!/^\d{1,9}$/.test(t))
    return {
      ok: false,
      error: `'${name}' must be a revision number of this build (digits, from 1), not '${t.slice(0, 60)}'. Revisions of two different builds cannot be compared.`,
    };
  const n = Number(t);
  if (n < 1) return { ok: false, error: `'${name}' must be 1 or more.` };
  return { ok: true, value: n };
}

export const REVISION_PAGE_SIZES = [10, 25, 50, 100] as const;

export const revisionListQuerySchema = z.object({
  sort: z.enum(["number", "author", "errors", "warnings"]).default("number"),
  dir: z.enum(["asc", "desc"]).default("desc"),
  page: z.coerce.number().int().min(1).max(100000).default(1),
  perPage: z.coerce.number().int().refine((n) => (REVISION_PAGE_SIZES as readonly number[]).includes(n), "perPage is one of 10, 25, 50, 100").default(25),
  author: z.union([z.literal("none"), z.uuid()]).optional(),
});
export type RevisionListQuery = z.infer<typeof revisionListQuerySchema>;

export function readListQuery(params: URLSearchParams): Read<RevisionListQuery> {
  const raw = Object.fromEntries([...params.entries()].filter(([, v]) => v !== ""));
  const r = revisionListQuerySchema.safeParse(raw);
  if (!r.success) return { ok: false, error: r.error.issues.map((i) => `${i.path.join(".") || "query"}: ${i.message}`).join("; ") };
  return { ok: true, value: r.data };
}
