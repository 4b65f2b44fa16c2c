// Error lists are capped everywhere they are answered (decision 011): a hostile 260 KB template
// once produced 19,872 errors (2.5 MB) of 3 kinds. Answers carry the first MAX_LISTED errors,
// the total, and the distinct kinds with their counts, so nothing is hidden and nothing is huge.

import { z } from "zod";

/** How many errors an answer lists one by one. */
export const MAX_LISTED = 50;
/** How many distinct kinds an answer names. */
export const MAX_KINDS = 20;

export type ErrorKind = { kind: string; count: number };

/** An error with its place: a template's line and column, or (stage "config") a model path with no line. */
export const positionedErrorSchema = z
  .object({
    stage: z.string().meta({ description: "tokenize, parse, check, render, or config (a posted config without the model's shape)" }),
    message: z.string(),
    line: z.number().int().nullable(),
    column: z.number().int().nullable(),
    path: z.string().optional().meta({ description: "For stage config: the JSON path at fault." }),
  })
  .meta({ id: "PositionedError" });

export const errorKindSchema = z.object({ kind: z.string(), count: z.number().int() }).meta({ id: "ErrorKind" });
export type CappedList<E> = { errors: E[]; total: number; kinds: ErrorKind[] };

/**
 * An error's kind: its message with the particulars taken out (quoted names, numbers, the
 * "in template … at 3:4:" prefix of an error inside a used template), so that "unknown field
 * 'bord'" and "unknown field 'colr'" count as one kind.
 */
export function errorKind(message: string): string {
  return message
    .replace(/^in template "[^"]*" at \d+:\d+: /, "")
    .replace(/'[^']*'/g, "'…'")
    .replace(/"[^"]*"/g, '"…"')
    .replace(/\d+(\.\d+)?/g, "N")
    .slice(0, 200);
}

/** The first `max` errors, the total and the distinct kinds (most frequent first). */
export function capErrors<E extends { message: string }>(errors: readonly E[], max = MAX_LISTED): CappedList<E> {
  const counts = new Map<string, number>();
  for (const e of errors) {
    const k = errorKind(e.message);
    counts.set(k, (counts.get(k) ?? 0) + 1);
  }
  const kinds = [...counts].map(([kind, count]) => ({ kind, count })).sort((a, b) => b.count - a.count).slice(0, MAX_KINDS);
  return { errors: errors.slice(0, max), total: errors.length, kinds };
}

/** "50 of 19,872 errors shown (3 kinds)" — the line under a capped list; empty when nothing is left out. */
export function cappedNote(list: { errors: readonly unknown[]; total: number; kinds: readonly ErrorKind[] }): string {
  if (list.total <= list.errors.length) return "";
  return `The first ${list.errors.length} of ${list.total.toLocaleString("en")} errors are listed; they are of ${list.kinds.length} kind${list.kinds.length === 1 ? "" : "s"}: ${list.kinds
    .slice(0, 5)
    .map((k) => `${k.kind} (${k.count.toLocaleString("en")})`)
    .join("; ")}.`;
}
