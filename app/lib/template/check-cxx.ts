// `target c` portability: warns where a template writes C that C++ refuses, so a header stays
// usable by firmware built with either toolchain (decision 015). What it can know when the
// template is compiled, from the template's own text (printed values are opaque):
// - array-index designators inside an initializer (`[3] = { … }`): C99 has them, C++ has none;
// - field designators out of declaration order (`{ .event = …, .color = … }` where the struct
//   declares `color` first), for structs the template declares itself (`typedef struct { … } t;`).
// It walks the AST like a tiny C scanner: every branch of a `when` starts from the same state and
// the branches merge afterwards, so fields written by different branches are not compared.
import type { Node, TemplateAst } from "./ast";

export interface PortabilityWarning {
  message: string;
  from: number;
  to: number;
}

type Tok = { t: "id" | "num" | "p" | "val"; v: string; from: number; to: number };

interface Frame {
  init: boolean;
  /** Fields of the struct this brace initializes, in declaration order. */
  fields?: { type: string; names: string[] };
  /** A table: its entries (one level down) are of this struct. */
  entries?: { type: string; names: string[] };
  /** Index of the last field designated at this level, and its name. */
  last: number;
  lastName: string;
}

interface State {
  stack: Frame[];
  /** Tokens of the current declaration at file level (to find `type name[…] = {`). */
  decl: Tok[];
  prev: Tok | null;
  /** An open `[` in an initializer: where it started and how deep the brackets are. */
  bracket: { from: number; depth: number } | null;
  /** A `[…]` just closed in an initializer: a `=` next makes it a designator. */
  closed: { from: number; to: number } | null;
  /** `.name` just read in an initializer: a `=` next makes it a designator. */
  dot: { name: string; from: number; to: number } | null;
  lost: boolean;
}

const clone = (s: State): State => ({ ...s, stack: s.stack.map((f) => ({ ...f })), decl: [...s.decl] });

