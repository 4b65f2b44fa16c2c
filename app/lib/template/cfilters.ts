// Filters that place model values into C source: identifiers (C11 §6.4.1, §6.4.2), string
// literals (§6.4.5), comments, numbers and colours. These are what make a model string safe
// to print into a header; the checker flags free text printed without one of them.
import { fail, needNum, needStr, needWidth, show, type FilterDef } from "./filters";
import { STR, type Ty } from "./types";

/** C11 §6.4.1 keywords. */
export const C11_KEYWORDS = new Set([
  "auto", "break", "case", "char", "const", "continue", "default", "do", "double", "else", "enum", "extern",
  "float", "for", "goto", "if", "inline", "int", "long", "register", "restrict", "return", "short", "signed",
  "sizeof", "static", "struct", "switch", "typedef", "union", "unsigned", "void", "volatile", "while",
  "_Alignas", "_Alignof", "_Atomic", "_Bool", "_Complex", "_Generic", "_Imaginary", "_Noreturn",
  "_Static_assert", "_Thread_local",
]);

/** An identifier per §6.4.2 (basic source characters only), never a keyword, never reserved (§7.1.3). */
export function toCIdentifier(input: string): string {
  let s = input.replace(/[^A-Za-z0-9_]+/g, "_").replace(/_+/g, "_");
  if (s.length > 1) s = s.replace(/^_+|_+$/g, "") || "_";
  if (s === "" || s === "_") s = "id";
  if (/^[0-9]/.test(s)) s = "n" + s;
  if (C11_KEYWORDS.has(s)) s += "_";
  // Names that start with an underscore and a capital, or two underscores, belong to the
  // implementation (§7.1.3); the trimming above already removed leading underscores.
  return s.slice(0, 63);
}

/** A C string literal: printable ASCII kept, the rest escaped; '??' split so no trigraph forms. */
const PLAIN_C = /^[\x20-\x21\x23-\x3e\x40-\x5b\x5d-\x7e]*$/;

export function toCString(input: string): string {
  // Most model text is printable ASCII without quotes, backslashes or '?': nothing to escape.
  if (PLAIN_C.test(input)) return '"' + input + '"';
  let out = '"';
  const bytes = new TextEncoder().encode(input);
  let prevQ = false;
  for (const b of bytes) {
    let piece: string;
    if (b === 0x22) piece = '\\"';
    else if (b === 0x5c) piece = "\\\\";
    else if (b === 0x0a) piece = "\\n";
    else if (b === 0x09) piece = "\\t";
    else if (b === 0x0d) piece = "\\r";
    else if (b === 0x3f) piece = prevQ ? "\\?" : "?";
    else if (b >= 0x20 && b < 0x7f) piece = String.fromCharCode(b);
    // Octal escapes take at most three digits, so the next character can never extend them.
    else piece = "\\" + b.toString(8).padStart(3, "0");
    // Any '?' after a '?' is escaped, so no two stay side by side: "???/" → "?\?\?/".
    prevQ = b === 0x3f;
    out += piece;
  }
  return out + '"';
}

