// Stage 1: a hand-written single-pass lexer. Text between tags is kept as it is; inside a tag
// the expression is split into tokens. Delimiters start with '@', a character that never
// appears in C outside strings and comments:
//   @( expr )@   output          @[ stmt ]@   statement          @# … #@   comment
// A '~' just inside a delimiter trims the whitespace next to it.
//
// Tokens are not objects: the lexer writes each one's kind and source offsets into typed arrays
// (`Tokens`), and the parser reads names and numbers out of the source when it builds a node.
// The editor compiles on every keystroke, and one object plus one string per token was the
// largest share of a compile.
import { TemplateFailure } from "./errors";

// Token kinds. Keywords get kinds of their own so the parser compares numbers, not strings.
export const IDENT = 0;
export const NUM = 1;
export const STR = 2;
export const KW_AND = 3;
export const KW_OR = 4;
export const KW_NOT = 5;
export const KW_TRUE = 6;
export const KW_FALSE = 7;
export const KW_NOTHING = 8;
/** A closing word of a block ("/over"), one token. */
export const CLOSER = 9;
export const LPAREN = 10;
export const RPAREN = 11;
export const LBRACK = 12;
export const RBRACK = 13;
export const DOT = 14;
export const COMMA = 15;
export const PLUS = 16;
export const MINUS = 17;
export const STAR = 18;
export const SLASH = 19;
export const PERCENT = 20;
export const LT = 21;
export const GT = 22;
export const ASSIGN = 23;
export const EQ = 24;
export const NE = 25;
export const LE = 26;
export const GE = 27;
export const PIPE = 28;

/** Operator text by kind, for messages and for the AST's operator names. */
export const OP_TEXT: readonly string[] = (() => {
  const t: string[] = [];
  const ops: [number, string][] = [
    [LPAREN, "("], [RPAREN, ")"], [LBRACK, "["], [RBRACK, "]"], [DOT, "."], [COMMA, ","], [PLUS, "+"], [MINUS, "-"],
    [STAR, "*"], [SLASH, "/"], [PERCENT, "%"], [LT, "<"], [GT, ">"], [ASSIGN, "="], [EQ, "=="], [NE, "!="], [LE, "<="],
    [GE, ">="], [PIPE, "|>"],
  ];
  for (const [k, s] of ops) t[k] = s;
  return t;
})();

/** One-character operators by character code, and the two-character ones by their first. */
const OP1 = new Int8Array(128).fill(-1);
const OP2 = new Int8Array(128).fill(-1);
const OP2_SECOND = new Uint8Array(128);
for (let k = LPAREN; k <= PIPE; k++) {
  const s = OP_TEXT[k];
  if (s.length === 1) OP1[s.charCodeAt(0)] = k;
  else {
    OP2[s.charCodeAt(0)] = k;
    OP2_SECOND[s.charCodeAt(0)] = s.charCodeAt(1);
  }
}

/** The kind of the name at `start` (first character `c`, `len` long): a keyword's, or IDENT. */
function keywordKind(src: string, c: number, start: number, len: number): number {
  // Compared in place by first letter and length: no string is made for a name.
  switch (c) {
    case 97 /* a */:
      return len === 3 && src.startsWith("and", start) ? KW_AND : IDENT;
    case 111 /* o */:
      return len === 2 && src.charCodeAt(start + 1) === 114 ? KW_OR : IDENT;
    case 110 /* n */:
      return len === 3 && src.startsWith("not", start) ? KW_NOT : len === 7 && src.startsWith("nothing", start) ? KW_NOTHING : IDENT;
    case 116 /* t */:
      return len === 4 && src.startsWith("true", start) ? KW_TRUE : IDENT;
    case 102 /* f */:
      return len === 5 && src.startsWith("false", start) ? KW_FALSE : IDENT;
    default:
      return IDENT;
  }
}

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

// The token arrays are shared by every lex and grow as needed. A lex is followed at once by its
// parse, which is the only reader (the AST keeps names, not token indices), so one set serves
// all: fresh typed arrays of this size are allocated outside the heap and cost more than the
// whole lexing pass, and plain arrays pay for growing three times per token.
let poolKind = new Uint8Array(4096);
let poolFrom = new Int32Array(4096);
let poolTo = new Int32Array(4096);
let poolOwner: Tokens | null = null;

