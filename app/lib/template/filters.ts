// The built-in filters: the only functions a template can reach. Each declares its arity and
// input so the checker can reject misuse at compile time; each also checks at render time,
// because a value typed "any" (a piece parameter, a list item of mixed kinds) can still be wrong.
import { BOOL, FREE_STR, NUM, STR, type Ty } from "./types";

export interface FilterCtx {
  /** Per-render state for `cident` uniqueness: scope → (input → identifier). */
  idents: Map<string, Map<string, string>>;
  maxWidth: number;
}

export type InputKind = "any" | "str" | "num" | "list" | "color" | "strlist";

export interface FilterDef {
  min: number;
  max: number;
  input: InputKind;
  /** Output type given the input type; `free` text stays free unless the filter makes it safe. */
  out: (input: Ty) => Ty;
  /** Marks output as safe to place in C source. */
  cSafe?: boolean;
  fn: (v: unknown, args: unknown[], ctx: FilterCtx) => unknown;
}

export class FilterError extends Error {}

export const fail = (msg: string): never => {
  throw new FilterError(msg);
};

export const keepFree = (t: Ty): Ty => (t.k === "str" && t.free ? FREE_STR : STR);

export function needNum(v: unknown, what: string): number {
  if (typeof v !== "number" || !Number.isFinite(v)) fail(`${what} must be a number, not ${show(v)}`);
  return v as number;
}
export function needStr(v: unknown, what: string): string {
  if (typeof v !== "string") fail(`${what} must be text, not ${show(v)}`);
  return v as string;
}
export function needWidth(v: unknown, what: string, ctx: FilterCtx): number {
  const n = needNum(v, what);
  if (!Number.isInteger(n) || n < 0 || n > ctx.maxWidth) fail(`${what} must be a whole number from 0 to ${ctx.maxWidth}, not ${n}`);
  return n;
}

export function show(v: unknown): string {
  if (v === null || v === undefined) return "nothing";
  if (Array.isArray(v)) return "a list";
  if (typeof v === "string") return `text "${v.length > 20 ? v.slice(0, 20) + "…" : v}"`;
  if (typeof v === "object") return "an object";
  return `${typeof v === "number" ? "the number" : ""} ${String(v)}`.trim();
}

/** How a value prints when it reaches the output. */
export function toText(v: unknown): string {
  if (typeof v === "string") return v;
  if (typeof v === "number") return Number.isFinite(v) ? String(v) : fail(`cannot print ${v}`);
  if (typeof v === "boolean") return v ? "true" : "false";
  if (v === null || v === undefined) return fail("this value is missing here; guard it with 'when' or add '|> default(…)'");
  return fail(`cannot print ${show(v)} directly; use '|> join(…)', '|> json' or a field`);
}

// Case conversions see the same few enum values over and over: remember them (bounded).
const snakeMemo = new Map<string, string>();
function snakeCase(s: string): string {
  let r = snakeMemo.get(s);
  if (r === undefined) {
    r = words(s).join("_").toLowerCase();
    if (snakeMemo.size > 4096) snakeMemo.clear();
    snakeMemo.set(s, r);
  }
  return r;
}

const upperMemo = new Map<string, string>();
function upperCase(s: string): string {
  if (s.length > 64) return s.toUpperCase();
  let r = upperMemo.get(s);
  if (r === undefined) {
    r = s.toUpperCase();
    if (upperMemo.size > 4096) upperMemo.clear();
    upperMemo.set(s, r);
  }
  return r;
}

function words(s: string): string[] {
  return s
    .replace(/([a-z0-9])([A-Z])/g, "$1 $2")
    .replace(/([A-Z]+)([A-Z][a-z])/g, "$1 $2")
    .split(/[^A-Za-z0-9]+/)
    .filter(Boolean);
}

function getField(item: unknown, key: string): unknown {
  if (item === null || typeof item !== "object" || Array.isArray(item)) return undefined;
  return Object.prototype.hasOwnProperty.call(item, key) ? (item as Record<string, unknown>)[key] : undefined;
}

const elem = (t: Ty): Ty => (t.k === "list" ? t.of : { k: "any" });

