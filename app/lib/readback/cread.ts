// A reader for the part of C the generic header uses: `name[...] = { ... };` initializers with
// designators, numbers, string literals and enum names. Comments and preprocessor lines are
// skipped, so a hand-edited file with extra comments or reordered lines still reads; the one
// comment it understands is an entry's index, `/* #3 */ { … }`, which version 2 of the header
// writes instead of C's `[3] = { … }` (C++ has no array designators).

export interface Pos {
  line: number;
  column: number;
}

export type CVal =
  | { k: "num"; v: number; raw: string; pos: Pos }
  | { k: "str"; v: string; pos: Pos }
  | { k: "ident"; v: string; pos: Pos }
  | { k: "list"; items: CItem[]; pos: Pos };

export interface CItem {
  field?: string;
  index?: number;
  value: CVal;
  pos: Pos;
}

interface CTok {
  // `idx`: an index comment (slash-star #n star-slash), kept only where an entry starts.
  t: "id" | "num" | "str" | "p" | "idx";
  v: string;
  pos: Pos;
}

export class CReadError extends Error {
  constructor(
    message: string,
    readonly pos: Pos,
  ) {
    super(message);
  }
}

const INDEX_COMMENT = /^\s*#\s*([0-9]+)\s*$/;

// Index comments count only right before an entry (`{` or `,` before, `{` after); elsewhere
// they are plain comments.
function placeIndexComments(toks: CTok[]): CTok[] {
  return toks.filter((t, k) => t.t !== "idx" || ((toks[k - 1]?.v === "{" || toks[k - 1]?.v === ",") && toks[k + 1]?.v === "{"));
}

const SIMPLE_ESC: Record<string, number> = { n: 10, t: 9, r: 13, a: 7, b: 8, f: 12, v: 11, "\\": 92, '"': 34, "'": 39, "?": 63 };

function lex(text: string): CTok[] {
  const toks: CTok[] = [];
  let line = 1;
  let lineStart = 0;
  let i = 0;
  const n = text.length;
  const pos = (at: number): Pos => ({ line, column: at - lineStart + 1 });
  const newline = (at: number) => {
    line++;
    lineStart = at + 1;
  };
  let atLineStart = true;
  while (i < n) {
    const c = text[i];
    if (c === "\n") {
      newline(i);
      i++;
      atLineStart = true;
      continue;
    }
    if (c === " " || c === "\t" || c === "\r" || c === "\f" || c === "\v") {
      i++;
      continue;
    }
    if (c === "/" && text[i + 1] === "*") {
      const end = text.indexOf("*/", i + 2);
      if (end === -1) throw new CReadError("a comment '/*' is never closed", pos(i));
      const index = INDEX_COMMENT.exec(text.slice(i + 2, end));
      if (index) toks.push({ t: "idx", v: index[1], pos: pos(i) });
      for (let k = i; k < end; k++) if (text[k] === "\n") newline(k);
      i = end + 2;
      continue;
    }
    if ((c === "/" && text[i + 1] === "/") || (c === "#" && atLineStart)) {
      // Preprocessor lines and // comments run to the end of the line, with backslash splices.
      while (i < n && text[i] !== "\n") {
        if (text[i] === "\\" && text[i + 1] === "\n") {
          newline(i + 1);
          i++;
        }
        i++;
      }
      continue;
    }
    atLineStart = false;
    const start = i;
    if (/[A-Za-z_]/.test(c)) {
      while (i < n && /[A-Za-z0-9_]/.test(text[i])) i++;
      toks.push({ t: "id", v: text.slice(start, i), pos: pos(start) });
    } else if (/[0-9]/.test(c) || (c === "." && /[0-9]/.test(text[i + 1] ?? ""))) {
      while (i < n && /[0-9A-Za-z_.]/.test(text[i])) {
        if ((text[i] === "e" || text[i] === "E") && (text[i + 1] === "+" || text[i + 1] === "-") && !/^0[xX]/.test(text.slice(start, i))) i++;
        i++;
      }
      toks.push({ t: "num", v: text.slice(start, i), pos: pos(start) });
    } else if (c === '"') {
      i++;
      while (i < n && text[i] !== '"') {
        if (text[i] === "\n") throw new CReadError("a string is never closed", pos(start));
        i += text[i] === "\\" ? 2 : 1;
      }
      if (i >= n) throw new CReadError("a string is never closed", pos(start));
      i++;
      toks.push({ t: "str", v: text.slice(start, i), pos: pos(start) });
    } else {
      toks.push({ t: "p", v: c, pos: pos(start) });
      i++;
    }
  }
  return toks;
}

