// Stage 3a: expressions are type-checked against the schema-derived types and turned into
// closures in one walk. No JavaScript source is generated; field reads go through fixed key
// paths computed here, and keys that name Object.prototype members are always missing.
import type { Expr } from "./ast";
import { suggest } from "./errors";
import { FilterError, show, type FilterDef, type InputKind } from "./filters";
import { FILTERS } from "./filtertable";
import { renderFail, report, step, work, type Env, type Ev } from "./scope";
import { ANY, BOOL, describe, FREE_STR, LOOP_FIELDS, NUM, STR, type Ty } from "./types";

const hasOwn = Object.prototype.hasOwnProperty;
/**
 * The "may be missing" variant of a type, made once per type: types are never changed after they
 * are built, so every field access can share the copy instead of spreading a new object.
 */
const MAYBE = new WeakMap<Ty, Ty>();
function maybeOf(ty: Ty): Ty {
  if ("maybe" in ty && ty.maybe) return ty;
  let m = MAYBE.get(ty);
  if (!m) MAYBE.set(ty, (m = Object.freeze({ ...ty, maybe: true }) as Ty));
  return m;
}

const PROTO_KEYS = new Set(Object.getOwnPropertyNames(Object.prototype).concat(["__proto__", "prototype", "constructor"]));

// Passing a closure through a call keeps it anonymous, which keeps dev-time transforms that
// name every function (tsx, vitest) from adding a property definition to each one.
const anon = <T>(f: T): T => f;

/** A plain-data read: objects only, own keys only for anything that could reach a prototype. */
export function readKey(o: unknown, k: string): unknown {
  if (o === null || typeof o !== "object" || Array.isArray(o)) return undefined;
  if (PROTO_KEYS.has(k)) return hasOwn.call(o, k) ? (o as Record<string, unknown>)[k] : undefined;
  return (o as Record<string, unknown>)[k];
}

export function truthy(v: unknown): boolean {
  if (Array.isArray(v)) return v.length > 0;
  return v !== null && v !== undefined && v !== false && v !== 0 && v !== "";
}

/** Span used for errors: inside an external partial, errors point at its `use` in the root. */
export function span(env: Env, from: number, to: number): [number, number] {
  return env.unit.site ? [env.unit.site.from, env.unit.site.to] : [from, to];
}
/** The two ends of `span` without the pair: one is asked for per node and expression. */
export function spanFrom(env: Env, from: number): number {
  return env.unit.site ? env.unit.site.from : from;
}
export function spanTo(env: Env, to: number): number {
  return env.unit.site ? env.unit.site.to : to;
}

export interface Compiled {
  ev: Ev;
  ty: Ty;
  /** True when the value went through a filter that makes it safe for C source. */
  cSafe: boolean;
}

export function compileExpr(env: Env, e: Expr): Compiled {
  work(env);
  switch (e.k) {
    case "lit": {
      const v = e.value;
      const ty: Ty = v === null ? { k: "null" } : typeof v === "number" ? NUM : typeof v === "boolean" ? BOOL : STR;
      return { ev: anon(() => v), ty, cSafe: typeof v !== "string" };
    }
    case "var": {
      const found = env.scope.lookup(e.name);
      if (!found) {
        const hint = suggest(e.name, env.scope.names());
        report(env, `unknown name '${e.name}'${hint ? ` — did you mean '${hint}'?` : ""} (the model is under 'config', build details under 'meta')`, e.from, e.to);
        return { ev: anon(() => undefined), ty: ANY, cSafe: false };
      }
      const slot = found.slot;
      return { ev: anon((c) => c.f[slot]), ty: found.ty, cSafe: false };
    }
    case "get":
      return compileGet(env, e);
    case "index": {
      const obj = compileExpr(env, e.obj);
      const key = compileExpr(env, e.key);
      let ty: Ty = ANY;
      if (obj.ty.k === "list") ty = maybeOf(obj.ty.of);
      else if (obj.ty.k === "record") ty = maybeOf(obj.ty.of);
      else if (obj.ty.k !== "any" && obj.ty.k !== "obj") report(env, `${describe(obj.ty)} cannot be indexed with [ ]`, e.from, e.to);
      const from = spanFrom(env, e.key.from);
      const to = spanTo(env, e.key.to);
      const o = obj.ev;
      const k = key.ev;
      return {
        ty,
        cSafe: false,
        ev: anon((c) => {
          const target = o(c);
          const kv = k(c);
          if (Array.isArray(target)) return typeof kv === "number" && Number.isInteger(kv) && kv >= 0 && kv < target.length ? target[kv] : undefined;
          if (typeof kv !== "string") throw renderFail(`an index must be text or a whole number, not ${show(kv)}`, from, to);
          return target !== null && typeof target === "object" && hasOwn.call(target, kv) ? (target as Record<string, unknown>)[kv] : undefined;
        }),
      };
    }
    case "unary": {
      const arg = compileExpr(env, e.arg);
      const a = arg.ev;
      if (e.op === "not") return { ev: anon((c) => !truthy(a(c))), ty: BOOL, cSafe: true };
      expectNum(env, arg.ty, "'-'", e.arg.from, e.arg.to);
      const from = spanFrom(env, e.from);
      const to = spanTo(env, e.to);
      return {
        ty: NUM,
        cSafe: true,
        ev: anon((c) => {
          const v = a(c);
          if (typeof v !== "number") throw renderFail(`'-' needs a number, not ${show(v)}`, from, to);
          return -v;
        }),
      };
    }
    case "binary":
      return compileBinary(env, e);
    case "filter":
      return compileFilter(env, e);
  }
}

