// Stage 1: a hand-written single-pass lexer. Text between tags is kept as it is; inside a tag
// the expression is split into tokens that keep their source offsets. Delimiters start with '@',
// a character that never appears in C outside strings and comments:
//   @( expr )@   output          @[ stmt ]@   statement          @# … #@   comment
// A '~' just inside a delimiter trims the whitespace next to it.
import { TemplateFailure } from "./errors";

export type TokKind = "ident" | "num" | "str" | "op";
export interface Tok {
  kind: TokKind;
  /** Identifier or operator text, the decoded string, or the number's source text. */
  value: string;
  from: number;
  to: number;
}

export type Piece =
  | { kind: "text"; value: string; from: number; to: number; raw: boolean }
  | { kind: "out" | "stmt"; toks: Tok[]; from: number; to: number; trimBefore: boolean; trimAfter: boolean }
  | { kind: "comment"; from: number; to: number; trimBefore: boolean; trimAfter: boolean };

const OPS2 = ["==", "!=", "<=", ">=", "|>"];
const OPS1 = ["(", ")", "[", "]", ".", ",", "+", "-", "*", "/", "%", "<", ">", "="];
/** Two-character operators by their first character's code (each first character starts one). */
const OPS2_BY_CODE: ({ op: string; second: number } | undefined)[] = new Array(128).fill(undefined);
for (const op of OPS2) OPS2_BY_CODE[op.charCodeAt(0)] = { op, second: op.charCodeAt(1) };
const OPS1_BY_CODE: (string | undefined)[] = new Array(128).fill(undefined);
for (const op of OPS1) OPS1_BY_CODE[op.charCodeAt(0)] = op;

/** Character classes of ASCII codes: 1 starts a name (a-z A-Z _), 2 continues one (also 0-9). */
const CLASS = new Uint8Array(128);
for (let c = 0; c < 128; c++) {
  const start = (c >= 97 && c <= 122) || (c >= 65 && c <= 90) || c === 95;
  CLASS[c] = (start ? 1 : 0) | (start || (c >= 48 && c <= 57) ? 2 : 0);
}
// A code past the end of the source is NaN, which fails `c < 128` like any non-ASCII code.
function isIdentStart(c: number): boolean {
  return c < 128 && (CLASS[c] & 1) !== 0;
}
function isIdentPart(c: number): boolean {
  return c < 128 && (CLASS[c] & 2) !== 0;
}
function isDigit(c: number): boolean {
  return c >= 48 && c <= 57;
}

export function tokenize(src: string): Piece[] {
  if (typeof src !== "string") throw new TemplateFailure("tokenize", "a template must be a string", 0, 0);
  const pieces: Piece[] = [];
  let i = 0;
  let textStart = 0;
  const n = src.length;
  const flushText = (end: number) => {
    if (end > textStart) pieces.push({ kind: "text", value: src.slice(textStart, end), from: textStart, to: end, raw: false });
  };
  while (i < n) {
    const at = src.indexOf("@", i);
    if (at === -1 || at + 1 >= n) break;
    const next = src.charCodeAt(at + 1);
    if (next !== 40 /* ( */ && next !== 91 /* [ */ && next !== 35 /* # */) {
      i = at + 1;
      continue;
    }
    flushText(at);
    if (next === 35) {
      const end = src.indexOf("#@", at + 2);
      if (end === -1) throw new TemplateFailure("tokenize", "this comment '@#' is never closed with '#@'", at, at + 2);
      const trimBefore = src.charCodeAt(at + 2) === 126;
      const trimAfter = end > at + 2 && src.charCodeAt(end - 1) === 126;
      pieces.push({ kind: "comment", from: at, to: end + 2, trimBefore, trimAfter });
      i = textStart = end + 2;
      continue;
    }
    const piece = lexTag(src, at, next === 40 ? "out" : "stmt");
    pieces.push(piece);
    i = textStart = piece.to;
    if (piece.kind === "stmt" && piece.toks.length === 1 && piece.toks[0].value === "verbatim" && piece.toks[0].kind === "ident") {
      // Everything up to the closing tag is text, even things that look like tags.
      const close = /@\[~?[ \t\r\n]*\/verbatim[ \t\r\n]*~?\]@/g;
      close.lastIndex = i;
      const m = close.exec(src);
      if (!m) throw new TemplateFailure("tokenize", "this 'verbatim' block is never closed with '@[ /verbatim ]@'", piece.from, piece.to);
      if (m.index > i) pieces.push({ kind: "text", value: src.slice(i, m.index), from: i, to: m.index, raw: true });
      pieces.push(lexTag(src, m.index, "stmt"));
      i = textStart = m.index + m[0].length;
    }
  }
  flushText(n);
  return pieces;
}