export function decodeCString(lit: string, at: Pos): string {
  const bytes: number[] = [];
  const body = lit.slice(1, -1);
  const enc = new TextEncoder();
  let i = 0;
  while (i < body.length) {
    const c = body[i];
    if (c !== "\\") {
      const ch = String.fromCodePoint(body.codePointAt(i)!);
      for (const b of enc.encode(ch)) bytes.push(b);
      i += ch.length;
      continue;
    }
    const e = body[++i];
    i++;
    if (e in SIMPLE_ESC) bytes.push(SIMPLE_ESC[e]);
    else if (/[0-7]/.test(e)) {
      let digits = e;
      while (digits.length < 3 && /[0-7]/.test(body[i] ?? "")) digits += body[i++];
      bytes.push(parseInt(digits, 8) & 0xff);
    } else if (e === "x") {
      let digits = "";
      while (/[0-9a-fA-F]/.test(body[i] ?? "")) digits += body[i++];
      if (!digits) throw new CReadError("'\\x' needs hex digits", at);
      bytes.push(parseInt(digits, 16) & 0xff);
    } else throw new CReadError(`unknown escape '\\${e ?? ""}' in a string`, at);
  }
  try {
    return new TextDecoder("utf-8", { fatal: true }).decode(new Uint8Array(bytes));
  } catch {
    throw new CReadError("a string is not valid UTF-8", at);
  }
}

export function parseCNumber(raw: string, at: Pos): number {
  const s = raw.replace(/[uUlLfF]+$/, (m) => (/^0[xX]/.test(raw) && /[fF]/.test(m) ? m : ""));
  let v: number;
  if (/^0[xX][0-9a-fA-F]+$/.test(s)) v = parseInt(s.slice(2), 16);
  else if (/^0[0-7]+$/.test(s)) v = parseInt(s, 8);
  else if (/^([0-9]+\.?[0-9]*|\.[0-9]+)([eE][+-]?[0-9]+)?$/.test(s)) v = Number(s);
  else throw new CReadError(`'${raw}' is not a number`, at);
  return v;
}

/** All `name[...] = { ... }` and `name = { ... }` initializers of the file, by name. */
export function readInitializers(text: string): Map<string, CVal & { k: "list" }> {
  const toks = placeIndexComments(lex(text));
  const out = new Map<string, CVal & { k: "list" }>();
  let i = 0;
  const expect = (v: string) => {
    const t = toks[i];
    if (!t || t.v !== v) throw new CReadError(`expected '${v}'${t ? ` but found '${t.v}'` : " before the end of the file"}`, t?.pos ?? toks[toks.length - 1]?.pos ?? { line: 1, column: 1 });
    i++;
  };
  const value = (): CVal => {
    const t = toks[i];
    if (!t) throw new CReadError("the file ends inside an initializer", toks[toks.length - 1].pos);
    if (t.t === "p" && t.v === "{") return list();
    i++;
    if (t.t === "p" && t.v === "-") {
      const nt = toks[i++];
      if (!nt || nt.t !== "num") throw new CReadError("expected a number after '-'", t.pos);
      return { k: "num", v: -parseCNumber(nt.v, nt.pos), raw: "-" + nt.v, pos: t.pos };
    }
    if (t.t === "num") return { k: "num", v: parseCNumber(t.v, t.pos), raw: t.v, pos: t.pos };
    if (t.t === "id") return { k: "ident", v: t.v, pos: t.pos };
    if (t.t === "str") {
      let v = decodeCString(t.v, t.pos);
      while (toks[i]?.t === "str") v += decodeCString(toks[i].v, toks[i++].pos);
      return { k: "str", v, pos: t.pos };
    }
    throw new CReadError(`unexpected '${t.v}' in an initializer`, t.pos);
  };
  let depth = 0;
  const list = (): CVal & { k: "list" } => {
    const open = toks[i];
    // The header nests three levels at most; a deeper file is hand-made trouble, not a config.
    if (++depth > 8) throw new CReadError("initializers are nested too deeply", open.pos);
    expect("{");
    const items: CItem[] = [];
    while (toks[i] && toks[i].v !== "}") {
      const at = toks[i].pos;
      const item: Partial<CItem> = { pos: at };
      if (toks[i].t === "idx") {
        item.index = Number(toks[i].v);
        i++;
      } else if (toks[i].v === "." && toks[i + 1]?.t === "id") {
        item.field = toks[i + 1].v;
        i += 2;
        expect("=");
      } else if (toks[i].v === "[") {
        i++;
        const nt = toks[i++];
        if (!nt || nt.t !== "num") throw new CReadError("expected an index number inside '[ ]'", at);
        item.index = parseCNumber(nt.v, nt.pos);
        expect("]");
        expect("=");
      }
      item.value = value();
      items.push(item as CItem);
      if (toks[i]?.v === ",") i++;
      else break;
    }
    if (!toks[i]) throw new CReadError("this '{' is never closed", open.pos);
    expect("}");
    depth--;
    return { k: "list", items, pos: open.pos };
  };
  while (i < toks.length) {
    const t = toks[i];
    if (t.t === "id" && /^hb_/.test(t.v)) {
      let j = i + 1;
      if (toks[j]?.v === "[") {
        while (j < toks.length && toks[j].v !== "]") j++;
        j++;
      }
      if (toks[j]?.v === "=" && toks[j + 1]?.v === "{") {
        i = j + 1;
        const v = list();
        if (out.has(t.v)) throw new CReadError(`'${t.v}' is defined twice`, t.pos);
        out.set(t.v, v);
        continue;
      }
    }
    i++;
  }
  return out;
}
