// Stage 2b: the expression grammar inside one tag, loosest first:
//   or → and → not → comparison → + - → * / % → unary - → postfix (.field, [index]) → primary
// with filters (`|> name(args)`) binding loosest of all, so `a + b |> fixed(2)` formats the sum.
import type { BinaryOp, Expr } from "./ast";
import { TemplateFailure } from "./errors";
import type { Piece, Tok } from "./tokenize";

export const KEYWORDS = new Set(["and", "or", "not", "true", "false", "nothing"]);
const CMP = ["==", "!=", "<", "<=", ">", ">="];

/** Expression parser over the tokens of one tag. */
export class Cursor {
  private nest = 0;
  constructor(
    private toks: Tok[],
    private i: number,
    private piece: Piece,
    private depth: number,
    private maxDepth: number,
  ) {}
  peekTok(): Tok | undefined {
    return this.toks[this.i];
  }
  peek(op: string): boolean {
    const t = this.toks[this.i];
    return !!t && t.kind !== "str" && t.value === op;
  }
  next(): Tok | undefined {
    return this.toks[this.i++];
  }
  private fail(msg: string, t?: Tok): TemplateFailure {
    const at = t ?? this.toks[this.i];
    return at ? new TemplateFailure("parse", msg, at.from, at.to) : new TemplateFailure("parse", msg, this.piece.to - 2, this.piece.to);
  }
  op(op: string) {
    if (!this.peek(op)) throw this.fail(`expected '${op}'${this.toks[this.i] ? ` but found '${this.toks[this.i].value}'` : " before the end of the tag"}`);
    this.i++;
  }
  keyword(word: string) {
    const t = this.toks[this.i];
    if (!t || t.kind !== "ident" || t.value !== word) throw this.fail(`expected '${word}'`);
    this.i++;
  }
  name(what: string): string {
    const t = this.toks[this.i];
    if (!t || t.kind !== "ident" || KEYWORDS.has(t.value)) throw this.fail(`expected ${what}`);
    this.i++;
    return t.value;
  }
  end() {
    if (this.i < this.toks.length) throw this.fail(`unexpected '${this.toks[this.i].value}' at the end of the tag`);
  }
  exprToEnd(): Expr {
    const e = this.expr();
    this.end();
    return e;
  }
  exprUntil(word: string): Expr {
    const e = this.expr();
    if (!this.toks[this.i] || this.toks[this.i].value !== word) throw this.fail(`expected '${word}'`);
    return e;
  }
  expr(): Expr {
    if (++this.nest + this.depth > this.maxDepth) throw this.fail(`expression nested deeper than the limit of ${this.maxDepth}`);
    let e = this.or();
    while (this.peek("|>")) {
      this.i++;
      const nameTok = this.toks[this.i];
      if (!nameTok || nameTok.kind !== "ident") throw this.fail("expected a filter name after '|>'");
      this.i++;
      const args: Expr[] = [];
      let to = nameTok.to;
      if (this.peek("(")) {
        this.i++;
        while (!this.peek(")")) {
          args.push(this.expr());
          if (!this.peek(",")) break;
          this.i++;
        }
        to = this.toks[this.i]?.to ?? to;
        this.op(")");
      }
      e = { k: "filter", input: e, name: nameTok.value, args, nameFrom: nameTok.from, nameTo: nameTok.to, from: e.from, to };
    }
    this.nest--;
    return e;
  }
  // Each level is a plain loop calling the next one directly: no closure per call, since an
  // expression is parsed on every keystroke in the editor.
  private or(): Expr {
    let left = this.and();
    for (let t = this.toks[this.i]; t && t.kind === "ident" && t.value === "or"; t = this.toks[this.i]) {
      this.i++;
      const right = this.and();
      left = { k: "binary", op: "or", left, right, from: left.from, to: right.to };
    }
    return left;
  }
  private and(): Expr {
    let left = this.not();
    for (let t = this.toks[this.i]; t && t.kind === "ident" && t.value === "and"; t = this.toks[this.i]) {
      this.i++;
      const right = this.not();
      left = { k: "binary", op: "and", left, right, from: left.from, to: right.to };
    }
    return left;
  }
  private not(): Expr {
    const t = this.toks[this.i];
    if (t && t.kind === "ident" && t.value === "not") {
      this.i++;
      const arg = this.not();
      return { k: "unary", op: "not", arg, from: t.from, to: arg.to };
    }
    return this.cmp();
  }
  private cmp(): Expr {
    const left = this.add();
    const t = this.toks[this.i];
    if (t && t.kind === "op" && CMP.includes(t.value)) {
      this.i++;
      const right = this.add();
      return { k: "binary", op: t.value as BinaryOp, left, right, from: left.from, to: right.to };
    }
    return left;
  }
  private add(): Expr {
    let left = this.mul();
    for (let t = this.toks[this.i]; t && t.kind === "op" && (t.value === "+" || t.value === "-"); t = this.toks[this.i]) {
      this.i++;
      const right = this.mul();
      left = { k: "binary", op: t.value as BinaryOp, left, right, from: left.from, to: right.to };
    }
    return left;
  }
  private mul(): Expr {
    let left = this.unary();
    for (let t = this.toks[this.i]; t && t.kind === "op" && (t.value === "*" || t.value === "/" || t.value === "%"); t = this.toks[this.i]) {
      this.i++;
      const right = this.unary();
      left = { k: "binary", op: t.value as BinaryOp, left, right, from: left.from, to: right.to };
    }
    return left;
  }
  private unary(): Expr {
    const t = this.toks[this.i];
    if (t && t.kind === "op" && t.value === "-") {
      this.i++;
      const arg = this.unary();
      return { k: "unary", op: "-", arg, from: t.from, to: arg.to };
    }
    return this.postfix();
  }
  private postfix(): Expr {
    let e = this.primary();
    for (;;) {
      if (this.peek(".")) {
        this.i++;
        const t = this.toks[this.i];
        if (!t || t.kind !== "ident") throw this.fail("expected a field name after '.'");
        this.i++;
        e = { k: "get", obj: e, key: t.value, keyFrom: t.from, from: e.from, to: t.to };
      } else if (this.peek("[")) {
        this.i++;
        const key = this.expr();
        const end = this.toks[this.i];
        this.op("]");
        e = { k: "index", obj: e, key, from: e.from, to: end.to };
      } else return e;
    }
  }
  private primary(): Expr {
    const t = this.toks[this.i];
    if (!t) throw this.fail("expected a value before the end of the tag");
    this.i++;
    if (t.kind === "num") return { k: "lit", value: Number(t.value), from: t.from, to: t.to };
    if (t.kind === "str") return { k: "lit", value: t.value, from: t.from, to: t.to };
    if (t.kind === "ident") {
      if (t.value === "true" || t.value === "false") return { k: "lit", value: t.value === "true", from: t.from, to: t.to };
      if (t.value === "nothing") return { k: "lit", value: null, from: t.from, to: t.to };
      if (KEYWORDS.has(t.value)) throw this.fail(`'${t.value}' cannot start a value`, t);
      return { k: "var", name: t.value, from: t.from, to: t.to };
    }
    if (t.value === "(") {
      const e = this.expr();
      this.op(")");
      return e;
    }
    throw this.fail(`expected a value but found '${t.value}'`, t);
  }
}
