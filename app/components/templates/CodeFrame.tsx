// A code frame under a template diagnostic: the line before, the offending line and a caret
// under the span, as `formatError` in app/lib/template/errors.ts prints them for the terminal.
// Kept here (not in the library) so the page can style the parts; the layout is the same.
import type { TemplateError } from "~/lib/template";

type FrameInput = Pick<TemplateError, "line" | "column"> & Partial<Pick<TemplateError, "from" | "to">>;

export type FrameLine = { n: number; text: string; current: boolean };
export type Frame = { width: number; lines: FrameLine[]; pad: string; carets: number };

/** Lines longer than this are shown as a window around the column. */
const MAX_LINE = 160;
/** Characters kept before the column when a long line is cut. */
const LEAD = 60;

/**
 * The frame for one diagnostic. The caret's padding repeats the line's own tabs (other
 * characters become spaces), so it lines up under tabs in a monospace block too.
 */
export function codeFrame(source: string, err: FrameInput): Frame {
  const all = source.split("\n");
  const line = Math.min(Math.max(1, err.line), Math.max(1, all.length));
  const text = (n: number) => (all[n - 1] ?? "").replace(/\r$/, "");
  const raw = text(line);
  const at = Math.min(Math.max(1, err.column), raw.length + 1) - 1;
  // A long line: show a window that starts a little before the column.
  const start = raw.length > MAX_LINE && at > LEAD ? at - LEAD : 0;
  const cut = (s: string, from: number) => (from > 0 ? "…" : "") + s.slice(from, from + MAX_LINE) + (s.length > from + MAX_LINE ? "…" : "");
  const lines: FrameLine[] = [];
  for (let n = Math.max(1, line - 1); n <= line; n++) lines.push({ n, text: cut(text(n), n === line ? start : 0), current: n === line });
  const pad = ((start > 0 ? "…" : "") + raw.slice(start, at)).replace(/[^\t]/g, " ");
  const span = err.from !== undefined && err.to !== undefined ? err.to - err.from : 1;
  const carets = Math.max(1, Math.min(span, raw.length - at, 80));
  return { width: String(line).length, lines, pad, carets };
}

/** The frame as plain text (what the page shows, and what tests compare). */
export function frameText(f: Frame): string {
  const out = f.lines.map((l) => `${l.current ? ">" : " "} ${String(l.n).padStart(f.width)} | ${l.text}`);
  out.push(`  ${" ".repeat(f.width)} | ${f.pad}${"^".repeat(f.carets)}`);
  return out.join("\n");
}

export function CodeFrame({ source, error, testId = "code-frame" }: { source: string; error: FrameInput; testId?: string }) {
  const f = codeFrame(source, error);
  return (
    <pre tabIndex={0} className="mt-1 overflow-x-auto rounded border border-soot-700 bg-soot-900 px-2 py-1 font-mono text-xs text-iron-300" data-testid={testId} aria-label={`Template line ${f.lines[f.lines.length - 1].n}, column ${error.column}`}>
      {f.lines.map((l) => (
        <span key={l.n} className={l.current ? "text-iron-100" : "text-iron-400"}>
          {`${l.current ? ">" : " "} ${String(l.n).padStart(f.width)} | ${l.text}`}
          {"\n"}
        </span>
      ))}
      <span>
        {`  ${" ".repeat(f.width)} | ${f.pad}`}
        <span className="text-signal-error" data-testid="code-frame-caret">
          {"^".repeat(f.carets)}
        </span>
      </span>
    </pre>
  );
}
