// Where a comment's line is in a later render. A comment anchored on line L of revision n's
// rendered text stays on that line in revision m when the line is unchanged (it sits in a run
// the line diff reports as common); when it was changed or removed, the comment is outdated.
// The diff is the `diff` package's array diff over lines, so a moved block counts as changed.
import { diffArrays } from "diff";

export const splitLines = (text: string): string[] => text.replace(/\r\n/g, "\n").replace(/\n$/, "").split("\n");

export function lineCount(text: string): number {
  return text === "" ? 0 : splitLines(text).length;
}

/** The text of 1-based line `line`, or undefined past the end. */
export function lineAt(text: string, line: number): string | undefined {
  if (!Number.isInteger(line) || line < 1) return undefined;
  return splitLines(text)[line - 1];
}

/**
 * A mapper from 1-based lines of `before` to lines of `after`: the new line number when the
 * line is unchanged, null when it changed or went away.
 */
export function lineMapper(before: string, after: string): (line: number) => number | null {
  if (before === after) return (line) => (line >= 1 && line <= lineCount(before) ? line : null);
  const map = new Map<number, number>();
  let oldLine = 1;
  let newLine = 1;
  for (const part of diffArrays(splitLines(before), splitLines(after))) {
    const n = part.value.length;
    if (part.added) newLine += n;
    else if (part.removed) oldLine += n;
    else {
      for (let i = 0; i < n; i++) map.set(oldLine + i, newLine + i);
      oldLine += n;
      newLine += n;
    }
  }
  return (line) => map.get(line) ?? null;
}