export function cxxPortability(ast: TemplateAst, source: string): PortabilityWarning[] {
  const structs = declaredStructs(ast);
  const out = new Map<string, PortabilityWarning>();
  const warn = (message: string, from: number, to: number) => out.set(`${from}:${message}`, { message, from, to });

  const feed = (s: State, tok: Tok) => {
    if (s.lost) return;
    const top = s.stack[s.stack.length - 1];
    const inInit = !!top?.init;
    const prevV = s.prev?.v;
    if (s.bracket) {
      if (tok.v === "[") s.bracket.depth++;
      else if (tok.v === "]" && --s.bracket.depth === 0) {
        s.closed = { from: s.bracket.from, to: tok.to };
        s.bracket = null;
      }
      s.prev = tok;
      return;
    }
    if (s.closed) {
      if (tok.v === "=") warn("an array-index designator ('[n] = …') is C only: C++ refuses it. Write the index in a comment before the entry instead ('/* #n */ { … }'; see 'C and C++ alike' in the reference)", s.closed.from, s.closed.to);
      s.closed = null;
    }
    if (s.dot) {
      const d = s.dot;
      s.dot = null;
      if (tok.v === "=" && top?.fields) {
        const at = top.fields.names.indexOf(d.name);
        if (at >= 0 && at < top.last)
          warn(`'.${d.name}' is designated after '.${top.lastName}' but ${top.fields.type} declares it before: C++ needs field designators in declaration order`, d.from, d.to);
        if (at >= 0) {
          top.last = at;
          top.lastName = d.name;
        }
      }
    }
    if (tok.t === "p" && tok.v === "{") {
      const init = prevV === "=" || (inInit && (prevV === "{" || prevV === ","));
      const frame: Frame = { init, last: -1, lastName: "" };
      if (init && !inInit && prevV === "=") {
        const d = declarator(s.decl, structs);
        if (d?.table) frame.entries = d.struct;
        else if (d) frame.fields = d.struct;
      } else if (init && top?.entries) frame.fields = top.entries; // an entry of a table, designated or not
      s.stack.push(frame);
      s.decl = [];
    } else if (tok.t === "p" && tok.v === "}") {
      s.stack.pop();
      s.decl = [];
    } else if (tok.t === "p" && tok.v === ";") {
      s.decl = [];
    } else if (inInit && tok.v === "[" && (prevV === "{" || prevV === "," || prevV === "]")) {
      s.bracket = { from: tok.from, depth: 1 };
    } else if (inInit && tok.t === "id" && prevV === "." && s.prev && (beforeDot === "{" || beforeDot === ",")) {
      s.dot = { name: tok.v, from: s.prev.from, to: tok.to };
    } else if (!inInit) s.decl.push(tok);
    s.prev = tok;
  };
  // `.name` starts a designator only right after `{` or `,` (not `a.b` inside an expression).
  let beforeDot: string | undefined;
  const feedAll = (s: State, toks: Tok[]) => {
    for (const t of toks) {
      if (t.v === ".") beforeDot = s.prev?.v;
      feed(s, t);
    }
  };

  const merge = (states: State[]): State => {
    const [first] = states;
    if (states.some((x) => x.lost || x.stack.length !== first.stack.length || !!x.bracket !== !!first.bracket)) return { ...first, lost: true };
    const m = clone(first);
    // After a branch, a later field only has to come after what every branch wrote: the least.
    m.stack.forEach((f, i) => {
      for (const x of states)
        if (x.stack[i].last < f.last) {
          f.last = x.stack[i].last;
          f.lastName = x.stack[i].lastName;
        }
    });
    // A loop that ran or did not leaves `{` or `,` before what follows: either starts an entry.
    if (states.some((x) => x.prev?.v !== first.prev?.v))
      m.prev = states.every((x) => x.prev?.v === "{" || x.prev?.v === ",") ? { t: "p", v: ",", from: 0, to: 0 } : { t: "val", v: "", from: 0, to: 0 };
    return m;
  };

  const expanding = new Set<string>();
  // Pieces are walked where they are used; pieces using pieces could multiply that, so the walk
  // has a budget of its own and gives up quietly (no warnings are invented) past it.
  let budget = 200_000;
  const walk = (s: State, nodes: Node[]): State => {
    for (const n of nodes) {
      if (--budget < 0) s.lost = true;
      if (s.lost) return s;
      switch (n.k) {
        case "text":
          feedAll(s, lexC(n.value, textOffset(source, n)));
          break;
        case "out":
          feedAll(s, [{ t: "val", v: "", from: n.from, to: n.to }]);
          break;
        case "if": {
          const ends = n.branches.map((b) => walk(clone(s), b.body));
          ends.push(n.otherwise ? walk(clone(s), n.otherwise) : clone(s));
          s = merge(ends);
          break;
        }
        case "over": {
          const once = walk(clone(s), n.body);
          const ends = [s, once];
          if (n.none) ends.push(walk(clone(s), n.none));
          s = merge(ends);
          break;
        }
        case "use": {
          const piece = n.external ? undefined : ast.pieces.get(n.name);
          if (piece && !expanding.has(n.name)) {
            expanding.add(n.name);
            s = walk(s, piece.body);
            expanding.delete(n.name);
          } else feedAll(s, [{ t: "val", v: "", from: n.from, to: n.to }]);
          break;
        }
        case "let":
          break;
      }
    }
    return s;
  };
  walk({ stack: [], decl: [], prev: null, bracket: null, closed: null, dot: null, lost: false }, ast.body);
  return [...out.values()].sort((a, b) => a.from - b.from);
}

/** Where a text node's value starts in the source (whitespace control may have trimmed its ends). */
function textOffset(source: string, n: { value: string; from: number; to: number }): number {
  const at = source.slice(n.from, n.to).indexOf(n.value);
  return n.from + Math.max(0, at);
}

/** `[static] [const] type name[…] = {`: the struct type and whether it is a table. */
function declarator(decl: Tok[], structs: Map<string, string[]>): { struct: { type: string; names: string[] }; table: boolean } | null {
  let i = decl.length - 1;
  if (decl[i]?.v !== "=") return null;
  i--;
  let table = false;
  if (decl[i]?.v === "]") {
    table = true;
    let depth = 0;
    for (; i >= 0; i--) {
      if (decl[i].v === "]") depth++;
      else if (decl[i].v === "[" && --depth === 0) break;
    }
    i--;
  }
  if (decl[i]?.t !== "id") return null;
  const type = decl[i - 1];
  if (type?.t !== "id") return null;
  const key = decl[i - 2]?.v === "struct" ? `struct ${type.v}` : type.v;
  const names = structs.get(key);
  return names ? { struct: { type: key, names }, table } : null;
}

