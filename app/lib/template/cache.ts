// Parsing happens once per template version: results are kept by source text, so saving a
// template (a new version, a new source) parses once and every render after reuses the AST.
import type { TemplateAst } from "./ast";
import { makeError, TemplateFailure, type TemplateError } from "./errors";
import { DEFAULT_LIMITS, type Limits } from "./limits";
import { parse } from "./parse";
import { applyWhitespace, tokenize } from "./tokenize";

export interface Parsed {
  ast: TemplateAst | null;
  errors: TemplateError[];
}

const MAX_ENTRIES = 256;
const onClear: (() => void)[] = [];
/** Lets the compiled-template cache be cleared together with the parse cache. */
export function alsoClear(f: () => void): void {
  onClear.push(f);
}
const entries = new Map<string, Parsed>();

/** Tokenize and parse without the cache. */
export function parseTemplate(source: string, limits: Limits = DEFAULT_LIMITS): Parsed {
  if (typeof source !== "string") return { ast: null, errors: [makeError("", "tokenize", "a template must be a string", 0)] };
  if (source.length > limits.maxSourceLength)
    return { ast: null, errors: [makeError(source, "tokenize", `the template is ${source.length} characters, over the limit of ${limits.maxSourceLength}`, 0, 1)] };
  const failures: TemplateFailure[] = [];
  let ast: TemplateAst | null = null;
  try {
    const lexed = tokenize(source);
    applyWhitespace(lexed);
    ast = parse(lexed, failures, limits.maxDepth);
  } catch (e) {
    // The limits keep recursion shallow; a stack overflow anyway is still the template's fault.
    if (e instanceof RangeError) failures.push(new TemplateFailure("parse", "the template is nested too deeply to read", 0, Math.min(2, source.length)));
    else if (!(e instanceof TemplateFailure)) throw e;
    else failures.push(e);
  }
  const errors = failures.map((f) => makeError(source, f.stage, f.message, f.from, f.to));
  return { ast: errors.length ? null : ast, errors };
}

export function parseCached(source: string, limits: Limits = DEFAULT_LIMITS): Parsed {
  const hit = limits === DEFAULT_LIMITS ? entries.get(source) : undefined;
  if (hit) {
    // Refresh the entry so the least recently used one is dropped first.
    entries.delete(source);
    entries.set(source, hit);
    return hit;
  }
  const parsed = parseTemplate(source, limits);
  if (limits === DEFAULT_LIMITS) {
    entries.set(source, parsed);
    if (entries.size > MAX_ENTRIES) entries.delete(entries.keys().next().value!);
  }
  return parsed;
}

/** The parse cache, keyed by template source. */
export const templateCache = {
  get: (source: string): Parsed | undefined => entries.get(source),
  has: (source: string): boolean => entries.has(source),
  /** Clears parsed and compiled templates. */
  clear: (): void => {
    entries.clear();
    onClear.forEach((f) => f());
  },
  get size(): number {
    return entries.size;
  },
};
