// Three-way merge on the model: base (what the person started from), mine (their edits) and
// theirs (what was saved meanwhile). Lists with stable keys (ids, layers' included; controls by
// the content keys of keys.ts) merge item by item, their order through node-diff3 on the key
// sequences; plain records merge field by field. Where both sides changed the same value
// differently, that is a conflict: it is listed with both values, and `choices` (path → side)
// decides it. An undecided conflict keeps theirs until the person picks.
import { diff3Merge } from "node-diff3";
import { contentKeys, listKindOf, pairedKeys, stableJson } from "./keys";
import { channelName, fieldLabel, itemCrumb, valueText } from "./words";

export type Side = "mine" | "theirs";
export type Conflict = {
  /** Stable address of the place, the key for `choices`. */
  path: string;
  /** Where and what, in words: "Preset Ashfall › Main blade › layer 1 (fill): colour". */
  text: string;
  base: string;
  mine: string;
  theirs: string;
};
export type MergeResult<T> = { merged: T; conflicts: Conflict[] };

const isObj = (v: unknown): v is Record<string, unknown> => typeof v === "object" && v !== null && !Array.isArray(v);
/**
 * Equal as stable JSON (object keys in any order, undefined fields absent), compared in place:
 * the merge asks this at every level, and building the JSON text each time made a 20-layer
 * merge cost milliseconds.
 */
function same(x: unknown, y: unknown): boolean {
  if (x === y) return true;
  if (typeof x !== "object" || typeof y !== "object" || x === null || y === null) {
    // Numbers JSON cannot write (NaN, ±Infinity) write as null: equal the way stableJson saw them.
    return typeof x === "number" || typeof y === "number" ? stableJson(x) === stableJson(y) : false;
  }
  if (Array.isArray(x) !== Array.isArray(y)) return false;
  if (Array.isArray(x)) {
    const ya = y as unknown[];
    if (x.length !== ya.length) return false;
    for (let i = 0; i < x.length; i++) if (!same(x[i] === undefined ? null : x[i], ya[i] === undefined ? null : ya[i])) return false;
    return true;
  }
  const xo = x as Record<string, unknown>;
  const yo = y as Record<string, unknown>;
  let n = 0;
  for (const k of Object.keys(xo)) {
    if (xo[k] === undefined) continue;
    n++;
    if (!Object.hasOwn(yo, k) || !same(xo[k], yo[k])) return false;
  }
  let m = 0;
  for (const k of Object.keys(yo)) if (yo[k] !== undefined) m++;
  return n === m;
}
const GONE = Symbol("gone");

type Ctx = { choices: Record<string, Side>; conflicts: Conflict[]; root: { mine: unknown; theirs: unknown } };

export function merge3<T>(base: T, mine: T, theirs: T, choices: Record<string, Side> = {}): MergeResult<T> {
  const ctx: Ctx = { choices, conflicts: [], root: { mine, theirs } };
  const merged = mergeValue(base, mine, theirs, [], "", [], ctx);
  return { merged: (merged === GONE ? undefined : merged) as T, conflicts: ctx.conflicts };
}

function conflict(ctx: Ctx, path: string, where: string[], field: string, b: unknown, m: unknown, t: unknown, gone = false): unknown {
  const text = `${where.join(" › ")}${where.length && field ? ": " : ""}${field}`;
  const show = (v: unknown) => (v === undefined ? (gone ? "removed" : "none") : valueText(v));
  ctx.conflicts.push({ path, text: text || "The whole config", base: show(b), mine: show(m), theirs: show(t) });
  return ctx.choices[path] === "mine" ? m : t;
}

function mergeValue(b: unknown, m: unknown, t: unknown, props: string[], path: string, where: string[], ctx: Ctx): unknown {
  if (same(m, t)) return m;
  if (same(b, m)) return t;
  if (same(b, t)) return m;
  const prop = props[props.length - 1] ?? "";
  if (isObj(m) && isObj(t) && (isObj(b) || b === undefined)) {
    const bo = isObj(b) ? b : {};
    const out: Record<string, unknown> = {};
    const keys = [...Object.keys(t), ...Object.keys(m).filter((k) => !(k in t))];
    for (const k of keys) {
      let w = where;
      if (prop === "looks") w = [...where, channelName(ctx.root.theirs, k)];
      else if (props.length === 1 && props[0] === "rig" && ["board", "power", "speaker"].includes(k)) w = [...where, fieldLabel(k)];
      const r = mergeValue(bo[k], m[k], t[k], [...props, k], `${path}.${k}`, w, ctx);
      if (r !== undefined) out[k] = r;
    }
    return out;
  }
  if (Array.isArray(b) && Array.isArray(m) && Array.isArray(t)) {
    const kind = listKindOf(props, [b, m, t]);
    if (kind !== "none") return mergeList(b, m, t, kind, props, path, where, ctx);
  }
  const inItem = props.length > 0 && prop.startsWith("[");
  return conflict(ctx, path, where, inItem ? "" : fieldLabel(prop), b, m, t, inItem);
}

function mergeList(b: unknown[], m: unknown[], t: unknown[], kind: "id" | "content", props: string[], path: string, where: string[], ctx: Ctx): unknown[] {
  const prop = props[props.length - 1];
  const ids = (xs: unknown[]) => xs.map((x) => `id:${(x as { id?: unknown })?.id}`);
  const kb = kind === "id" ? ids(b) : contentKeys(b);
  const km = kind === "id" ? ids(m) : pairedKeys(b, kb, m);
  const kt = kind === "id" ? ids(t) : pairedKeys(b, kb, t);
  const mapOf = (ks: string[], xs: unknown[]) => new Map(ks.map((k, i) => [k, xs[i]] as const));
  const B = mapOf(kb, b);
  const M = mapOf(km, m);
  const T = mapOf(kt, t);

  // Order: a three-way merge of the key sequences; where both reordered the same stretch
  // differently, theirs wins, with my new items after.
  const order: string[] = [];
  for (const region of diff3Merge(km, kb, kt, { excludeFalseConflicts: true })) {
    if (region.ok) order.push(...region.ok);
    else if (region.conflict) order.push(...region.conflict.b, ...region.conflict.a);
  }
  for (const k of [...kt, ...km]) order.push(k);
  const seen = new Set<string>();
  const out: unknown[] = [];
  for (const k of order) {
    if (seen.has(k)) continue;
    seen.add(k);
    const inB = B.has(k);
    const inM = M.has(k);
    const inT = T.has(k);
    const item = (inT ? T.get(k) : inM ? M.get(k) : B.get(k)) as unknown;
    const pos = (inT ? kt.indexOf(k) : km.indexOf(k)) + 1;
    const crumb = itemCrumb(prop, item, pos);
    const itemPath = `${path}[${k}]`;
    const itemWhere = [...where, crumb[0] === crumb[0].toLowerCase() ? crumb : crumb];
    let r: unknown;
    if (inM && inT) r = mergeValue(inB ? B.get(k) : undefined, M.get(k), T.get(k), [...props, `[${k}]`], itemPath, itemWhere, ctx);
    else if (inB && !inM && !inT) r = undefined;
    else if (inB && inM && !inT) r = same(B.get(k), M.get(k)) ? undefined : conflict(ctx, itemPath, itemWhere, "", B.get(k), M.get(k), undefined, true);
    else if (inB && !inM && inT) r = same(B.get(k), T.get(k)) ? undefined : conflict(ctx, itemPath, itemWhere, "", B.get(k), undefined, T.get(k), true);
    else r = inM ? M.get(k) : T.get(k);
    if (r !== undefined) out.push(r);
  }
  return out;
}
