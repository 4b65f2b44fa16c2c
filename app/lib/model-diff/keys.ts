// Stable keys for the items of the config's lists, so diffs and merges follow items, not
// positions. Presets, channels, buttons, fonts and (since "hiltbench.config/2") layers have an
// `id`, and a list whose items all carry distinct ids is keyed by them. Controls have none:
// they are keyed by a hash of their content, so a reorder reads as a move. An edited control
// has a new hash, so a second pass pairs each unmatched control with an unmatched one of the
// same event (layers: the same kind) on the other side, in order, and gives it that item's key:
// the edit then reads as a change of its fields instead of a removal and an addition.
// Identical items are told apart by occurrence ("hash#2"). The content keys also stand in for a
// list of layers without ids, or with an id twice (the validator reports that; a diff still reads).

type Json = unknown;

/** Stable JSON: object keys sorted, so equal content gives the same text. */
export function stableJson(v: Json): string {
  if (Array.isArray(v)) return `[${v.map(stableJson).join(",")}]`;
  if (v && typeof v === "object") {
    const o = v as Record<string, unknown>;
    return `{${Object.keys(o)
      .filter((k) => o[k] !== undefined)
      .sort()
      .map((k) => `${JSON.stringify(k)}:${stableJson(o[k])}`)
      .join(",")}}`;
  }
  return JSON.stringify(v) ?? "null";
}

/** FNV-1a, 32 bits, as 8 hex digits: short and deterministic, not a security measure. */
function hash(s: string): string {
  let h = 0x811c9dc5;
  for (let i = 0; i < s.length; i++) {
    h ^= s.charCodeAt(i);
    h = Math.imul(h, 0x01000193);
  }
  return (h >>> 0).toString(16).padStart(8, "0");
}

export type ListKind = "id" | "content" | "none";

/** What kind of list sits at a path of property names (array indexes left out). */
export function listKind(props: readonly string[], items: readonly unknown[]): ListKind {
  const last = props[props.length - 1];
  if (last === "controls") return "content";
  const ids = items.map((x) => (x && typeof x === "object" ? (x as { id?: unknown }).id : undefined));
  if (items.length > 0 && ids.every((id) => typeof id === "string")) return new Set(ids).size === ids.length ? "id" : "content";
  return last === "layers" ? "content" : "none";
}

/**
 * The kind for one list seen from several sides (a and b; base, mine and theirs): keyed by id
 * only when every side's items carry distinct ids, since all sides must be keyed alike.
 */
export function listKindOf(props: readonly string[], sides: readonly (readonly unknown[])[]): ListKind {
  const kinds = sides.filter((xs) => xs.length > 0).map((xs) => listKind(props, xs));
  if (kinds.length === 0) return listKind(props, []);
  if (kinds.every((k) => k === "id")) return "id";
  if (kinds.every((k) => k === "none")) return "none";
  return "content";
}

/** What decides "the same sort of item" when pairing edited content-keyed items. */
const sortOf = (x: unknown) => {
  const o = (x ?? {}) as { kind?: unknown; event?: unknown };
  return String(o.kind ?? o.event ?? "");
};

/**
 * Content keys for one side with no reference: hash, plus occurrence for duplicates. Plain
 * JSON text (not the sorted form): the same layer written with its fields in another order gets
 * another hash, and the pairing pass below still matches it to its counterpart as an edit.
 */
export function contentKeys(items: readonly unknown[]): string[] {
  const seen = new Map<string, number>();
  return items.map((x) => {
    const h = hash(JSON.stringify(x) ?? "null");
    const n = (seen.get(h) ?? 0) + 1;
    seen.set(h, n);
    return n === 1 ? h : `${h}#${n}`;
  });
}

/**
 * Keys for `items` relative to `ref` (whose keys are `refKeys`): identical content takes the
 * reference's key; an item left over takes the key of the next left-over reference item of the
 * same sort (an edit); anything else keeps its own content key (an addition).
 */
export function pairedKeys(ref: readonly unknown[], refKeys: readonly string[], items: readonly unknown[]): string[] {
  const own = contentKeys(items);
  const free = new Set(refKeys);
  const out: (string | null)[] = own.map((k) => {
    if (free.has(k)) {
      free.delete(k);
      return k;
    }
    return null;
  });
  for (let i = 0; i < items.length; i++) {
    if (out[i] !== null) continue;
    const j = ref.findIndex((r, idx) => free.has(refKeys[idx]) && sortOf(r) === sortOf(items[i]));
    if (j >= 0) {
      out[i] = refKeys[j];
      free.delete(refKeys[j]);
    }
  }
  // Additions: their own key, unless it collides with a reference key (then marked new).
  const used = new Set(out.filter((k): k is string => k !== null));
  return out.map((k, i) => {
    if (k !== null) return k;
    let key = `new:${own[i]}`;
    while (used.has(key) || refKeys.includes(key)) key += "'";
    used.add(key);
    return key;
  });
}

/** Keys for a list on both sides of a comparison. */
export function keysFor(props: readonly string[], a: readonly unknown[], b: readonly unknown[]): { kind: ListKind; a: string[]; b: string[] } | null {
  const kind = listKindOf(props, [a, b]);
  if (kind === "none") return null;
  if (kind === "id") {
    const ids = (xs: readonly unknown[]) => xs.map((x) => `id:${(x as { id: string }).id}`);
    return { kind, a: ids(a), b: ids(b) };
  }
  const ka = contentKeys(a);
  return { kind, a: ka, b: pairedKeys(a, ka, b) };
}
