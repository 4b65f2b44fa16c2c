// The model diff: jsondiffpatch finds the structure (object hash on stable keys, moves
// detected), and our own walk over its delta writes each change in Hiltbench's words.
import { create, type Delta, type ArrayDelta, type ObjectDelta } from "jsondiffpatch";
import { keysFor } from "./keys";
import { channelName, fieldLabel, fromTo, itemCrumb, movedCrumb, valueText } from "./words";

export type ChangeKind = "added" | "removed" | "changed" | "moved";
export type Change = {
  kind: ChangeKind;
  /** The whole line a person reads. */
  text: string;
  /** Where, in words: ["Preset Ashfall", "Chamber window", "layer 2 (drift)"]. */
  where: string[];
  /** For "changed": the field in words ("speed") and the values as text. */
  field?: string;
  before?: string;
  after?: string;
  /** For "moved": 1-based positions. */
  from?: number;
  to?: number;
};

export type ModelDiff = { delta: Delta; changes: Change[] };

const isObj = (v: unknown): v is Record<string, unknown> => typeof v === "object" && v !== null && !Array.isArray(v);

/** Lists whose items hold further keyed lists (a preset's looks hold layers); the others are leaves here. */
const NESTS = new Set(["presets"]);

/**
 * Keys for every keyed list item on both sides, walking matched items in parallel. Answers b with
 * every matched item whose content equals its a-side item replaced by that very a-side object
 * (b itself is not changed): jsondiffpatch then skips the pair at once (same reference) instead
 * of walking it field by field, which is most of the work when two revisions differ in a few
 * places. The answer equals b in content, so the delta is the same.
 */
function assignKeys(a: unknown, b: unknown, props: string[], keys: WeakMap<object, string>): unknown {
  if (a === b || typeof a !== "object" || typeof b !== "object" || a === null || b === null) return b;
  if (Array.isArray(a) && Array.isArray(b)) {
    const k = keysFor(props, a, b);
    if (!k) return b; // lists of values or of unkeyed records hold no keyed lists in this model
    const byKey = new Map<string, unknown>();
    a.forEach((x, i) => {
      if (x && typeof x === "object") keys.set(x, k.a[i]);
      byKey.set(k.a[i], x);
    });
    const nests = NESTS.has(props[props.length - 1]);
    return b.map((x, i) => {
      if (x && typeof x === "object") keys.set(x, k.b[i]);
      if (!byKey.has(k.b[i])) return x;
      const y = byKey.get(k.b[i]);
      if (y && typeof y === "object" && JSON.stringify(y) === JSON.stringify(x)) return y;
      return nests ? assignKeys(y, x, props, keys) : x;
    });
  }
  if (isObj(a) && isObj(b)) {
    let out: Record<string, unknown> | null = null;
    for (const key of Object.keys(a)) {
      if (!(key in b) || typeof a[key] !== "object") continue;
      const shared = assignKeys(a[key], b[key], [...props, key], keys);
      if (shared !== b[key]) (out ??= { ...b })[key] = shared;
    }
    if (out && keys.has(b)) keys.set(out, keys.get(b)!);
    return out ?? b;
  }
  return b;
}

function differ(a: unknown, b: unknown) {
  const keys = new WeakMap<object, string>();
  const shared = assignKeys(a, b, [], keys);
  const differ = create({
    objectHash: (item: object, index?: number) => keys.get(item) ?? (typeof (item as { id?: unknown }).id === "string" ? `id:${(item as { id: string }).id}` : `@${index}`),
    arrays: { detectMove: true, includeValueOnMove: false },
    cloneDiffValues: false,
  });
  return { differ, shared };
}

/** The structural delta from a to b (undefined when they are the same). */
export function modelDelta(a: unknown, b: unknown): Delta {
  const { differ: d, shared } = differ(a, b);
  return d.diff(a, shared);
}

/** a with the delta applied; a itself is not changed. */
export function applyDelta<T>(a: T, delta: Delta): T {
  const copy = structuredClone(a);
  return delta === undefined ? copy : (create().patch(copy, delta) as T);
}

/** What changed from a to b, in words. */
export function diffModels(a: unknown, b: unknown): ModelDiff {
  const delta = modelDelta(a, b);
  const changes: Change[] = [];
  if (delta !== undefined) walk(delta, a, b, [], [], changes, b);
  return { delta, changes };
}

const KEYED = new Set(["channels", "buttons", "fonts", "presets", "controls", "layers"]);

function line(where: string[], rest: string) {
  return where.length ? `${where.join(" › ")}: ${rest}` : capital(rest);
}

