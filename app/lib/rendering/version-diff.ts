// Comparing two versions of a workshop template: a line diff (the `diff` package's
// structuredPatch) turned into rows with old and new line numbers for a unified view, and the
// same diff as a .patch file. Pure: no request, no database.
import { FILE_HEADERS_ONLY, formatPatch, structuredPatch, type StructuredPatch } from "diff";
import type { TemplateUses } from "../db/types";

/** `noNewline`: the last line of its side, without a line break after it. */
export type DiffRow = (
  | { kind: "context"; oldNo: number; newNo: number; text: string }
  | { kind: "removed"; oldNo: number; text: string }
  | { kind: "added"; newNo: number; text: string }
) & { noNewline?: true };

export type DiffHunk = { oldStart: number; oldLines: number; newStart: number; newLines: number; rows: DiffRow[] };

export type VersionDiff =
  | { kind: "same"; patch: string }
  | { kind: "changed"; added: number; removed: number; hunks: DiffHunk[]; patch: string }
  /** Too different to diff within the budget below (a whole rewrite of a long template). */
  | { kind: "too-large"; limit: number };

/** Lines of unchanged text shown around each change. */
export const CONTEXT_LINES = 3;
/**
 * The diff gives up past this many changed lines (or after half a second): Myers' algorithm
 * costs about N·D, and a 256 KB template rewritten from scratch would hold the server for seconds.
 */
export const MAX_EDIT_LINES = 1500;

/** `3..5` → [3, 5]; anything else → null. */
export function parseCompare(value: string): [number, number] | null {
  const m = /^(\d{1,9})\.\.(\d{1,9})$/.exec(value.trim());
  if (!m) return null;
  const a = Number(m[1]);
  const b = Number(m[2]);
  return a >= 1 && b >= 1 ? [a, b] : null;
}

/** The file names inside the patch: `name@v3` → `name@v5`. */
export const versionLabel = (name: string, version: number) => `${name}@v${version}`;

export function diffVersions(name: string, from: { version: number; source: string }, to: { version: number; source: string }): VersionDiff {
  const p: StructuredPatch | undefined = structuredPatch(versionLabel(name, from.version), versionLabel(name, to.version), from.source, to.source, undefined, undefined, {
    context: CONTEXT_LINES,
    maxEditLength: MAX_EDIT_LINES,
    timeout: 500,
  });
  if (!p) return { kind: "too-large", limit: MAX_EDIT_LINES };
  // The patch file is the same structured diff written out, so the page and the file agree.
  const patch = formatPatch(p, FILE_HEADERS_ONLY);
  if (p.hunks.length === 0) return { kind: "same", patch };
  let added = 0;
  let removed = 0;
  const hunks = p.hunks.map((h): DiffHunk => {
    const rows: DiffRow[] = [];
    let oldNo = h.oldStart;
    let newNo = h.newStart;
    for (const line of h.lines) {
      const sign = line[0];
      const text = line.slice(1);
      if (sign === "+") {
        rows.push({ kind: "added", newNo: newNo++, text });
        added++;
      } else if (sign === "-") {
        rows.push({ kind: "removed", oldNo: oldNo++, text });
        removed++;
      } else if (sign === " ") {
        rows.push({ kind: "context", oldNo: oldNo++, newNo: newNo++, text });
      } else if (sign === "\\" && rows.length) {
        // "\ No newline at end of file" marks the line before it.
        rows[rows.length - 1].noNewline = true;
      }
    }
    return { oldStart: h.oldStart, oldLines: h.oldLines, newStart: h.newStart, newLines: h.newLines, rows };
  });
  return { kind: "changed", added, removed, hunks, patch };
}

/** A plain ASCII file name for the downloaded patch. */
export function patchFileName(name: string, from: number, to: number): string {
  const slug = name.toLowerCase().replace(/[^a-z0-9_-]+/g, "-").replace(/^-+|-+$/g, "") || "template";
  return `${slug}-v${from}-to-v${to}.patch`;
}

export type NewerPartial = { name: string; version: number; was: number | null };

/**
 * The templates a version uses that have moved on since it was saved: each `now` entry whose
 * template or version differs from what was `recorded`; `was` is the recorded version when it is
 * the same template (null when the name now means another template or was not used before).
 */
export function newerPartials(recorded: TemplateUses, now: TemplateUses): NewerPartial[] {
  return Object.entries(now)
    .filter(([name, u]) => recorded[name]?.id !== u.id || recorded[name]?.version !== u.version)
    .map(([name, u]) => ({ name, version: u.version, was: recorded[name]?.id === u.id ? recorded[name].version : null }));
}