function compileGet(env: Env, e: Extract<Expr, { k: "get" }>): Compiled {
  // Collapse a chain a.b.c into one closure over its keys. Chains of one or two keys (nearly
  // all of them) are read without arrays.
  // A chain on a variable (nearly all of them) reads the variable's slot itself: one closure
  // for `l.range.start`, not one per step.
  const inner = e.obj;
  if (inner.k !== "get" || inner.obj.k === "get") {
    if (inner.k !== "get") {
      const v = inner.k === "var" ? env.scope.lookup(inner.name) : undefined;
      if (v && !PROTO_KEYS.has(e.key)) return { ev: slotRead1(v.slot, e.key), ty: fieldType(env, v.ty, e.key, e.keyFrom, e.to), cSafe: false };
      const root = compileExpr(env, inner);
      const ty = fieldType(env, root.ty, e.key, e.keyFrom, e.to);
      return { ev: PROTO_KEYS.has(e.key) ? readChain(root.ev, [e.key]) : read1(root.ev, e.key), ty, cSafe: false };
    }
  } else {
    const base = inner.obj;
    const v = base.k === "var" ? env.scope.lookup(base.name) : undefined;
    const plain = !PROTO_KEYS.has(inner.key) && !PROTO_KEYS.has(e.key);
    if (v && plain) {
      const mid = fieldType(env, v.ty, inner.key, inner.keyFrom, inner.to);
      return { ev: slotRead2(v.slot, inner.key, e.key), ty: fieldType(env, mid, e.key, e.keyFrom, e.to), cSafe: false };
    }
    const root = compileExpr(env, base);
    const mid = fieldType(env, root.ty, inner.key, inner.keyFrom, inner.to);
    const ty = fieldType(env, mid, e.key, e.keyFrom, e.to);
    const ev = plain ? read2(root.ev, inner.key, e.key) : readChain(root.ev, [inner.key, e.key]);
    return { ev, ty, cSafe: false };
  }
  let base: Expr = e;
  let depth = 0;
  while (base.k === "get") {
    depth++;
    base = base.obj;
  }
  // The chain, outermost read last: filled from the end, no array shifting.
  const gets: Extract<Expr, { k: "get" }>[] = new Array(depth);
  for (let g: Expr = e, i = depth - 1; g.k === "get"; g = g.obj, i--) gets[i] = g;
  const keys: string[] = new Array(depth);
  const root = compileExpr(env, base);
  let ty = root.ty;
  for (let i = 0; i < depth; i++) {
    const g = gets[i];
    keys[i] = g.key;
    ty = fieldType(env, ty, g.key, g.keyFrom, g.to);
  }
  return { ev: readChain(root.ev, keys), ty, cSafe: false };
}

// Keys are fixed at compile time, so only keys that could reach a prototype pay for the
// own-key check of `readKey`.
function read1(r: Ev, k0: string): Ev {
  return (c) => {
    const o = r(c);
    return o !== null && typeof o === "object" && !Array.isArray(o) ? (o as Record<string, unknown>)[k0] : undefined;
  };
}

function slotRead1(slot: number, k0: string): Ev {
  return (c) => {
    const o = c.f[slot];
    return o !== null && typeof o === "object" && !Array.isArray(o) ? (o as Record<string, unknown>)[k0] : undefined;
  };
}

