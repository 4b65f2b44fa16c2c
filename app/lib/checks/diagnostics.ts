// What the validator hands back: plain data the editor, the API and the tests all read the
// same way. A path is written the way a person would point at the value in the JSON, e.g.
// presets[2].looks.chamber.layers[1].periodMs.

import { z } from "zod";
import type { RuleCode, Severity } from "./rules/codes";

export type { Severity };

/** One finding of the validator, as the API answers it (the OpenAPI document shows this schema). */
export const diagnosticSchema = z
  .object({
    severity: z.enum(["error", "warning", "info"]),
    code: z.string().meta({ description: "Stable kebab-case rule code; tools may match on it, so it is never renamed." }),
    path: z.string().meta({ description: 'JSON path of the value the diagnostic is about ("" for the whole config), e.g. presets[2].looks.chamber.layers[1].periodMs.' }),
    message: z.string(),
    hint: z.string().meta({ description: "What to do about it." }),
  })
  .meta({ id: "Diagnostic" });

export type Diagnostic = z.infer<typeof diagnosticSchema>;
// The schema's severities are the rule set's.
const _severities: [Severity, Diagnostic["severity"]] extends [Diagnostic["severity"], Severity] ? true : never = true;
void _severities;

export type PathSegment = string | number;

const PLAIN_KEY = /^[A-Za-z_$][A-Za-z0-9_$-]*$/;

/** Formats path segments as `a.b[2].c`; keys that would read ambiguously are quoted. */
export function formatPath(segments: readonly PathSegment[]): string {
  let out = "";
  for (const s of segments) {
    if (typeof s === "number") out += `[${s}]`;
    else if (PLAIN_KEY.test(s)) out += out === "" ? s : `.${s}`;
    else out += `[${JSON.stringify(s)}]`;
  }
  return out;
}

/** Joins a base path with more segments without re-formatting the base. */
export function joinPath(base: string, ...more: PathSegment[]): string {
  const tail = formatPath(more);
  if (base === "") return tail;
  if (tail === "") return base;
  return tail.startsWith("[") ? base + tail : `${base}.${tail}`;
}

const SEVERITY_ORDER: Record<Severity, number> = { error: 0, warning: 1, info: 2 };

/** Errors first, then warnings, then notes; stable within a severity. */
export function sortDiagnostics(list: Diagnostic[]): Diagnostic[] {
  return list
    .map((d, i) => [d, i] as const)
    .sort((a, b) => SEVERITY_ORDER[a[0].severity] - SEVERITY_ORDER[b[0].severity] || a[1] - b[1])
    .map(([d]) => d);
}

export function hasErrors(list: readonly Diagnostic[]): boolean {
  return list.some((d) => d.severity === "error");
}

/** Collects diagnostics for the semantic rules; one per validation run. Codes must be catalogued. */
export class DiagnosticSink {
  readonly list: Diagnostic[] = [];
  error(code: RuleCode, path: string, message: string, hint: string): void {
    this.list.push({ severity: "error", code, path, message, hint });
  }
  warning(code: RuleCode, path: string, message: string, hint: string): void {
    this.list.push({ severity: "warning", code, path, message, hint });
  }
  info(code: RuleCode, path: string, message: string, hint: string): void {
    this.list.push({ severity: "info", code, path, message, hint });
  }
}

/** `.key` or `["key"]`, to append a record key to an already formatted path. */
export function keySegment(key: string): string {
  return PLAIN_KEY.test(key) ? `.${key}` : `[${JSON.stringify(key)}]`;
}
