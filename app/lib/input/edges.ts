// What PostgreSQL cannot hold, refused at the edge with a 4xx that names the field: text with a
// NUL character (U+0000; `text` and `jsonb` refuse it), text with a lone UTF-16 surrogate (not
// UTF-8 at all: `jsonb` refuses it, `text` would silently store U+FFFD instead), and whole
// numbers outside a column's range (`integer` is int4). Pure: shared by the zod schemas, the
// JSON body reader, form parsing and the request guard (decision 011).

/** The largest value of a PostgreSQL `integer` (int4) column. */
export const INT4_MAX = 2_147_483_647;

const LONE_SURROGATE = /[\ud800-\udbff](?![\udc00-\udfff])|(?<![\ud800-\udbff])[\udc00-\udfff]/;

/** Why this text cannot be stored, or null when it can. */
export function badTextReason(s: string): string | null {
  if (s.includes("\u0000")) return "contains a NUL character (U+0000), which cannot be stored";
  if (LONE_SURROGATE.test(s)) return "contains a lone UTF-16 surrogate (half of a character), which is not valid Unicode text";
  return null;
}

/** True for text that can be stored as it is. */
export const isStorableText = (s: string) => badTextReason(s) === null;

/** `presets[0].name`-style path of JSON keys and indexes. */
export function jsonPath(path: readonly (string | number)[]): string {
  let out = "";
  for (const k of path) {
    if (typeof k === "number") out += `[${k}]`;
    else if (/^[A-Za-z_$][\w$]*$/.test(k)) out += out ? `.${k}` : k;
    else out += `[${JSON.stringify(k.slice(0, 40))}]`;
  }
  return out || "(the document)";
}

export type BadText = { path: string; reason: string };

/**
 * The first string (value or key) in a JSON value that cannot be stored, walked without recursion.
 * Keys count too: a config's records are keyed by ids, and a key is text in `jsonb`.
 */
export function findBadText(value: unknown): BadText | null {
  const stack: [unknown, (string | number)[]][] = [[value, []]];
  while (stack.length) {
    const [v, path] = stack.pop()!;
    if (typeof v === "string") {
      const reason = badTextReason(v);
      if (reason) return { path: jsonPath(path), reason };
    } else if (Array.isArray(v)) {
      for (let i = v.length - 1; i >= 0; i--) stack.push([v[i], [...path, i]]);
    } else if (typeof v === "object" && v !== null) {
      const keys = Object.keys(v);
      for (let i = keys.length - 1; i >= 0; i--) {
        const k = keys[i];
        const reason = badTextReason(k);
        if (reason) return { path: jsonPath([...path, k.replace(/[\u0000\ud800-\udfff]/g, "\ufffd")]), reason: `has a key that ${reason}` };
        stack.push([(v as Record<string, unknown>)[k], [...path, k]]);
      }
    }
  }
  return null;
}

/** The first form field whose name or text value cannot be stored (files are read by their route). */
export function findBadFormField(entries: Iterable<[string, FormDataEntryValue]>): BadText | null {
  for (const [name, value] of entries) {
    const shown = name.replace(/[\u0000\ud800-\udfff]/g, "\ufffd").slice(0, 60);
    const nameReason = badTextReason(name);
    if (nameReason) return { path: shown, reason: `has a name that ${nameReason}` };
    if (typeof value === "string") {
      const reason = badTextReason(value);
      if (reason) return { path: shown, reason };
    }
  }
  return null;
}

/** A whole number that fits an `integer` column and is at least `min`. */
export function isInt4(n: unknown, min = 0): n is number {
  return typeof n === "number" && Number.isInteger(n) && n >= min && n <= INT4_MAX;
}

/**
 * A form field or query parameter holding a whole number for an `integer` column: the number,
 * or null for anything else (blank, not a number, a fraction, out of range).
 */
export function int4From(value: FormDataEntryValue | string | null | undefined, min = 0): number | null {
  if (typeof value !== "string" || !/^\s*\d{1,10}\s*$/.test(value)) return null;
  const n = Number(value);
  return isInt4(n, min) ? n : null;
}