/** Text safe inside both /* *\/ and // comments. */
export function toCComment(input: string): string {
  let s = input.replace(/[\u0000-\u001f\u007f\u2028\u2029]+/g, " ");
  // Every '?' followed by another gets a space: a run of three ("???/") must not leave a pair.
  s = s.replace(/\*\//g, "* /").replace(/\/\*/g, "/ *").replace(/\?(?=\?)/g, "? ");
  s = s.replace(/\s+$/, "");
  // A backslash at the end of a line would splice the next line into a // comment.
  if (s.endsWith("\\")) s += ".";
  return s;
}

/** A C double constant that reads back to exactly the same number. */
export function toCDouble(n: number): string {
  if (Number.isInteger(n) && Math.abs(n) < 1e21) return Object.is(n, -0) ? "-0.0" : n + ".0";
  const s = String(n);
  return /[.eE]/.test(s) ? s : s + ".0";
}

const colorRe = /^#([0-9a-fA-F]{6})$/;
function needColor(v: unknown): string {
  if (typeof v !== "string" || !colorRe.test(v)) fail(`expected a colour written #rrggbb, not ${show(v)}`);
  return (v as string).slice(1);
}

// The output type of the C text filters depends only on the input's 'maybe' (false, true, or a
// present-but-undefined flag), so the three possible types are made once, not on every use.
const C_STR_FALSE = Object.freeze({ ...STR, maybe: false }) as Ty;
const C_STR_TRUE = Object.freeze({ ...STR, maybe: true }) as Ty;
const C_STR_UNSET = Object.freeze({ ...STR, maybe: undefined }) as Ty;
const cStr = (t: Ty): Ty => {
  const m = "maybe" in t && t.maybe;
  return m === true ? C_STR_TRUE : m === undefined ? C_STR_UNSET : C_STR_FALSE;
};

/** Names given out per scope table, so each new name is checked in constant time. */
const TAKEN = new WeakMap<Map<string, string>, Set<string>>();
const MAX_IDENT = 63;

export const C_FILTERS: [string, FilterDef][] = [
  [
    "cident",
    {
      min: 0,
      max: 1,
      input: "str",
      out: cStr,
      cSafe: true,
      fn: (v, [scope = ""], ctx) => {
        const s = needStr(v, "the input of 'cident'");
        const sc = needStr(scope, "the scope of 'cident'");
        let table = ctx.idents.get(sc);
        if (!table) ctx.idents.set(sc, (table = new Map()));
        const known = table.get(s);
        if (known !== undefined) return known;
        const base = toCIdentifier(s);
        let taken = TAKEN.get(table);
        if (!taken) TAKEN.set(table, (taken = new Set(table.values())));
        let name = base;
        // C11 §5.2.4.1 guarantees 63 significant initial characters: the suffix goes inside them.
        for (let i = 2; taken.has(name); i++) {
          const suffix = `_${i}`;
          name = `${base.slice(0, MAX_IDENT - suffix.length)}${suffix}`;
        }
        table.set(s, name);
        taken.add(name);
        return name;
      },
    },
  ],
  // Deliberately unsafe: the model's text exactly as it is, even under `target c`. The filter's
  // name is the marker a reviewer looks for; an optional reason says why, e.g. raw("a folder name").
  [
    "raw",
    {
      min: 0,
      max: 1,
      input: "any",
      out: (t) => (t.k === "str" ? STR : t),
      cSafe: true,
      fn: (v, [reason]) => {
        if (reason !== undefined) needStr(reason, "the reason given to 'raw'");
        return v;
      },
    },
  ],
  ["cstr", { min: 0, max: 0, input: "str", out: cStr, cSafe: true, fn: (v) => toCString(needStr(v, "the input of 'cstr'")) }],
  ["ccomment", { min: 0, max: 0, input: "any", out: cStr, cSafe: true, fn: (v) => toCComment(typeof v === "string" ? v : String(needNum(v, "the input of 'ccomment'"))) }],
  ["cdouble", { min: 0, max: 0, input: "num", out: () => STR, cSafe: true, fn: (v) => toCDouble(needNum(v, "the input of 'cdouble'")) }],
  [
    "hex",
    {
      min: 0,
      max: 1,
      input: "color",
      out: () => STR,
      cSafe: true,
      fn: (v, [form = "keep"]) => {
        const digits = needColor(v);
        if (form === "upper") return "0x" + digits.toUpperCase();
        if (form === "lower") return "0x" + digits.toLowerCase();
        if (form === "keep") return "0x" + digits;
        return fail(`the form of 'hex' is "keep", "upper" or "lower", not ${show(form)}`);
      },
    },
  ],
  [
    "bytes",
    {
      min: 0,
      max: 0,
      input: "color",
      out: () => ({ k: "list", of: STR }),
      cSafe: true,
      fn: (v) => {
        const d = needColor(v).toUpperCase();
        return [d.slice(0, 2), d.slice(2, 4), d.slice(4, 6)].map((x) => "0x" + x);
      },
    },
  ],
  [
    "cint",
    {
      min: 0,
      max: 1,
      input: "num",
      out: () => STR,
      cSafe: true,
      fn: (v, [width = 0], ctx) => {
        const n = needNum(v, "the input of 'cint'");
        if (!Number.isSafeInteger(n)) fail(`'cint' needs a whole number, not ${n}`);
        return String(n).padStart(needWidth(width, "the width of 'cint'", ctx), " ");
      },
    },
  ],
];