function lexTag(src: string, at: number, kind: "out" | "stmt"): Piece {
  const closer = kind === "out" ? ")@" : "]@";
  const closeCh = kind === "out" ? 41 : 93;
  const toks: Tok[] = [];
  const n = src.length;
  let i = at + 2;
  let trimBefore = false;
  if (src.charCodeAt(i) === 126) {
    trimBefore = true;
    i++;
  }
  for (;;) {
    if (i >= n) throw new TemplateFailure("tokenize", `this tag '${src.slice(at, at + 2)}' is never closed with '${closer}'`, at, at + 2);
    const c = src.charCodeAt(i);
    if (c === 32 || c === 9 || c === 10 || c === 13) {
      i++;
      continue;
    }
    if (c === 126 && src.charCodeAt(i + 1) === closeCh && src.charCodeAt(i + 2) === 64) {
      return { kind, toks, from: at, to: i + 3, trimBefore, trimAfter: true };
    }
    if (c === closeCh && src.charCodeAt(i + 1) === 64) {
      return { kind, toks, from: at, to: i + 2, trimBefore, trimAfter: false };
    }
    if (c === 64 && (src.charCodeAt(i + 1) === 40 || src.charCodeAt(i + 1) === 91)) {
      throw new TemplateFailure("tokenize", `a new tag starts before this tag '${src.slice(at, at + 2)}' is closed with '${closer}'`, at, at + 2);
    }
    const start = i;
    if (c === 47 && kind === "stmt" && toks.length === 0 && isIdentStart(src.charCodeAt(i + 1))) {
      // Closing keywords ("/over") are one word.
      i++;
      while (i < n && isIdentPart(src.charCodeAt(i))) i++;
      toks.push({ kind: "ident", value: src.slice(start, i), from: start, to: i });
    } else if (isIdentStart(c)) {
      while (i < n && isIdentPart(src.charCodeAt(i))) i++;
      toks.push({ kind: "ident", value: src.slice(start, i), from: start, to: i });
    } else if (isDigit(c)) {
      while (i < n && isDigit(src.charCodeAt(i))) i++;
      if (src.charCodeAt(i) === 46 && isDigit(src.charCodeAt(i + 1))) {
        i++;
        while (i < n && isDigit(src.charCodeAt(i))) i++;
      }
      if (isIdentStart(src.charCodeAt(i))) throw new TemplateFailure("tokenize", "a number runs into a name; put a space between them", start, i + 1);
      toks.push({ kind: "num", value: src.slice(start, i), from: start, to: i });
    } else if (c === 34 || c === 39) {
      i = lexString(src, i, toks);
    } else {
      // Operators by character code, with their text from a constant table: no slice per operator.
      const two = c < 128 ? OPS2_BY_CODE[c] : undefined;
      const op2 = two !== undefined && src.charCodeAt(i + 1) === two.second ? two.op : undefined;
      const op1 = c < 128 ? OPS1_BY_CODE[c] : undefined;
      if (op2 !== undefined) {
        toks.push({ kind: "op", value: op2, from: i, to: i + 2 });
        i += 2;
      } else if (op1 !== undefined) {
        toks.push({ kind: "op", value: op1, from: i, to: i + 1 });
        i++;
      } else {
        const shown = c < 32 || c > 126 ? `\\u{${(src.codePointAt(i) ?? c).toString(16)}}` : src[i];
        throw new TemplateFailure("tokenize", `unexpected character '${shown}' inside a tag`, i, i + 1);
      }
    }
  }
}

const ESCAPES: Record<string, string> = { n: "\n", t: "\t", r: "\r", "\\": "\\", '"': '"', "'": "'", "0": "\0" };

