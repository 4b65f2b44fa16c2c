// Compile-time state shared by the expression and node compilers: lexical scopes that map
// names to frame slots, the render context the closures run against, and error reporting.
import type { TemplateAst } from "./ast";
import { TemplateFailure, type Severity } from "./errors";
import type { FilterCtx } from "./filters";
import type { Limits } from "./limits";
import type { Ty } from "./types";

/** Render-time state. Closures take this one argument so calls stay cheap. */
export interface Ctx extends FilterCtx {
  f: unknown[];
  out: string;
  steps: number;
  maxSteps: number;
  maxOutput: number;
  deadline: number;
}

export type Ev = (c: Ctx) => unknown;
export type Run = (c: Ctx) => void;

export class Scope {
  // Most blocks bind nothing; their table is made on the first binding.
  private table: Map<string, { slot: number; ty: Ty }> | null = null;
  constructor(readonly parent: Scope | null) {}
  get vars(): Map<string, { slot: number; ty: Ty }> {
    return (this.table ??= new Map());
  }
  own(name: string): { slot: number; ty: Ty } | undefined {
    return this.table?.get(name);
  }
  lookup(name: string): { slot: number; ty: Ty } | undefined {
    for (let s: Scope | null = this; s; s = s.parent) {
      const v = s.own(name);
      if (v) return v;
    }
    return undefined;
  }
  names(): string[] {
    const out: string[] = [];
    for (let s: Scope | null = this; s; s = s.parent) if (s.table) out.push(...s.table.keys());
    return out;
  }
}

export interface Unit {
  name: string | null;
  source: string;
  ast: TemplateAst;
  /** Where this unit was used from, in the root template, when it is an external partial. */
  site: { from: number; to: number } | null;
}

export interface Diag {
  severity: Severity;
  message: string;
  from: number;
  to: number;
}

export interface Env {
  unit: Unit;
  scope: Scope;
  slots: { n: number };
  limits: Limits;
  target: "text" | "c";
  diags: Diag[];
  /** Piece and template names being expanded, outermost first, for cycle and depth checks. */
  stack: string[];
  expansions: { n: number };
  /** Nodes and expressions compiled so far, charged against `limits.maxCompileNodes`. */
  work: { n: number };
  resolve?: (name: string) => string | undefined;
}

export function report(env: Env, message: string, from: number, to: number, severity: Severity = "error") {
  if (env.unit.site) {
    const pos = lineCol(env.unit.source, from);
    env.diags.push({ severity, message: `in template "${env.unit.name}" at ${pos}: ${message}`, from: env.unit.site.from, to: env.unit.site.to });
  } else env.diags.push({ severity, message, from, to });
}

function lineCol(source: string, offset: number): string {
  const before = source.slice(0, offset);
  const line = before.split("\n").length;
  return `${line}:${offset - before.lastIndexOf("\n")}`;
}

export function renderFail(message: string, from: number, to: number): TemplateFailure {
  return new TemplateFailure("render", message, from, to);
}

/**
 * Charges one step of render work (a loop pass, a piece use, a filter call) and looks at the
 * clock every 64 steps, so a render stops soon after its time limit whatever its steps cost.
 */
export function step(c: Ctx, from: number, to: number) {
  if (++c.steps > c.maxSteps) throw renderFail(`evaluation took more than the limit of ${c.maxSteps} steps (loop passes, piece uses, filter calls)`, from, to);
  if ((c.steps & 63) === 0 && Date.now() > c.deadline) throw renderFail("rendering took longer than the time limit", from, to);
}

/**
 * Thrown, not reported, when compiling passes `maxCompileNodes`: the rest is not compiled. On
 * its way out each `use` in the root template puts its own span on it, so the error ends up
 * pointing at the outermost use that was being expanded.
 */
export class CompileBudget extends Error {
  from = -1;
  to = -1;
}

/** Charges one node or expression of compile work. */
export function work(env: Env) {
  if (++env.work.n > env.limits.maxCompileNodes) throw new CompileBudget();
}

export function bind(env: Env, scope: Scope, name: string, ty: Ty): number {
  const existing = scope.own(name);
  if (existing) {
    existing.ty = existing.ty.k === ty.k ? ty : { k: "any" };
    return existing.slot;
  }
  const slot = env.slots.n++;
  scope.vars.set(name, { slot, ty });
  return slot;
}