/**
 * The tokens of a whole template: kind and source span of token `i` at index `i`. Valid until
 * the next call of `tokenize` (reading a stale set throws).
 */
export class Tokens {
  kind = poolKind;
  from = poolFrom;
  to = poolTo;
  n = 0;
  constructor(readonly src: string) {
    poolOwner = this;
  }
  push(kind: number, from: number, to: number): void {
    if (this.n === this.kind.length) this.grow();
    this.kind[this.n] = kind;
    this.from[this.n] = from;
    this.to[this.n] = to;
    this.n++;
  }
  /** Throws when a later lex has taken the shared arrays. */
  check(): void {
    if (poolOwner !== this) throw new Error("template tokens read after another template was lexed");
  }
  private grow(): void {
    const cap = this.kind.length * 2;
    const kind = new Uint8Array(cap);
    const from = new Int32Array(cap);
    const to = new Int32Array(cap);
    kind.set(this.kind);
    from.set(this.from);
    to.set(this.to);
    this.kind = poolKind = kind;
    this.from = poolFrom = from;
    this.to = poolTo = to;
  }
  /** The token's source text (a name, a number, an operator; a string with its quotes). */
  text(i: number): string {
    return this.src.slice(this.from[i], this.to[i]);
  }
  /** True when token `i` is the name `word`, compared in place. */
  is(i: number, word: string): boolean {
    const from = this.from[i];
    return this.kind[i] <= CLOSER && this.to[i] - from === word.length && this.src.startsWith(word, from);
  }
  /** The value of a string token, escapes decoded (the lexer has checked them). */
  str(i: number): string {
    const src = this.src;
    const end = this.to[i] - 1;
    let start = this.from[i] + 1;
    let k = src.indexOf("\\", start);
    if (k === -1 || k >= end) return src.slice(start, end);
    let value = "";
    while (k !== -1 && k < end) {
      value += src.slice(start, k) + ESCAPES[src[k + 1]];
      start = k + 2;
      k = src.indexOf("\\", start);
    }
    return value + src.slice(start, end);
  }
}

/** A piece of the template: text, an output or statement tag (tokens `t0` to `t1`), a comment. */
export interface Piece {
  kind: "text" | "out" | "stmt" | "comment";
  /** The text of a text piece (changed by the whitespace pass); "" for tags. */
  value: string;
  from: number;
  to: number;
  /** Text inside a verbatim block: whitespace control leaves it alone. */
  raw: boolean;
  t0: number;
  t1: number;
  trimBefore: boolean;
  trimAfter: boolean;
}

export interface Lexed {
  pieces: Piece[];
  toks: Tokens;
}

function piece(kind: Piece["kind"], value: string, from: number, to: number, raw: boolean, t0: number, t1: number, trimBefore: boolean, trimAfter: boolean): Piece {
  // Every piece has the same fields in the same order: one object shape for the later passes.
  return { kind, value, from, to, raw, t0, t1, trimBefore, trimAfter };
}

