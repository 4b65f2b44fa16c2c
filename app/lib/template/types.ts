// Static types for the checker, derived from the zod schemas of the config model, so that a
// misspelt field is caught when a template is compiled rather than printing nothing.
import { configSchema, layerSchema, presetSchema, lookSchema, channelSchema, buttonSchema, fontSchema, controlSchema } from "../config/schema";
import { boardSchema, powerSchema, speakerSchema, rigSchema } from "../config/schema";

export type Ty =
  | { k: "any" }
  | { k: "str"; free: boolean; values?: readonly string[]; maybe?: boolean }
  | { k: "num"; maybe?: boolean }
  | { k: "bool"; maybe?: boolean }
  | { k: "null" }
  | { k: "list"; of: Ty; maybe?: boolean }
  | { k: "record"; of: Ty; maybe?: boolean }
  | { k: "obj"; name: string; fields: Map<string, Ty>; maybe?: boolean }
  | { k: "loop" };

export const ANY: Ty = { k: "any" };
export const NUM: Ty = { k: "num" };
export const BOOL: Ty = { k: "bool" };
export const STR: Ty = { k: "str", free: false };
export const FREE_STR: Ty = { k: "str", free: true };

export const LOOP_FIELDS = new Map<string, Ty>([
  ["index", NUM],
  ["number", NUM],
  ["first", BOOL],
  ["last", BOOL],
  ["length", NUM],
]);

// Names used in messages ("unknown field 'sped' on layer").
const NAMES = new Map<unknown, string>([
  [configSchema, "config"],
  [rigSchema, "rig"],
  [boardSchema, "board"],
  [powerSchema, "power"],
  [speakerSchema, "speaker"],
  [channelSchema, "channel"],
  [buttonSchema, "button"],
  [fontSchema, "font"],
  [presetSchema, "preset"],
  [lookSchema, "look"],
  [layerSchema, "layer"],
  [controlSchema, "control"],
]);

type ZodLike = { _zod: { def: Record<string, unknown> & { type: string } } } & Record<string, unknown>;

export function fromZod(schema: unknown, hint = "value"): Ty {
  const s = schema as ZodLike;
  const def = s._zod.def;
  const name = NAMES.get(schema) ?? hint;
  switch (def.type) {
    case "string": {
      const checks = (def.checks as { _zod: { def: { format?: string } } }[] | undefined) ?? [];
      return { k: "str", free: !checks.some((c) => c._zod.def.format === "regex") };
    }
    case "number":
      return NUM;
    case "boolean":
      return BOOL;
    case "enum":
      return { k: "str", free: false, values: s.options as string[] };
    case "literal":
      return { k: "str", free: false, values: (def.values as unknown[]).map(String) };
    case "optional":
      return { ...fromZod(def.innerType, hint), maybe: true } as Ty;
    case "array":
      return { k: "list", of: fromZod(def.element, singular(hint)) };
    case "record":
      return { k: "record", of: fromZod(def.valueType, singular(hint)) };
    case "object": {
      const fields = new Map<string, Ty>();
      for (const [key, value] of Object.entries(s.shape as Record<string, unknown>)) fields.set(key, fromZod(value, key));
      return { k: "obj", name, fields };
    }
    case "union": {
      const parts = (def.options as unknown[]).map((o) => fromZod(o, hint));
      return unionOf(parts, name);
    }
    default:
      return ANY;
  }
}

function singular(word: string): string {
  if (word.endsWith("ies")) return word.slice(0, -3) + "y";
  return word.endsWith("s") ? word.slice(0, -1) : word;
}

/** A union of objects has the union of their fields; a field some variants lack may be missing. */
export function unionOf(parts: Ty[], name: string): Ty {
  if (parts.every((p) => p.k === "obj")) {
    const fields = new Map<string, Ty>();
    const objs = parts as Extract<Ty, { k: "obj" }>[];
    for (const o of objs) {
      for (const [key, ty] of o.fields) {
        const prev = fields.get(key);
        fields.set(key, prev ? merge(prev, ty) : ty);
      }
    }
    for (const [key, ty] of fields) if (!objs.every((o) => o.fields.has(key))) fields.set(key, { ...ty, maybe: true } as Ty);
    return { k: "obj", name, fields };
  }
  return parts.reduce((a, b) => merge(a, b));
}

function merge(a: Ty, b: Ty): Ty {
  if (a.k !== b.k) return ANY;
  if (a.k === "str" && b.k === "str") {
    const values = a.values && b.values ? [...new Set([...a.values, ...b.values])] : undefined;
    return { k: "str", free: a.free || b.free, values, maybe: a.maybe || b.maybe };
  }
  if (a.k === "obj" && b.k === "obj") return unionOf([a, b], a.name);
  if (a.k === "list" && b.k === "list") return { k: "list", of: merge(a.of, b.of) };
  return a;
}

export const CONFIG_TYPE = fromZod(configSchema, "config");

export const META_TYPE: Ty = {
  k: "obj",
  name: "meta",
  fields: new Map<string, Ty>([
    ["buildName", FREE_STR],
    ["clientName", { k: "str", free: true, maybe: true }],
    ["savedAt", STR],
    ["revision", { k: "num", maybe: true }],
    ["templateName", FREE_STR],
    ["templateVersion", NUM],
  ]),
};

export function describe(t: Ty): string {
  switch (t.k) {
    case "str":
      return "text";
    case "num":
      return "a number";
    case "bool":
      return "true/false";
    case "list":
      return "a list";
    case "record":
      return "a keyed table";
    case "obj":
      return `a ${t.name}`;
    case "loop":
      return "loop information";
    case "null":
      return "nothing";
    default:
      return "a value";
  }
}