function lexString(src: string, start: number, toks: Tok[]): number {
  const quote = src[start];
  let i = start + 1;
  let value = "";
  for (;;) {
    if (i >= src.length || src[i] === "\n") throw new TemplateFailure("tokenize", `this string is never closed with ${quote}`, start, start + 1);
    const ch = src[i];
    if (ch === quote) break;
    if (ch === "\\") {
      const e = ESCAPES[src[i + 1]];
      if (e === undefined) throw new TemplateFailure("tokenize", `unknown escape '\\${src[i + 1] ?? ""}' in a string (use \\n \\t \\r \\\\ \\" \\' \\0)`, i, i + 2);
      value += e;
      i += 2;
      continue;
    }
    value += ch;
    i++;
  }
  toks.push({ kind: "str", value, from: start, to: i + 1 });
  return i + 1;
}

/**
 * Whitespace control. A line holding only statement tags and comments disappears entirely
 * (indent and newline), so block tags do not leave blank lines in generated C; then '~' trims.
 */
export function applyWhitespace(pieces: Piece[]): Piece[] {
  // Decide on the original text, so that one removed line does not hide the next.
  const orig: (string | null)[] = new Array(pieces.length);
  for (let k = 0; k < pieces.length; k++) {
    const p = pieces[k];
    orig[k] = p.kind === "text" ? p.value : null;
  }
  const isBlank = (k: number) => orig[k] !== null && !(pieces[k] as { raw: boolean }).raw && onlySpaces(orig[k]!);
  for (let i = 0; i < pieces.length; i++) {
    if (!isBlockTag(pieces[i])) continue;
    const before = i === 0 ? "" : orig[i - 1];
    if (before === null || !(newlineThenSpaces(before) || (i <= 1 && onlySpaces(before)))) continue;
    let j = i;
    while (j + 1 < pieces.length && (isBlockTag(pieces[j + 1]) || (isBlank(j + 1) && j + 2 < pieces.length && isBlockTag(pieces[j + 2])))) j++;
    const after = j + 1 < pieces.length ? orig[j + 1] : "";
    if (after === null || lineEndAfterSpaces(after) < 0) {
      i = j;
      continue;
    }
    const prev = pieces[i - 1];
    const next = pieces[j + 1];
    if (prev && prev.kind === "text") prev.value = prev.value.slice(0, spacesStart(prev.value));
    for (let k = i + 1; k < j; k++) if (pieces[k].kind === "text") (pieces[k] as { value: string }).value = "";
    if (next && next.kind === "text") {
      const cut = lineEndAfterSpaces(next.value);
      // Leading spaces and tabs go, and one line end after them (as /^[ \t]*(\r?\n)?/ would).
      next.value = next.value.slice(cut >= 0 ? cut : spacesEnd(next.value));
    }
    i = j;
  }
  for (let i = 0; i < pieces.length; i++) {
    const p = pieces[i];
    if (p.kind === "text") continue;
    const prev = pieces[i - 1];
    const next = pieces[i + 1];
    if (p.trimBefore && prev?.kind === "text" && !prev.raw) prev.value = prev.value.trimEnd();
    if (p.trimAfter && next?.kind === "text" && !next.raw) next.value = next.value.trimStart();
  }
  return pieces;
}

function isBlockTag(p: Piece): boolean {
  return p.kind === "stmt" || p.kind === "comment";
}

// Character scans instead of end-anchored regular expressions, which V8 retries from every
// position of a long text piece.
const isSpaceTab = (c: number) => c === 32 || c === 9;

function onlySpaces(s: string): boolean {
  for (let k = 0; k < s.length; k++) if (!isSpaceTab(s.charCodeAt(k))) return false;
  return true;
}

/** Where the trailing run of spaces and tabs starts. */
function spacesStart(s: string): number {
  let k = s.length;
  while (k > 0 && isSpaceTab(s.charCodeAt(k - 1))) k--;
  return k;
}

/** Where the leading run of spaces and tabs ends. */
function spacesEnd(s: string): number {
  let k = 0;
  while (k < s.length && isSpaceTab(s.charCodeAt(k))) k++;
  return k;
}

/** True when `s` ends with a newline followed only by spaces and tabs. */
function newlineThenSpaces(s: string): boolean {
  const k = spacesStart(s);
  return k > 0 && s.charCodeAt(k - 1) === 10;
}

/** After leading spaces: the end of the text (its length) or just past "\n" / "\r\n"; else -1. */
function lineEndAfterSpaces(s: string): number {
  const k = spacesEnd(s);
  if (k === s.length) return k;
  if (s.charCodeAt(k) === 10) return k + 1;
  if (s.charCodeAt(k) === 13 && s.charCodeAt(k + 1) === 10) return k + 2;
  return -1;
}