export function tokenize(src: string): Lexed {
  if (typeof src !== "string") throw new TemplateFailure("tokenize", "a template must be a string", 0, 0);
  const pieces: Piece[] = [];
  const toks = new Tokens(src);
  let i = 0;
  let textStart = 0;
  const n = src.length;
  while (i < n) {
    const at = src.indexOf("@", i);
    if (at === -1 || at + 1 >= n) break;
    const next = src.charCodeAt(at + 1);
    if (next !== 40 /* ( */ && next !== 91 /* [ */ && next !== 35 /* # */) {
      i = at + 1;
      continue;
    }
    if (at > textStart) pieces.push(piece("text", src.slice(textStart, at), textStart, at, false, 0, 0, false, false));
    if (next === 35) {
      const end = src.indexOf("#@", at + 2);
      if (end === -1) throw new TemplateFailure("tokenize", "this comment '@#' is never closed with '#@'", at, at + 2);
      const trimBefore = src.charCodeAt(at + 2) === 126;
      const trimAfter = end > at + 2 && src.charCodeAt(end - 1) === 126;
      pieces.push(piece("comment", "", at, end + 2, false, 0, 0, trimBefore, trimAfter));
      i = textStart = end + 2;
      continue;
    }
    const tag = lexTag(src, at, next === 40 ? "out" : "stmt", toks);
    pieces.push(tag);
    i = textStart = tag.to;
    if (tag.kind === "stmt" && tag.t1 - tag.t0 === 1 && toks.is(tag.t0, "verbatim")) {
      // Everything up to the closing tag is text, even things that look like tags.
      const close = /@\[~?[ \t\r\n]*\/verbatim[ \t\r\n]*~?\]@/g;
      close.lastIndex = i;
      const m = close.exec(src);
      if (!m) throw new TemplateFailure("tokenize", "this 'verbatim' block is never closed with '@[ /verbatim ]@'", tag.from, tag.to);
      if (m.index > i) pieces.push(piece("text", src.slice(i, m.index), i, m.index, true, 0, 0, false, false));
      pieces.push(lexTag(src, m.index, "stmt", toks));
      i = textStart = m.index + m[0].length;
    }
  }
  if (n > textStart) pieces.push(piece("text", src.slice(textStart, n), textStart, n, false, 0, 0, false, false));
  return { pieces, toks };
}

function lexTag(src: string, at: number, kind: "out" | "stmt", toks: Tokens): Piece {
  const closer = kind === "out" ? ")@" : "]@";
  const closeCh = kind === "out" ? 41 : 93;
  const t0 = toks.n;
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
      return piece(kind, "", at, i + 3, false, t0, toks.n, trimBefore, true);
    }
    if (c === closeCh && src.charCodeAt(i + 1) === 64) {
      return piece(kind, "", at, i + 2, false, t0, toks.n, trimBefore, false);
    }
    if (c === 64 && (src.charCodeAt(i + 1) === 40 || src.charCodeAt(i + 1) === 91)) {
      throw new TemplateFailure("tokenize", `a new tag starts before this tag '${src.slice(at, at + 2)}' is closed with '${closer}'`, at, at + 2);
    }
    const start = i;
    if (c === 47 && kind === "stmt" && toks.n === t0 && isIdentStart(src.charCodeAt(i + 1))) {
      // Closing keywords ("/over") are one word.
      i++;
      while (i < n && isIdentPart(src.charCodeAt(i))) i++;
      toks.push(CLOSER, start, i);
    } else if (c < 128 && (CLASS[c] & 1) !== 0) {
      i++;
      for (let d = src.charCodeAt(i); d < 128 && (CLASS[d] & 2) !== 0; d = src.charCodeAt(++i));
      toks.push(keywordKind(src, c, start, i - start), start, i);
    } else if (isDigit(c)) {
      while (i < n && isDigit(src.charCodeAt(i))) i++;
      if (src.charCodeAt(i) === 46 && isDigit(src.charCodeAt(i + 1))) {
        i++;
        while (i < n && isDigit(src.charCodeAt(i))) i++;
      }
      if (isIdentStart(src.charCodeAt(i))) throw new TemplateFailure("tokenize", "a number runs into a name; put a space between them", start, i + 1);
      toks.push(NUM, start, i);
    } else if (c === 34 || c === 39) {
      i = lexString(src, i);
      toks.push(STR, start, i);
    } else {
      const two = c < 128 ? OP2[c] : -1;
      if (two >= 0 && src.charCodeAt(i + 1) === OP2_SECOND[c]) {
        toks.push(two, i, i + 2);
        i += 2;
      } else if (c < 128 && OP1[c] >= 0) {
        toks.push(OP1[c], i, i + 1);
        i++;
      } else {
        const shown = c < 32 || c > 126 ? `\\u{${(src.codePointAt(i) ?? c).toString(16)}}` : src[i];
        throw new TemplateFailure("tokenize", `unexpected character '${shown}' inside a tag`, i, i + 1);
      }
    }
  }
}

const ESCAPES: Record<string, string> = { n: "\n", t: "\t", r: "\r", "\\": "\\", '"': '"', "'": "'", "0": "\0" };