function slotRead2(slot: number, k0: string, k1: string): Ev {
  return (c) => {
    const o = c.f[slot];
    const m = o !== null && typeof o === "object" && !Array.isArray(o) ? (o as Record<string, unknown>)[k0] : undefined;
    return m !== null && typeof m === "object" && !Array.isArray(m) ? (m as Record<string, unknown>)[k1] : undefined;
  };
}

function read2(r: Ev, k0: string, k1: string): Ev {
  return (c) => {
    const o = r(c);
    const m = o !== null && typeof o === "object" && !Array.isArray(o) ? (o as Record<string, unknown>)[k0] : undefined;
    return m !== null && typeof m === "object" && !Array.isArray(m) ? (m as Record<string, unknown>)[k1] : undefined;
  };
}

function readChain(r: Ev, keys: string[]): Ev {
  return (c) => {
    let v = r(c);
    for (let i = 0; i < keys.length; i++) v = readKey(v, keys[i]);
    return v;
  };
}

function fieldType(env: Env, ty: Ty, key: string, from: number, to: number): Ty {
  if (ty.k === "any") return ANY;
  // A plain read rather than `in`: types are plain objects and no prototype has a 'maybe'.
  const maybe = (ty as { maybe?: boolean }).maybe;
  let out: Ty | undefined;
  if (ty.k === "obj") {
    out = ty.fields.get(key);
    if (!out || PROTO_KEYS.has(key)) {
      const hint = suggest(key, ty.fields.keys());
      report(env, `unknown field '${key}' on ${ty.name}${hint ? ` — did you mean '${hint}'?` : ""}`, from, to);
      return ANY;
    }
  } else if (ty.k === "loop") {
    out = LOOP_FIELDS.get(key);
    if (!out || PROTO_KEYS.has(key)) {
      const hint = suggest(key, LOOP_FIELDS.keys());
      report(env, `unknown field '${key}' on loop information${hint ? ` — did you mean '${hint}'?` : ""} (index, number, first, last, length)`, from, to);
      return ANY;
    }
  } else if (ty.k === "record") {
    out = ty.of;
    return maybeOf(out);
  } else {
    report(env, `${describe(ty)} has no field '${key}'${ty.k === "list" ? "; use '|> count' for its length" : ""}`, from, to);
    return ANY;
  }
  return maybe ? maybeOf(out) : out;
}

function expectNum(env: Env, ty: Ty, what: string, from: number, to: number) {
  if (ty.k !== "num" && ty.k !== "any") report(env, `${what} needs a number, not ${describe(ty)}`, from, to);
}

function compileBinary(env: Env, e: Extract<Expr, { k: "binary" }>): Compiled {
  const L = compileExpr(env, e.left);
  const R = compileExpr(env, e.right);
  const l = L.ev;
  const r = R.ev;
  const op = e.op;
  const from = spanFrom(env, e.from);
  const to = spanTo(env, e.to);
  if (op === "and") return { ty: BOOL, cSafe: true, ev: anon((c) => truthy(l(c)) && truthy(r(c))) };
  if (op === "or") return { ty: BOOL, cSafe: true, ev: anon((c) => truthy(l(c)) || truthy(r(c))) };
  if (op === "==") return { ty: BOOL, cSafe: true, ev: anon((c) => same(l(c), r(c))) };
  if (op === "!=") return { ty: BOOL, cSafe: true, ev: anon((c) => !same(l(c), r(c))) };
  if (op === "<" || op === "<=" || op === ">" || op === ">=") {
    if (L.ty.k !== "any" && R.ty.k !== "any" && (L.ty.k !== R.ty.k || (L.ty.k !== "num" && L.ty.k !== "str")))
      report(env, `'${op}' compares two numbers or two texts, not ${describe(L.ty)} and ${describe(R.ty)}`, e.from, e.to);
    const sign = op === "<" ? -1 : op === ">" ? 1 : 0;
    const orEqual = op === "<=" || op === ">=";
    const orSign = op === "<=" ? -1 : 1;
    return {
      ty: BOOL,
      cSafe: true,
      ev: anon((c) => {
        const a = l(c);
        const b = r(c);
        if (!((typeof a === "number" && typeof b === "number") || (typeof a === "string" && typeof b === "string")))
          throw renderFail(`'${op}' compares two numbers or two texts, not ${show(a)} and ${show(b)}`, from, to);
        const d = a < b ? -1 : a > b ? 1 : 0;
        return orEqual ? d === 0 || d === orSign : d === sign;
      }),
    };
  }
  expectNum(env, L.ty, `'${op}'`, e.left.from, e.left.to);
  expectNum(env, R.ty, `'${op}'`, e.right.from, e.right.to);
  return {
    ty: NUM,
    cSafe: true,
    ev: anon((c) => {
      const a = l(c);
      const b = r(c);
      if (typeof a !== "number" || typeof b !== "number") throw renderFail(`'${op}' needs two numbers, not ${show(a)} and ${show(b)}`, from, to);
      const v = arith(op, a, b);
      if (!Number.isFinite(v)) throw renderFail(`'${op}' gave ${v} (division by zero?)`, from, to);
      return v;
    }),
  };
}

