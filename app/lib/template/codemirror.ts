// Editor highlighting for Hiltbench templates: a CodeMirror StreamLanguage that knows the
// delimiters, statement keywords, filters, strings and numbers. Text outside tags is left plain.
import { StreamLanguage, type StreamParser } from "@codemirror/language";

export interface HbTemplateState {
  /** Inside which construct the line currently is. */
  mode: "text" | "out" | "stmt" | "comment";
  /** The previous token inside a tag, to tell filter names and fields from plain names. */
  after: "pipe" | "dot" | "open" | "other";
}

const STATEMENTS = new Set(["when", "orwhen", "otherwise", "over", "as", "none", "let", "use", "piece", "verbatim", "target"]);
const WORDS = new Set(["and", "or", "not"]);

export const hbTemplateStreamParser: StreamParser<HbTemplateState> = {
  name: "hiltbench-template",
  startState: () => ({ mode: "text", after: "other" }),
  copyState: (s) => ({ ...s }),
  token(stream, state) {
    if (state.mode === "comment") {
      if (stream.skipTo("#@")) {
        stream.pos += 2;
        state.mode = "text";
      } else stream.skipToEnd();
      return "comment";
    }
    if (state.mode === "text") {
      if (stream.match(/^@#/)) {
        state.mode = "comment";
        return "comment";
      }
      if (stream.match(/^@[([]~?/)) {
        state.mode = stream.current().startsWith("@(") ? "out" : "stmt";
        state.after = "open";
        return "meta";
      }
      stream.next();
      while (!stream.eol() && stream.peek() !== "@") stream.next();
      return null;
    }
    if (stream.eatSpace()) return null;
    if (stream.match(/^~?[)\]]@/)) {
      state.mode = "text";
      return "meta";
    }
    const after = state.after;
    state.after = "other";
    if (stream.match(/^\/[A-Za-z_]\w*/) && after === "open") return "keyword";
    if (stream.match(/^[A-Za-z_]\w*/)) {
      const word = stream.current();
      if (after === "pipe") return "variableName.function";
      if (after === "dot") return "propertyName";
      if (STATEMENTS.has(word) && (after === "open" || word === "as")) return "keyword";
      if (WORDS.has(word)) return "operatorKeyword";
      if (word === "true" || word === "false") return "bool";
      if (word === "nothing") return "null";
      return "variableName";
    }
    if (stream.match(/^[0-9]+(\.[0-9]+)?/)) return "number";
    if (stream.match(/^"(?:[^"\\]|\\.)*"?/) || stream.match(/^'(?:[^'\\]|\\.)*'?/)) return "string";
    if (stream.match("|>")) {
      state.after = "pipe";
      return "operator";
    }
    if (stream.match(".")) {
      state.after = "dot";
      return "punctuation";
    }
    if (stream.match(/^(==|!=|<=|>=|[-+*/%<>=])/)) return "operator";
    stream.next();
    return "punctuation";
  },
  languageData: { commentTokens: { block: { open: "@#", close: "#@" } } },
};

export function hbTemplateLanguage(): StreamLanguage<HbTemplateState> {
  return StreamLanguage.define(hbTemplateStreamParser);
}