function walk(delta: Delta, a: unknown, b: unknown, props: string[], where: string[], out: Change[], root: unknown) {
  if (delta === undefined) return;
  const prop = props[props.length - 1] ?? "";
  if (Array.isArray(delta)) {
    // A whole value replaced, added or removed at a field.
    const before = delta.length === 1 ? undefined : delta[0];
    const after = delta.length === 1 ? delta[0] : delta.length === 2 ? delta[1] : undefined;
    const field = fieldLabel(prop);
    out.push({ kind: "changed", where, field, before: valueText(before), after: valueText(after), text: line(where, `${field} ${fromTo(prop, before, after)}`) });
    return;
  }
  if ((delta as ArrayDelta)._t === "a") {
    if (KEYED.has(prop) && Array.isArray(a) && Array.isArray(b)) return walkList(delta as ArrayDelta, a, b, props, where, out, root);
    // Lists of values (pins, colours, cues, stops): shown whole, before → after.
    const field = fieldLabel(prop);
    out.push({ kind: "changed", where, field, before: valueText(a), after: valueText(b), text: line(where, `${field} ${fromTo(prop, a, b)}`) });
    return;
  }
  const d = delta as ObjectDelta;
  const ao = isObj(a) ? a : {};
  const bo = isObj(b) ? b : {};
  for (const key of Object.keys(d)) {
    const sub = d[key];
    let nextWhere = where;
    if (prop === "looks") {
      const name = channelName(root, key);
      if (Array.isArray(sub) && sub.length !== 2) {
        const added = sub.length === 1;
        out.push({ kind: added ? "added" : "removed", where, text: line([...where, name], `look ${added ? "added" : "removed"}`) });
        continue;
      }
      nextWhere = [...where, name];
    } else if (["board", "power", "speaker"].includes(key) && props.length === 1 && props[0] === "rig") {
      nextWhere = [...where, fieldLabel(key)];
    } else if (isObj(ao[key]) || isObj(bo[key])) {
      if (key !== "rig" && key !== "looks" && key !== "layers") {
        // A nested record inside an item (a layer's range, a control's trigger): one field, walked.
        walkNested(sub, ao[key], bo[key], key, where, out);
        continue;
      }
    }
    walk(sub, ao[key], bo[key], [...props, key], nextWhere, out, root);
  }
}

function walkNested(delta: Delta, a: unknown, b: unknown, label: string, where: string[], out: Change[]) {
  if (delta === undefined) return;
  if (Array.isArray(delta) || (delta as ArrayDelta)._t === "a" || !isObj(a) || !isObj(b)) {
    out.push({ kind: "changed", where, field: fieldLabel(label), before: valueText(a), after: valueText(b), text: line(where, `${fieldLabel(label)} ${fromTo(label, a, b)}`) });
    return;
  }
  for (const key of Object.keys(delta as ObjectDelta)) {
    const field = `${fieldLabel(label)} ${fieldLabel(key)}`;
    const x = a[key];
    const y = b[key];
    out.push({ kind: "changed", where, field, before: valueText(x), after: valueText(y), text: line(where, `${field} ${fromTo(key, x, y)}`) });
  }
}

function walkList(delta: ArrayDelta, a: unknown[], b: unknown[], props: string[], where: string[], out: Change[], root: unknown) {
  const prop = props[props.length - 1];
  const removed: Change[] = [];
  const moved: Change[] = [];
  const rest: Change[] = [];
  for (const key of Object.keys(delta)) {
    if (key === "_t") continue;
    const sub = (delta as unknown as Record<string, Delta>)[key];
    if (key.startsWith("_")) {
      const from = Number(key.slice(1));
      const item = a[from];
      if (Array.isArray(sub) && sub[2] === 3) {
        const to = sub[1] as number;
        // A reversal moves one item onto its own place; nothing to read there.
        if (to !== from) moved.push({ kind: "moved", where, from: from + 1, to: to + 1, text: line(where, `${movedCrumb(prop, item)} moved from ${from + 1} to ${to + 1}`) });
      } else {
        removed.push({ kind: "removed", where, text: line(where, `${itemCrumb(prop, item, from + 1)} removed`) });
      }
      continue;
    }
    const at = Number(key);
    if (Array.isArray(sub) && sub.length === 1) {
      rest.push({ kind: "added", where, text: line(where, `${itemCrumb(prop, sub[0], at + 1)} added`) });
      continue;
    }
    const after = b[at];
    // The item before: the same key on the a side (it may have moved).
    const before = findBefore(delta, a, at);
    // A renamed item is named as it was known before the change ("Preset Ashfall: name Ashfall → …").
    const crumb = itemCrumb(prop, before !== undefined && before !== null ? before : after, at + 1);
    walk(sub, before, after, [...props, "#item"], [...where, crumb], rest, root);
  }
  out.push(...removed, ...moved, ...rest);
}

/** The item a b-side position came from (it may have moved), by replaying the delta on positions. */
function findBefore(delta: ArrayDelta, a: unknown[], newIndex: number): unknown {
  const from = replay(delta, a.length)[newIndex];
  return from === null || from === undefined ? undefined : a[from];
}

/** Apply an array delta to [0..n) and answer, for each b position, the a index it came from (null: added). */
function replay(delta: ArrayDelta, n: number): (number | null)[] {
  const marks: unknown[] = Array.from({ length: n }, (_, i) => ({ __from: i }));
  const shallow: Record<string, unknown> = { _t: "a" };
  for (const key of Object.keys(delta)) {
    if (key === "_t") continue;
    const s = (delta as unknown as Record<string, Delta>)[key];
    if (key.startsWith("_")) shallow[key] = s;
    else if (Array.isArray(s) && s.length === 1) shallow[key] = [{ __from: null }];
  }
  const patched = create().patch(marks, shallow as Delta) as { __from: number | null }[];
  return patched.map((m) => m.__from);
}

const capital = (s: string) => (s ? s[0].toUpperCase() + s.slice(1) : s);
