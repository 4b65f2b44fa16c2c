// A line diff of two rendered outputs (the `diff` package): hunks with line numbers for a
// unified view, the same rows paired for a side-by-side view, the words that changed inside
// each changed line, and the unified text as a patch that `patch` applies. Pure.
import { diffWordsWithSpace, FILE_HEADERS_ONLY, formatPatch, structuredPatch } from "diff";

/** A piece of a changed line; `changed` pieces are what differs from the paired line. */
export type Segment = { text: string; changed: boolean };

export type Row =
  | { kind: "context"; oldNo: number; newNo: number; text: string }
  | { kind: "removed"; oldNo: number; text: string; words?: Segment[] }
  | { kind: "added"; newNo: number; text: string; words?: Segment[] };

/** One line of the side-by-side view: left (old) and right (new), either may be empty. */
export type SideRow = {
  left?: { no: number; text: string; words?: Segment[]; kind: "context" | "removed" };
  right?: { no: number; text: string; words?: Segment[]; kind: "context" | "added" };
};

export type Hunk = { oldStart: number; oldLines: number; newStart: number; newLines: number; rows: Row[]; side: SideRow[] };

export type TextDiff =
  | { kind: "same"; patch: string }
  | { kind: "changed"; added: number; removed: number; hunks: Hunk[]; patch: string }
  | { kind: "too-large"; limit: number };

export const CONTEXT_LINES = 3;
/** Past this many changed lines (or a second) the diff gives up rather than hold the server. */
export const MAX_EDIT_LINES = 5000;
/** Word highlights only for lines up to this long (a word diff is quadratic in the worst case). */
const MAX_WORD_LINE = 2000;

/** The changed words of a removed line and the added line paired with it. */
export function wordSegments(oldText: string, newText: string): { old: Segment[]; new: Segment[] } | null {
  if (oldText.length > MAX_WORD_LINE || newText.length > MAX_WORD_LINE) return null;
  const parts = diffWordsWithSpace(oldText, newText);
  const o: Segment[] = [];
  const n: Segment[] = [];
  for (const p of parts) {
    if (!p.added) o.push({ text: p.value, changed: Boolean(p.removed) });
    if (!p.removed) n.push({ text: p.value, changed: Boolean(p.added) });
  }
  return { old: o, new: n };
}

export function diffTexts(oldName: string, newName: string, a: string, b: string): TextDiff {
  const p = structuredPatch(oldName, newName, a, b, undefined, undefined, { context: CONTEXT_LINES, maxEditLength: MAX_EDIT_LINES, timeout: 1000 });
  if (!p) return { kind: "too-large", limit: MAX_EDIT_LINES };
  const patch = formatPatch(p, FILE_HEADERS_ONLY);
  if (p.hunks.length === 0) return { kind: "same", patch };
  let added = 0;
  let removed = 0;
  const hunks = p.hunks.map((h): Hunk => {
    const rows: Row[] = [];
    const side: SideRow[] = [];
    let oldNo = h.oldStart;
    let newNo = h.newStart;
    let i = 0;
    const lines = h.lines.filter((l) => l[0] !== "\\");
    while (i < lines.length) {
      if (lines[i][0] === " ") {
        const text = lines[i].slice(1);
        rows.push({ kind: "context", oldNo, newNo, text });
        side.push({ left: { no: oldNo, text, kind: "context" }, right: { no: newNo, text, kind: "context" } });
        oldNo++;
        newNo++;
        i++;
        continue;
      }
      // A run of removed lines then added lines: paired in order for words and side by side.
      const gone: string[] = [];
      const come: string[] = [];
      while (i < lines.length && lines[i][0] === "-") gone.push(lines[i++].slice(1));
      while (i < lines.length && lines[i][0] === "+") come.push(lines[i++].slice(1));
      const words = gone.map((g, k) => (k < come.length ? wordSegments(g, come[k]) : null));
      const gRows = gone.map((text, k): Row => ({ kind: "removed", oldNo: oldNo + k, text, ...(words[k] ? { words: words[k]!.old } : {}) }));
      const cRows = come.map((text, k): Row => ({ kind: "added", newNo: newNo + k, text, ...(words[k] ? { words: words[k]!.new } : {}) }));
      rows.push(...gRows, ...cRows);
      for (let k = 0; k < Math.max(gone.length, come.length); k++) {
        const g = gRows[k] as Extract<Row, { kind: "removed" }> | undefined;
        const c = cRows[k] as Extract<Row, { kind: "added" }> | undefined;
        side.push({
          ...(g ? { left: { no: g.oldNo, text: g.text, words: g.words, kind: "removed" as const } } : {}),
          ...(c ? { right: { no: c.newNo, text: c.text, words: c.words, kind: "added" as const } } : {}),
        });
      }
      removed += gone.length;
      added += come.length;
      oldNo += gone.length;
      newNo += come.length;
    }
    return { oldStart: h.oldStart, oldLines: h.oldLines, newStart: h.newStart, newLines: h.newLines, rows, side };
  });
  return { kind: "changed", added, removed, hunks, patch };
}
