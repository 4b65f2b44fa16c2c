// The code views' own theme, in the workbench's tokens (app/app.css @theme) rather than a stock
// editor theme: the stock dark theme's gutter and comment grey (#7d8799 on #282c34) is 3.86:1,
// below WCAG 2.x AA. CODE_COLOURS names a token for every colour, so the contrast test can check
// each text colour against each background it is drawn on (decision 016).
import { HighlightStyle, syntaxHighlighting } from "@codemirror/language";
import { EditorView } from "@codemirror/view";
import { tags as t } from "@lezer/highlight";

type Token = `${"soot" | "iron" | "ember" | "brass"}-${number}` | `signal-${"error" | "warning" | "info" | "ok"}`;

export const CODE_BACKGROUNDS = { editor: "soot-900", activeLine: "soot-800", selection: "soot-700" } satisfies Record<string, Token>;

export const CODE_COLOURS = {
  text: "iron-100",
  gutter: "iron-400",
  activeGutter: "iron-300",
  comment: "iron-400",
  keyword: "ember-400",
  string: "brass-300",
  literal: "brass-400",
  type: "iron-300",
  operator: "iron-300",
  invalid: "signal-error",
} satisfies Record<string, Token>;

const v = (token: Token) => `var(--color-${token})`;
const bg = CODE_BACKGROUNDS;
const c = CODE_COLOURS;

const chrome = EditorView.theme(
  {
    "&": { backgroundColor: v(bg.editor), color: v(c.text), fontSize: "13px" },
    ".cm-content": { fontFamily: "ui-monospace, SFMono-Regular, Menlo, monospace", caretColor: v("brass-400") },
    ".cm-cursor, .cm-dropCursor": { borderLeftColor: v("brass-400") },
    ".cm-gutters": { backgroundColor: v(bg.editor), color: v(c.gutter), borderRight: `1px solid ${v("soot-700")}` },
    ".cm-activeLine": { backgroundColor: v(bg.activeLine) },
    ".cm-activeLineGutter": { backgroundColor: v(bg.activeLine), color: v(c.activeGutter) },
    "&.cm-focused > .cm-scroller > .cm-selectionLayer .cm-selectionBackground, .cm-selectionBackground, .cm-content ::selection": {
      backgroundColor: v(bg.selection),
    },
    ".cm-selectionMatch": { backgroundColor: v(bg.selection) },
    ".cm-matchingBracket, .cm-nonmatchingBracket": { backgroundColor: v(bg.selection), outline: `1px solid ${v("soot-600")}` },
    ".cm-panels": { backgroundColor: v("soot-800"), color: v(c.text) },
    ".cm-tooltip": { backgroundColor: v("soot-800"), border: `1px solid ${v("soot-600")}`, color: v(c.text) },
  },
  { dark: true },
);

const highlight = HighlightStyle.define([
  { tag: t.comment, color: v(c.comment), fontStyle: "italic" },
  { tag: [t.keyword, t.operatorKeyword, t.controlKeyword, t.definitionKeyword, t.moduleKeyword, t.modifier, t.processingInstruction, t.meta, t.macroName], color: v(c.keyword) },
  { tag: [t.string, t.character, t.special(t.string)], color: v(c.string) },
  { tag: [t.number, t.bool, t.null, t.atom, t.escape], color: v(c.literal) },
  { tag: [t.typeName, t.className, t.namespace], color: v(c.type) },
  { tag: [t.operator, t.punctuation, t.bracket], color: v(c.operator) },
  { tag: t.invalid, color: v(c.invalid) },
]);

/** Pass as the CodeMirror `theme` (it replaces the stock dark theme). */
export const codeTheme = [chrome, syntaxHighlighting(highlight)];
