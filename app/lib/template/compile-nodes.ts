// Stage 3b: statements become closures that append to one output string. Pieces and other
// templates are expanded at compile time (a cycle is a compile error, so render never
// recurses); every loop pass, piece use, and appended byte is charged to the render budget.
import type { Node } from "./ast";
import { suggest } from "./errors";
import { compileExpr, spanFrom, spanTo, truthy } from "./compile-expr";
import { show, toText } from "./filters";
import { parseCached } from "./cache";
import { bind, CompileBudget, renderFail, report, Scope, step, work, type Ctx, type Env, type Run, type Unit } from "./scope";
import type { Ty } from "./types";

/**
 * A nested environment. Written out field by field: an object spread of the environment was the
 * largest single cost of checking a template, and every block makes one.
 */
function withScope(env: Env, scope: Scope, unit: Unit = env.unit, stack: string[] = env.stack): Env {
  return {
    unit,
    scope,
    slots: env.slots,
    limits: env.limits,
    target: env.target,
    diags: env.diags,
    stack,
    expansions: env.expansions,
    work: env.work,
    resolve: env.resolve,
  };
}

export function compileBody(env: Env, nodes: Node[]): Run {
  const runs: Run[] = [];
  // Only 'let' binds into the block's own scope; most blocks have none and share the outer one.
  let binds = false;
  for (let i = 0; i < nodes.length && !binds; i++) binds = nodes[i].k === "let";
  const inner: Env = binds ? withScope(env, new Scope(env.scope)) : env;
  for (const n of nodes) {
    const r = compileNode(inner, n);
    if (r) runs.push(r);
  }
  if (runs.length === 0) return () => {};
  if (runs.length === 1) return runs[0];
  return (c) => {
    for (let i = 0; i < runs.length; i++) runs[i](c);
  };
}

function appendChecked(c: Ctx, s: string, from: number, to: number) {
  c.out += s;
  if (c.out.length > c.maxOutput) throw renderFail(`output is larger than the limit of ${c.maxOutput} characters`, from, to);
}


// Each case that makes a closure does it in a function of its own, so a call allocates only
// the captured variables of its own kind of node.
function compileNode(env: Env, n: Node): Run | null {
  work(env);
  switch (n.k) {
    case "text":
      return compileText(n.value, spanFrom(env, n.from), spanTo(env, n.to));
    case "out":
      return compileOut(env, n, spanFrom(env, n.from), spanTo(env, n.to));
    case "if": {
      const conds = n.branches.map((b) => compileExpr(env, b.cond).ev);
      const bodies = n.branches.map((b) => compileBody(env, b.body));
      const otherwise = n.otherwise ? compileBody(env, n.otherwise) : null;
      if (conds.length === 1) {
        const [c0] = conds;
        const [b0] = bodies;
        return (c) => {
          if (truthy(c0(c))) b0(c);
          else if (otherwise) otherwise(c);
        };
      }
      return (c) => {
        for (let i = 0; i < conds.length; i++) {
          if (truthy(conds[i](c))) return bodies[i](c);
        }
        if (otherwise) otherwise(c);
      };
    }
    case "over":
      return compileOver(env, n, spanFrom(env, n.from), spanTo(env, n.to));
    case "let": {
      const x = compileExpr(env, n.value);
      if (n.name === "config" || n.name === "meta") {
        report(env, `'${n.name}' is the model itself and cannot be assigned`, n.from, n.to);
        return null;
      }
      // 'let' updates the nearest variable of that name, so counters can run across loops.
      const existing = env.scope.lookup(n.name);
      if (existing && existing.ty.k !== x.ty.k) existing.ty = { k: "any" };
      const slot = existing ? existing.slot : bind(env, env.scope, n.name, x.ty);
      const ev = x.ev;
      return (c) => {
        c.f[slot] = ev(c);
      };
    }
    case "use":
      return compileUse(env, n, spanFrom(env, n.from), spanTo(env, n.to));
  }
}

function compileText(s: string, from: number, to: number): Run {
  return (c) => appendChecked(c, s, from, to);
}

function compileOut(env: Env, n: Extract<Node, { k: "out" }>, from: number, to: number): Run {
  const x = compileExpr(env, n.expr);
  checkCOutput(env, x, n.from, n.to);
  if (x.ty.k === "list" || x.ty.k === "obj" || x.ty.k === "record")
    report(env, `cannot print ${x.ty.k === "obj" ? `a whole ${x.ty.name}` : "a list or table"}; print one of its fields or use '|> join' / '|> json'`, n.expr.from, n.expr.to);
  const ev = x.ev;
  return (c) => {
    const v = ev(c);
    let s: string;
    if (typeof v === "string") s = v;
    else {
      try {
        s = toText(v);
      } catch (err) {
        throw renderFail((err as Error).message, from, to);
      }
    }
    appendChecked(c, s, from, to);
  };
}

/**
 * Under `target c`, model text printed without a C filter is an error (decision 011): a preset
 * name that closes a comment and opens an #include must never become C code. `|> raw` is the visible,
 * deliberate way out, for text a reviewer has agreed to print as it is.
 */
export const UNFILTERED_C_MESSAGE =
  "model text printed into C without a C filter: a name holding '*/', a quote or a backslash would become C code. Add '|> cstr' (a string literal), '|> ccomment' (inside a comment) or '|> cident' (an identifier); to print the text exactly as it is, say so with '|> raw'";

function checkCOutput(env: Env, x: { ty: Ty; cSafe: boolean }, from: number, to: number) {
  if (env.target === "c" && x.ty.k === "str" && x.ty.free && !x.cSafe) report(env, UNFILTERED_C_MESSAGE, from, to);
}