const GENERAL: [string, FilterDef][] = [
  ["upper", { min: 0, max: 0, input: "str", out: keepFree, fn: (v) => upperCase(needStr(v, "the input")) }],
  ["lower", { min: 0, max: 0, input: "str", out: keepFree, fn: (v) => needStr(v, "the input").toLowerCase() }],
  ["snake", { min: 0, max: 0, input: "str", out: keepFree, fn: (v) => snakeCase(needStr(v, "the input")) }],
  ["text", { min: 0, max: 0, input: "any", out: keepFree, fn: (v) => toText(v) }],
  [
    "pad",
    {
      min: 1,
      max: 3,
      input: "any",
      out: keepFree,
      fn: (v, [width, align = "left", fill = " "], ctx) => {
        const w = needWidth(width, "the width of 'pad'", ctx);
        const f = needStr(fill, "the fill of 'pad'");
        if ([...f].length !== 1) fail("the fill of 'pad' must be one character");
        const s = toText(v);
        if (align === "left") return s.padEnd(w, f);
        if (align === "right") return s.padStart(w, f);
        if (align === "center") return s.padStart(s.length + Math.floor(Math.max(0, w - s.length) / 2), f).padEnd(w, f);
        return fail(`the alignment of 'pad' is "left", "right" or "center", not ${show(align)}`);
      },
    },
  ],
  [
    "join",
    {
      min: 0,
      max: 1,
      input: "list",
      out: (t) => (t.k === "list" && t.of.k === "str" && t.of.free ? FREE_STR : STR),
      fn: (v, [sep = ", "]) => {
        if (!Array.isArray(v)) fail(`'join' needs a list, not ${show(v)}`);
        const s = needStr(sep, "the separator of 'join'");
        return (v as unknown[]).map(toText).join(s);
      },
    },
  ],
  [
    "default",
    {
      min: 1,
      max: 1,
      input: "any",
      out: (t) => (t.k === "str" || t.k === "num" || t.k === "bool" ? ({ ...t, maybe: false } as Ty) : { k: "any" }),
      fn: (v, [fallback]) => (v === null || v === undefined || v === "" ? fallback : v),
    },
  ],
  [
    "count",
    {
      min: 0,
      max: 0,
      input: "any",
      out: () => NUM,
      fn: (v) => {
        if (Array.isArray(v) || typeof v === "string") return v.length;
        if (v !== null && typeof v === "object") return Object.keys(v).length;
        return fail(`'count' needs a list, text or table, not ${show(v)}`);
      },
    },
  ],
  [
    "entries",
    {
      min: 0,
      max: 0,
      input: "any",
      out: (t) => ({
        k: "list",
        of: { k: "obj", name: "entry", fields: new Map<string, Ty>([["key", STR], ["value", t.k === "record" ? t.of : { k: "any" }]]) },
      }),
      fn: (v) => {
        if (v === null || typeof v !== "object" || Array.isArray(v)) fail(`'entries' needs a keyed table, not ${show(v)}`);
        return Object.keys(v as object).map((key) => ({ key, value: (v as Record<string, unknown>)[key] }));
      },
    },
  ],
  [
    "find",
    {
      min: 2,
      max: 2,
      input: "list",
      out: (t) => ({ ...elem(t), maybe: true }) as Ty,
      fn: (v, [key, value]) => {
        if (!Array.isArray(v)) fail(`'find' needs a list, not ${show(v)}`);
        const k = needStr(key, "the field name of 'find'");
        return (v as unknown[]).find((item) => getField(item, k) === value) ?? null;
      },
    },
  ],
  [
    "indexof",
    {
      min: 2,
      max: 2,
      input: "list",
      out: () => NUM,
      fn: (v, [key, value]) => {
        if (!Array.isArray(v)) fail(`'indexof' needs a list, not ${show(v)}`);
        const k = needStr(key, "the field name of 'indexof'");
        return (v as unknown[]).findIndex((item) => getField(item, k) === value);
      },
    },
  ],
  [
    "contains",
    { min: 1, max: 1, input: "any", out: () => BOOL, fn: (v, [x]) => (Array.isArray(v) ? v.includes(x) : typeof v === "string" ? v.includes(needStr(x, "the argument of 'contains'")) : fail(`'contains' needs a list or text, not ${show(v)}`)) },
  ],
  [
    "round",
    {
      min: 0,
      max: 1,
      input: "num",
      out: () => NUM,
      fn: (v, [digits = 0], ctx) => {
        const d = needWidth(digits, "the digits of 'round'", ctx);
        if (d > 15) fail("'round' keeps at most 15 digits");
        const f = 10 ** d;
        return Math.round(needNum(v, "the input of 'round'") * f) / f;
      },
    },
  ],
  [
    "fixed",
    {
      min: 1,
      max: 1,
      input: "num",
      out: () => STR,
      fn: (v, [digits], ctx) => {
        const d = needWidth(digits, "the digits of 'fixed'", ctx);
        if (d > 20) fail("'fixed' shows at most 20 digits after the point");
        return needNum(v, "the input of 'fixed'").toFixed(d);
      },
    },
  ],
  [
    "q",
    {
      min: 1,
      max: 1,
      input: "num",
      out: () => NUM,
      fn: (v, [bits], ctx) => {
        const b = needWidth(bits, "the fraction bits of 'q'", ctx);
        if (b > 30) fail("'q' uses at most 30 fraction bits");
        const scaled = Math.round(needNum(v, "the input of 'q'") * 2 ** b);
        if (!Number.isSafeInteger(scaled)) fail("the fixed-point value is too large");
        return scaled;
      },
    },
  ],
  ["ms", { min: 0, max: 0, input: "num", out: () => STR, fn: (v) => `${trimNum(needNum(v, "the input of 'ms'"))} ms` }],
  ["seconds", { min: 0, max: 0, input: "num", out: () => STR, fn: (v) => `${trimNum(needNum(v, "the input of 'seconds'") / 1000)} s` }],
  ["px", { min: 0, max: 0, input: "num", out: () => STR, fn: (v) => { const n = needNum(v, "the input of 'px'"); return `${trimNum(n)} px`; } }],
  ["percent", { min: 0, max: 0, input: "num", out: () => STR, fn: (v) => `${trimNum(needNum(v, "the input of 'percent'") * 100)} %` }],
  // JSON of model data carries the model's text as it is (a "*/" or "??/" included): free text.
  ["json", { min: 0, max: 1, input: "any", out: () => FREE_STR, fn: (v, [indent = 0], ctx) => JSON.stringify(v, null, Math.min(10, needWidth(indent, "the indent of 'json'", ctx))) ?? "null" }],
];

function trimNum(n: number): string {
  return String(Math.round(n * 1000) / 1000);
}

export const GENERAL_FILTERS = GENERAL;
