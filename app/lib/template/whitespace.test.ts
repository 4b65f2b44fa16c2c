// The whitespace pass works on source offsets for speed. This checks it against a plain
// restatement of the rule over strings, on random mixes of text, tags, comments and '~'.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { applyWhitespace, tokenize, type Piece } from "./tokenize";

/** The rule, stated over copies of the texts (the implementation before it moved to offsets). */
function reference(pieces: Piece[]): string[] {
  const orig = pieces.map((p) => (p.kind === "text" ? p.value : null));
  const value = pieces.map((p) => p.value);
  const block = (k: number) => pieces[k].kind === "stmt" || pieces[k].kind === "comment";
  const blank = (k: number) => orig[k] !== null && !pieces[k].raw && /^[ \t]*$/.test(orig[k]!);
  for (let i = 0; i < pieces.length; i++) {
    if (!block(i)) continue;
    const before = i === 0 ? "" : orig[i - 1];
    if (before === null || !(/\n[ \t]*$/.test(before) || (i <= 1 && /^[ \t]*$/.test(before)))) continue;
    let j = i;
    while (j + 1 < pieces.length && (block(j + 1) || (blank(j + 1) && j + 2 < pieces.length && block(j + 2)))) j++;
    const after = j + 1 < pieces.length ? orig[j + 1] : "";
    if (after === null || !/^[ \t]*(\r?\n|$)/.test(after)) {
      i = j;
      continue;
    }
    if (i > 0) value[i - 1] = value[i - 1].replace(/[ \t]*$/, "");
    for (let k = i + 1; k < j; k++) if (pieces[k].kind === "text") value[k] = "";
    if (j + 1 < pieces.length) value[j + 1] = value[j + 1].replace(/^[ \t]*(\r?\n)?/, "");
    i = j;
  }
  for (let i = 0; i < pieces.length; i++) {
    const p = pieces[i];
    if (p.kind === "text") continue;
    if (p.trimBefore && pieces[i - 1]?.kind === "text" && !pieces[i - 1].raw) value[i - 1] = value[i - 1].trimEnd();
    if (p.trimAfter && pieces[i + 1]?.kind === "text" && !pieces[i + 1].raw) value[i + 1] = value[i + 1].trimStart();
  }
  return value;
}

const part = fc.constantFrom("\n", "\r\n", "  ", "\t", "x", "a b", "@[ when true ]@", "@[~ when true ~]@", "@[ /when ]@", "@( 1 )@", "@(~ 2 ~)@", "@# c #@", "@#~ c ~#@");

describe("whitespace control", () => {
  it("matches the rule stated over strings", () => {
    fc.assert(
      fc.property(fc.array(part, { maxLength: 24 }), (parts) => {
        const src = parts.join("");
        const expected = reference(tokenize(src).pieces);
        const lexed = tokenize(src);
        expect(applyWhitespace(lexed).map((p) => p.value)).toEqual(expected);
      }),
      { numRuns: 2000 },
    );
  });
});