/** Struct types the template declares in its own text: `typedef struct [tag] { … } name;` and `struct tag { … };`. */
function declaredStructs(ast: TemplateAst): Map<string, string[]> {
  const texts: string[] = [];
  const collect = (nodes: Node[]) => {
    for (const n of nodes) {
      if (n.k === "text") texts.push(n.value);
      else if (n.k === "out") texts.push("\u0001");
      else if (n.k === "if") {
        n.branches.forEach((b) => collect(b.body));
        if (n.otherwise) collect(n.otherwise);
      } else if (n.k === "over") {
        collect(n.body);
        if (n.none) collect(n.none);
      }
    }
  };
  collect(ast.body);
  for (const p of ast.pieces.values()) collect(p.body);
  const text = texts.join("").replace(/\/\*[\s\S]*?\*\/|\/\/[^\n]*/g, " ");
  const found = new Map<string, string[]>();
  for (const m of text.matchAll(/\bstruct\s*(\w*)\s*\{([^{}]*)\}\s*(\w*)\s*;/g)) {
    const names = fieldNames(m[2]);
    if (!names) continue;
    const isTypedef = /\btypedef\s+(?:const\s+)?$/.test(text.slice(Math.max(0, m.index - 20), m.index));
    if (isTypedef && m[3]) found.set(m[3], names);
    if (m[1]) found.set(`struct ${m[1]}`, names);
  }
  return found;
}

/** The member names of a struct body in declaration order, or null where it is beyond this check. */
function fieldNames(body: string): string[] | null {
  const names: string[] = [];
  for (const decl of body.split(";")) {
    const d = decl.replace(/\[[^\]]*\]/g, "").replace(/:\s*\w+/g, "").trim();
    if (!d) continue;
    if (/[(\u0001]/.test(d)) return null;
    const parts = d.split(",");
    const first = /(\w+)\s*$/.exec(parts[0]);
    if (!first) return null;
    names.push(first[1]);
    for (const p of parts.slice(1)) {
      const m = /^\s*\**\s*(\w+)\s*$/.exec(p);
      if (!m) return null;
      names.push(m[1]);
    }
  }
  return names;
}

const isIdStart = (c: number) => (c >= 65 && c <= 90) || (c >= 97 && c <= 122) || c === 95;
const isDigit = (c: number) => c >= 48 && c <= 57;
const isIdPart = (c: number) => isIdStart(c) || isDigit(c);

/** C tokens of one piece of text: comments, strings, character constants and preprocessor lines skipped. */
function lexC(text: string, base: number): Tok[] {
  const toks: Tok[] = [];
  const n = text.length;
  let i = 0;
  let lineStart = true;
  while (i < n) {
    const c = text.charCodeAt(i);
    if (c === 10) {
      lineStart = true;
      i++;
      continue;
    }
    if (c === 32 || c === 9 || c === 13) {
      i++;
      continue;
    }
    const next = text.charCodeAt(i + 1);
    if (c === 47 && next === 42) {
      const end = text.indexOf("*/", i + 2);
      i = end < 0 ? n : end + 2;
      continue;
    }
    if ((c === 47 && next === 47) || (c === 35 && lineStart)) {
      while (i < n && text.charCodeAt(i) !== 10) i += text.charCodeAt(i) === 92 ? 2 : 1;
      continue;
    }
    lineStart = false;
    const start = i;
    if (c === 34 || c === 39) {
      i++;
      while (i < n && text.charCodeAt(i) !== c && text.charCodeAt(i) !== 10) i += text.charCodeAt(i) === 92 ? 2 : 1;
      i++;
      toks.push({ t: "val", v: "", from: base + start, to: base + i });
    } else if (isIdStart(c)) {
      while (i < n && isIdPart(text.charCodeAt(i))) i++;
      toks.push({ t: "id", v: text.slice(start, i), from: base + start, to: base + i });
    } else if (isDigit(c)) {
      while (i < n && (isIdPart(text.charCodeAt(i)) || text.charCodeAt(i) === 46)) i++;
      toks.push({ t: "num", v: text.slice(start, i), from: base + start, to: base + i });
    } else if (c === 61 && next === 61) {
      i += 2;
      toks.push({ t: "p", v: "==", from: base + start, to: base + i });
    } else {
      i++;
      toks.push({ t: "p", v: text[start], from: base + start, to: base + i });
    }
  }
  return toks;
}