function arith(op: string, a: number, b: number): number {
  switch (op) {
    case "+":
      return a + b;
    case "-":
      return a - b;
    case "*":
      return a * b;
    case "/":
      return a / b;
    default:
      return a % b;
  }
}

function same(a: unknown, b: unknown): boolean {
  return a === b || ((a === null || a === undefined) && (b === null || b === undefined));
}

function wrapFilterError(err: unknown, name: string, from: number, to: number): unknown {
  return err instanceof FilterError ? renderFail(`filter '${name}': ${err.message}`, from, to) : err;
}

function accepts(kind: InputKind, ty: Ty): boolean {
  if (kind === "any" || ty.k === "any") return true;
  if (kind === "str" || kind === "color") return ty.k === "str";
  if (kind === "num") return ty.k === "num";
  if (kind === "list" || kind === "strlist") return ty.k === "list";
  return true;
}

const KIND_WORDS: Record<InputKind, string> = { any: "any value", str: "text", num: "a number", list: "a list", strlist: "a list of text", color: "a #rrggbb colour" };

const NO_ARGS: readonly Compiled[] = Object.freeze([]);
const NO_EVS: readonly Ev[] = Object.freeze([]);

function compileFilter(env: Env, e: Extract<Expr, { k: "filter" }>): Compiled {
  const input = compileExpr(env, e.input);
  // Most filters take no arguments: no arrays for them (these two are only ever read).
  const args = e.args.length === 0 ? NO_ARGS : e.args.map((a) => compileExpr(env, a));
  const def: FilterDef | undefined = FILTERS.get(e.name);
  if (!def) {
    const hint = suggest(e.name, FILTERS.keys());
    report(env, `unknown filter '${e.name}'${hint ? ` — did you mean '${hint}'?` : ""}`, e.nameFrom, e.nameTo);
    return { ev: anon(() => undefined), ty: ANY, cSafe: false };
  }
  if (args.length < def.min || args.length > def.max) {
    const want = def.min === def.max ? `${def.min}` : `${def.min} to ${def.max}`;
    report(env, `filter '${e.name}' takes ${want} argument${def.max === 1 && def.min === 1 ? "" : "s"}, got ${args.length}`, e.nameFrom, e.to);
  }
  if (!accepts(def.input, input.ty)) report(env, `filter '${e.name}' needs ${KIND_WORDS[def.input]}, but gets ${describe(input.ty)}`, e.nameFrom, e.nameTo);
  const fn = def.fn;
  const inp = input.ev;
  const from = spanFrom(env, e.nameFrom);
  const to = spanTo(env, e.nameTo);
  const argEvs = args.length === 0 ? NO_EVS : args.map((a) => a.ev);
  const name = e.name;
  let ev: Ev;
  if (argEvs.length === 0) {
    const none: unknown[] = [];
    ev = anon((c) => {
      step(c, from, to);
      try {
        return fn(inp(c), none, c);
      } catch (err) {
        throw wrapFilterError(err, name, from, to);
      }
    });
  } else if (argEvs.length === 1) {
    const a0 = argEvs[0];
    ev = anon((c) => {
      step(c, from, to);
      const vs = [a0(c)];
      try {
        return fn(inp(c), vs, c);
      } catch (err) {
        throw wrapFilterError(err, name, from, to);
      }
    });
  } else {
    ev = anon((c) => {
      step(c, from, to);
      const vs = argEvs.map((a) => a(c));
      try {
        return fn(inp(c), vs, c);
      } catch (err) {
        throw wrapFilterError(err, name, from, to);
      }
    });
  }
  let ty = def.out(input.ty);
  // 'default' can answer with its argument: free text there makes the result free text too.
  if (name === "default" && args.length === 1) {
    const alt = args[0].ty;
    if (alt.k === "str" && alt.free && !args[0].cSafe) ty = FREE_STR;
    else if (alt.k !== "any" && alt.k !== ty.k && ty.k !== "any") ty = ANY;
  }
  return { ev, ty, cSafe: !!def.cSafe || (input.cSafe && ty.k !== "str") };
}