function compileOver(env: Env, n: Extract<Node, { k: "over" }>, from: number, to: number): Run {
  const list = compileExpr(env, n.list);
  let elem: Ty = { k: "any" };
  if (list.ty.k === "list") elem = list.ty.of;
  else if (list.ty.k === "record") report(env, "'over' walks a list; for a keyed table use '|> entries' (items have .key and .value)", n.list.from, n.list.to);
  else if (list.ty.k !== "any") report(env, `'over' needs a list, not ${list.ty.k === "obj" ? `a ${list.ty.name}` : list.ty.k === "str" ? "text" : "a single value"}`, n.list.from, n.list.to);
  const scope = new Scope(env.scope);
  const inner: Env = withScope(env, scope);
  const itemSlot = bind(inner, scope, n.item, elem);
  const infoSlot = n.info ? bind(inner, scope, n.info, { k: "loop" }) : -1;
  const body = compileBody(inner, n.body);
  const none = n.none ? compileBody(env, n.none) : null;
  const ev = list.ev;
  const lf = spanFrom(env, n.list.from);
  const lt = spanTo(env, n.list.to);
  return (c) => {
    const items = ev(c);
    if (!Array.isArray(items)) {
      if (items === null || items === undefined) {
        if (none) none(c);
        return;
      }
      throw renderFail(`'over' needs a list, not ${show(items)}`, lf, lt);
    }
    const len = items.length;
    if (len === 0) {
      if (none) none(c);
      return;
    }
    for (let i = 0; i < len; i++) {
      step(c, from, to);
      c.f[itemSlot] = items[i];
      if (infoSlot >= 0) c.f[infoSlot] = { index: i, number: i + 1, first: i === 0, last: i === len - 1, length: len };
      body(c);
    }
  };
}

function compileUse(env: Env, n: Extract<Node, { k: "use" }>, from: number, to: number): Run {
  const label = n.external ? `"${n.name}"` : n.name;
  if (env.stack.includes(label)) {
    report(env, `partial cycle: ${[...env.stack, label].join(" → ")}`, n.from, n.to);
    return () => {};
  }
  if (env.stack.length >= env.limits.maxPartialDepth) {
    report(env, `partials are nested deeper than the limit of ${env.limits.maxPartialDepth}`, n.from, n.to);
    return () => {};
  }
  if (++env.expansions.n > env.limits.maxExpansions) {
    if (env.expansions.n === env.limits.maxExpansions + 1) report(env, `more than the limit of ${env.limits.maxExpansions} partial expansions`, n.from, n.to);
    return () => {};
  }
  let unit: Unit = env.unit;
  let params: { name: string; fallback: import("./ast").Expr | null }[];
  let bodyNodes: Node[];
  if (n.external) {
    const src = env.resolve?.(n.name);
    if (typeof src !== "string") {
      report(env, `no template named "${n.name}" is available to use`, n.from, n.to);
      return () => {};
    }
    const parsed = parseCached(src, env.limits);
    if (parsed.errors.length) {
      const e = parsed.errors[0];
      report(env, `template "${n.name}" has errors: ${e.message} (at ${e.line}:${e.column})`, n.from, n.to);
      return () => {};
    }
    unit = { name: n.name, source: src, ast: parsed.ast!, site: env.unit.site ?? { from: n.from, to: n.to } };
    params = n.args.map((a) => ({ name: a.name, fallback: null }));
    bodyNodes = parsed.ast!.body;
  } else {
    const def = env.unit.ast.pieces.get(n.name);
    if (!def) {
      const hint = suggest(n.name, env.unit.ast.pieces.keys());
      report(env, `unknown piece '${n.name}'${hint ? ` — did you mean '${hint}'?` : ""}`, n.from, n.to);
      return () => {};
    }
    params = def.params;
    bodyNodes = def.body;
  }
  const argRuns: { slot: number; ev: (c: Ctx) => unknown }[] = [];
  // Pieces see the model, the build details and their parameters, nothing of the caller.
  const scope = new Scope(rootScopeOf(env.scope));
  const inner: Env = withScope(env, scope, unit, [...env.stack, label]);
  const given = new Map(n.args.map((a) => [a.name, a]));
  for (const a of n.args) {
    if (!params.some((p) => p.name === a.name)) {
      const hint = suggest(a.name, params.map((p) => p.name));
      report(env, `piece '${n.name}' has no parameter '${a.name}'${hint ? ` — did you mean '${hint}'?` : ""}`, a.from, a.from + a.name.length);
    }
  }
  for (const p of params) {
    const a = given.get(p.name);
    const x = a ? compileExpr(env, a.value) : p.fallback ? compileExpr(inner, p.fallback) : null;
    if (!x) report(env, `piece '${n.name}' needs the parameter '${p.name}'`, n.from, n.to);
    argRuns.push({ slot: bind(inner, scope, p.name, x?.ty ?? { k: "any" }), ev: x?.ev ?? (() => undefined) });
  }
  let body: Run;
  try {
    body = compileBody(inner, bodyNodes);
  } catch (e) {
    if (e instanceof CompileBudget && !env.unit.site) {
      e.from = n.from;
      e.to = n.to;
    }
    throw e;
  }
  return (c) => {
    step(c, from, to);
    // Parameter slots are fresh and pieces never recurse, so arguments can land in place.
    for (let i = 0; i < argRuns.length; i++) c.f[argRuns[i].slot] = argRuns[i].ev(c);
    body(c);
  };
}

function rootScopeOf(s: Scope): Scope {
  let r = s;
  while (r.parent) r = r.parent;
  return r;
}
