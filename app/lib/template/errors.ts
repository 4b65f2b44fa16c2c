// Every stage reports problems in one shape so the editor, the API and the tests read the same
// data. Positions are kept as source offsets while working; line and column are computed once,
// when a diagnostic leaves the module.

export type Stage = "tokenize" | "parse" | "check" | "render";
export type Severity = "error" | "warning";

export interface TemplateError {
  stage: Stage;
  severity: Severity;
  message: string;
  /** 1-based. */
  line: number;
  /** 1-based, in UTF-16 code units like CodeMirror. */
  column: number;
  /** Source offsets of the offending span (to ≥ from). */
  from: number;
  to: number;
}

/** Thrown inside a stage and caught at its boundary; carries offsets only. */
export class TemplateFailure extends Error {
  constructor(
    readonly stage: Stage,
    message: string,
    readonly from: number,
    readonly to: number,
  ) {
    super(message);
  }
}

export function lineColumn(source: string, offset: number): { line: number; column: number } {
  let line = 1;
  let start = 0;
  const end = Math.min(Math.max(0, offset), source.length);
  for (let i = source.indexOf("\n"); i !== -1 && i < end; i = source.indexOf("\n", i + 1)) {
    line++;
    start = i + 1;
  }
  return { line, column: end - start + 1 };
}

export function makeError(
  source: string,
  stage: Stage,
  message: string,
  from: number,
  to = from,
  severity: Severity = "error",
): TemplateError {
  const { line, column } = lineColumn(source, from);
  return { stage, severity, message, line, column, from, to: Math.max(from, to) };
}

/** A code frame: the line before, the offending line and a caret under the span. */
export function formatError(err: Pick<TemplateError, "stage" | "message" | "line" | "column"> & Partial<TemplateError>, source: string): string {
  const lines = source.split("\n");
  const head = `${err.severity === "warning" ? "warning" : "error"} (${err.stage}) at ${err.line}:${err.column}: ${err.message}`;
  const width = String(Math.min(lines.length, err.line + 1)).length;
  const out = [head];
  for (let n = Math.max(1, err.line - 1); n <= err.line && n <= lines.length; n++) {
    const text = clip(lines[n - 1]);
    out.push(`${n === err.line ? ">" : " "} ${String(n).padStart(width)} | ${text}`);
  }
  const spanLen = err.to !== undefined && err.from !== undefined ? err.to - err.from : 1;
  const lineLeft = (lines[err.line - 1] ?? "").length - (err.column - 1);
  const carets = Math.max(1, Math.min(spanLen, lineLeft, 80));
  out.push(`  ${" ".repeat(width)} | ${" ".repeat(Math.min(err.column - 1, 200))}${"^".repeat(carets)}`);
  return out.join("\n");
}

function clip(line: string | undefined): string {
  const s = (line ?? "").replace(/\r$/, "");
  return s.length > 240 ? s.slice(0, 240) + "…" : s;
}

/** Edit distance, for "did you mean" suggestions. Small inputs only. */
export function suggest(name: string, candidates: Iterable<string>): string | undefined {
  let best: string | undefined;
  let bestScore = Infinity;
  const lower = name.toLowerCase();
  for (const c of candidates) {
    const cl = c.toLowerCase();
    let d = distance(lower, cl);
    if (cl.startsWith(lower) && lower.length >= 3) d = Math.min(d, 1);
    // A misspelt start of a long camelCase name ("sped" for "speedPixelsPerSecond").
    if (lower.length >= 3 && cl.length > lower.length + 1) d = Math.min(d, distance(lower, cl.slice(0, lower.length + 1)) + 1);
    if (d < bestScore) {
      bestScore = d;
      best = c;
    }
  }
  return best !== undefined && bestScore <= Math.max(2, Math.floor(name.length / 3)) ? best : undefined;
}

function distance(a: string, b: string): number {
  if (a.length > 64 || b.length > 64) return Infinity;
  let prev = Array.from({ length: b.length + 1 }, (_, i) => i);
  for (let i = 1; i <= a.length; i++) {
    const cur = [i];
    for (let j = 1; j <= b.length; j++) {
      cur[j] = Math.min(prev[j] + 1, cur[j - 1] + 1, prev[j - 1] + (a[i - 1] === b[j - 1] ? 0 : 1));
    }
    prev = cur;
  }
  return prev[b.length];
}
