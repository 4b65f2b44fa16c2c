// The public face of the language: compile once (parse, check against the model's schema,
// build closures), render many times as a pure function of config, metadata and template.
import type { Config } from "../config/schema";
import { alsoClear, parseCached, parseTemplate } from "./cache";
import { cxxPortability } from "./check-cxx";
import { compileBody } from "./compile-nodes";
import { makeError, TemplateFailure, type TemplateError } from "./errors";
import { DEFAULT_LIMITS, type Limits } from "./limits";
import { CompileBudget, Scope, type Ctx, type Env, type Run } from "./scope";
import { CONFIG_TYPE, META_TYPE } from "./types";

export interface RenderMeta {
  buildName: string;
  clientName?: string;
  /** ISO 8601 time the revision was saved; templates never read the clock. */
  savedAt: string;
  revision?: number;
  templateName: string;
  templateVersion: number;
}

export interface CompiledTemplate {
  readonly source: string;
  readonly target: "text" | "c";
  /** @internal */
  readonly run: Run;
  /** @internal */
  readonly slotCount: number;
  readonly limits: Limits;
}

export interface CompileOptions {
  partials?: (name: string) => string | undefined;
  limits?: Partial<Limits>;
  /**
   * false: keep neither the parse nor the compiled template. For drafts compiled on every
   * keystroke, which would otherwise fill the caches with sources never seen again.
   */
  cache?: boolean;
}

export type CompileResult = { ok: true; template: CompiledTemplate; warnings: TemplateError[] } | { ok: false; errors: TemplateError[] };
export type RenderResult = { ok: true; output: string } | { ok: false; errors: TemplateError[] };

const CONFIG_SLOT = 0;
const META_SLOT = 1;

// Compiled templates hold no per-render state, so one without partials or custom limits is
// kept by source like its parse: a template version compiles once per process.
const MAX_COMPILED = 128;
const compiled = new Map<string, CompileResult>();
alsoClear(() => compiled.clear());

/** Forgets compiled templates (the parse cache is cleared separately). */
export function clearCompiled(): void {
  compiled.clear();
}

export function compileTemplate(source: string, opts: CompileOptions = {}): CompileResult {
  if (typeof source !== "string") return { ok: false, errors: [makeError("", "tokenize", "a template must be a string", 0)] };
  const cacheable = opts.partials === undefined && opts.limits === undefined && opts.cache !== false;
  if (cacheable) {
    const hit = compiled.get(source);
    if (hit) return hit;
  }
  const result = compileUncached(source, opts);
  if (cacheable) {
    compiled.set(source, result);
    if (compiled.size > MAX_COMPILED) compiled.delete(compiled.keys().next().value!);
  }
  return result;
}

function compileUncached(source: string, opts: CompileOptions): CompileResult {
  const limits: Limits = opts.limits ? { ...DEFAULT_LIMITS, ...opts.limits } : DEFAULT_LIMITS;
  const parsed = opts.cache === false ? parseTemplate(source, limits) : parseCached(source, limits);
  if (!parsed.ast) return { ok: false, errors: parsed.errors };
  const root = new Scope(null);
  root.vars.set("config", { slot: CONFIG_SLOT, ty: CONFIG_TYPE });
  root.vars.set("meta", { slot: META_SLOT, ty: META_TYPE });
  const env: Env = {
    unit: { name: null, source, ast: parsed.ast, site: null },
    scope: root,
    slots: { n: 2 },
    limits,
    target: parsed.ast.target,
    diags: [],
    stack: [],
    expansions: { n: 0 },
    work: { n: 0 },
    resolve: typeof opts.partials === "function" ? opts.partials : undefined,
  };
  let run: Run;
  try {
    run = compileBody(env, parsed.ast.body);
  } catch (e) {
    // Both stop the whole compile: what was reported so far is kept, the budget error added.
    const whole = Math.min(2, source.length);
    if (e instanceof CompileBudget)
      env.diags.push({
        severity: "error",
        message: `the template grows past the limit of ${limits.maxCompileNodes} nodes when its pieces and used templates are expanded; use fewer or smaller pieces`,
        from: e.from >= 0 ? e.from : 0,
        to: e.from >= 0 ? e.to : whole,
      });
    else if (e instanceof RangeError) env.diags.push({ severity: "error", message: "the template is nested too deeply to check", from: 0, to: whole });
    else throw e;
    run = () => {};
  }
  // C that only C compilers accept (decision 015): its own module, warnings only.
  if (env.target === "c") for (const w of cxxPortability(parsed.ast, source)) env.diags.push({ severity: "warning", ...w });
  const all = env.diags.map((d) => makeError(source, "check", d.message, d.from, d.to, d.severity));
  const errors = all.filter((d) => d.severity === "error");
  const warnings = all.filter((d) => d.severity === "warning");
  if (errors.length) return Object.freeze({ ok: false, errors: Object.freeze([...errors, ...warnings]) as TemplateError[] });
  return Object.freeze({ ok: true, template: Object.freeze({ source, target: parsed.ast.target, run, slotCount: env.slots.n, limits }), warnings: Object.freeze(warnings) as TemplateError[] });
}

export function renderTemplate(template: CompiledTemplate, config: Config, meta: RenderMeta): RenderResult {
  const { limits } = template;
  const f: unknown[] = new Array(template.slotCount).fill(undefined);
  f[CONFIG_SLOT] = config;
  f[META_SLOT] = meta;
  const c: Ctx = {
    f,
    out: "",
    steps: 0,
    maxSteps: limits.maxSteps,
    maxOutput: limits.maxOutput,
    deadline: Date.now() + limits.maxMillis,
    idents: new Map(),
    maxWidth: limits.maxFilterWidth,
  };
  try {
    template.run(c);
  } catch (e) {
    if (e instanceof TemplateFailure) return { ok: false, errors: [makeError(template.source, "render", e.message, e.from, e.to)] };
    if (e instanceof RangeError) return { ok: false, errors: [makeError(template.source, "render", `the render ran out of room: ${e.message}`, 0, 0)] };
    throw e;
  }
  return { ok: true, output: c.out };
}

/** Compile and render in one call; compile results for the same source reuse the parse cache. */
export function render(source: string, config: Config, meta: RenderMeta, opts: CompileOptions = {}): RenderResult {
  const compiled = compileTemplate(source, opts);
  if (!compiled.ok) return compiled;
  return renderTemplate(compiled.template, config, meta);
}