/** Checks a string literal starting at `start` and returns the offset just past its quote. */
function lexString(src: string, start: number): number {
  const quote = src.charCodeAt(start);
  let i = start + 1;
  for (;;) {
    const ch = src.charCodeAt(i);
    if (i >= src.length || ch === 10) throw new TemplateFailure("tokenize", `this string is never closed with ${src[start]}`, start, start + 1);
    if (ch === quote) return i + 1;
    if (ch === 92) {
      const e = src[i + 1];
      if (e === undefined || !Object.hasOwn(ESCAPES, e))
        throw new TemplateFailure("tokenize", `unknown escape '\\${e ?? ""}' in a string (use \\n \\t \\r \\\\ \\" \\' \\0)`, i, i + 2);
      i += 2;
      continue;
    }
    i++;
  }
}

/**
 * Whitespace control. A line holding only statement tags and comments disappears entirely
 * (indent and newline), so block tags do not leave blank lines in generated C; then '~' trims.
 * Decisions read the original text in the source by offsets, so that one removed line does not
 * hide the next and no copy of a text is made to look at it.
 */
export function applyWhitespace({ pieces, toks }: Lexed): Piece[] {
  const src = toks.src;
  const count = pieces.length;
  const isBlank = (k: number) => pieces[k].kind === "text" && !pieces[k].raw && spacesEnd(src, pieces[k].from, pieces[k].to) === pieces[k].to;
  for (let i = 0; i < count; i++) {
    if (!isBlockTag(pieces[i])) continue;
    const prev = i === 0 ? null : pieces[i - 1];
    if (prev !== null) {
      if (prev.kind !== "text") continue;
      const k = spacesStart(src, prev.from, prev.to);
      // The text before ends with a line end and indent, or it is the indent of the first line.
      if (!((k > prev.from && src.charCodeAt(k - 1) === 10) || (i === 1 && k === prev.from))) continue;
    }
    let j = i;
    while (j + 1 < count && (isBlockTag(pieces[j + 1]) || (j + 2 < count && isBlank(j + 1) && isBlockTag(pieces[j + 2])))) j++;
    const next = j + 1 < count ? pieces[j + 1] : null;
    if (next !== null && (next.kind !== "text" || lineEndAfterSpaces(src, next.from, next.to) < 0)) {
      i = j;
      continue;
    }
    // The text before may have lost its start to the run before this one: cut its current value.
    if (prev !== null) prev.value = prev.value.slice(0, spacesStart(prev.value, 0, prev.value.length));
    for (let k = i + 1; k < j; k++) if (pieces[k].kind === "text") pieces[k].value = "";
    if (next !== null) {
      // Leading spaces and tabs go, and one line end after them (as /^[ \t]*(\r?\n)?/ would).
      next.value = next.value.slice(lineEndAfterSpaces(src, next.from, next.to) - next.from);
    }
    i = j;
  }
  for (let i = 0; i < count; i++) {
    const p = pieces[i];
    if (p.kind === "text" || !(p.trimBefore || p.trimAfter)) continue;
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

// Character scans over source offsets instead of end-anchored regular expressions, which V8
// retries from every position of a long text piece.
const isSpaceTab = (c: number) => c === 32 || c === 9;

/** Where the trailing run of spaces and tabs of src[from, to) starts. */
function spacesStart(src: string, from: number, to: number): number {
  let k = to;
  while (k > from && isSpaceTab(src.charCodeAt(k - 1))) k--;
  return k;
}

/** Where the leading run of spaces and tabs of src[from, to) ends. */
function spacesEnd(src: string, from: number, to: number): number {
  let k = from;
  while (k < to && isSpaceTab(src.charCodeAt(k))) k++;
  return k;
}

/** After the leading spaces of src[from, to): `to`, or just past "\n" / "\r\n"; else -1. */
function lineEndAfterSpaces(src: string, from: number, to: number): number {
  const k = spacesEnd(src, from, to);
  if (k === to) return k;
  if (src.charCodeAt(k) === 10) return k + 1;
  if (src.charCodeAt(k) === 13 && k + 1 < to && src.charCodeAt(k + 1) === 10) return k + 2;
  return -1;
}
