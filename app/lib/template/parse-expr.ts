// Stage 2b: the expression grammar inside one tag, loosest first:
//   or → and → not → comparison → + - → * / % → unary - → postfix (.field, [index]) → primary
// with filters (`|> name(args)`) binding loosest of all, so `a + b |> fixed(2)` formats the sum.
// The cursor walks token indices of the lexer's typed arrays and compares kinds, not strings.
import type { BinaryOp, Expr } from "./ast";
import { TemplateFailure } from "./errors";
import type { Piece } from "./tokenize";
import {
  CLOSER, COMMA, DOT, EQ, GE, GT, IDENT, KW_AND, KW_FALSE, KW_NOT, KW_NOTHING, KW_OR, KW_TRUE, LBRACK, LE, LPAREN, LT, MINUS, NE, NUM,
  OP_TEXT, PERCENT, PIPE, PLUS, RBRACK, RPAREN, SLASH, STAR, STR, Tokens,
} from "./tokenize";

/** Expression parser over the tokens of one tag (`i` up to `end`). */
export class Cursor {
  private nest = 0;
  /** Operators and filters read in this tag: a chain `a + b + …` or `x |> f |> …` builds a tree
   * as deep as it is long, and every later stage walks it recursively. */
  private ops = 0;
  constructor(
    readonly toks: Tokens,
    public i: number,
    private end: number,
    private piece: Piece,
    private depth: number,
    private maxDepth: number,
  ) {}
  /** Points the cursor at another tag; a parse uses one cursor for all its tags. */
  reset(i: number, end: number, piece: Piece, depth: number): this {
    this.i = i;
    this.end = end;
    this.piece = piece;
    this.depth = depth;
    this.nest = 0;
    this.ops = 0;
    return this;
  }
  /** The kind of the current token, or -1 at the end of the tag. */
  kind(): number {
    return this.i < this.end ? this.toks.kind[this.i] : -1;
  }
  /** Whether the current token is the operator of kind `op`. */
  peek(op: number): boolean {
    return this.i < this.end && this.toks.kind[this.i] === op;
  }
  atEnd(): boolean {
    return this.i >= this.end;
  }
  /** What the current token looks like in a message. */
  shown(): string {
    return this.toks.text(this.i);
  }
  fail(msg: string, at = this.i): TemplateFailure {
    return at < this.end
      ? new TemplateFailure("parse", msg, this.toks.from[at], this.toks.to[at])
      : new TemplateFailure("parse", msg, this.piece.to - 2, this.piece.to);
  }
  op(op: number) {
    if (!this.peek(op)) throw this.fail(`expected '${OP_TEXT[op]}'${this.i < this.end ? ` but found '${this.shown()}'` : " before the end of the tag"}`);
    this.i++;
  }
  keyword(word: string) {
    if (this.i >= this.end || this.toks.kind[this.i] !== IDENT || !this.toks.is(this.i, word)) throw this.fail(`expected '${word}'`);
    this.i++;
  }
  name(what: string): string {
    if (this.i >= this.end || this.toks.kind[this.i] !== IDENT) throw this.fail(`expected ${what}`);
    return this.toks.text(this.i++);
  }
  done() {
    if (this.i < this.end) throw this.fail(`unexpected '${this.shown()}' at the end of the tag`);
  }
  exprToEnd(): Expr {
    const e = this.expr();
    this.done();
    return e;
  }
  exprUntil(word: string): Expr {
    const e = this.expr();
    if (this.i >= this.end || !this.toks.is(this.i, word)) throw this.fail(`expected '${word}'`);
    return e;
  }
  /** Counts one more level of nesting (a parenthesis, 'not', unary minus) against the limit. */
  private enter(): void {
    if (++this.nest + this.depth > this.maxDepth) throw this.fail(`expression nested deeper than the limit of ${this.maxDepth}`);
  }
  /** Counts one more operator or filter in this tag; a chain longer than four times the nesting
   * limit is refused rather than walked. */
  private op1(at: number): void {
    if (++this.ops > 4 * this.maxDepth)
      throw this.fail(`more than ${4 * this.maxDepth} operators and filters in one tag (the limit); split the expression with 'let'`, at);
  }
  expr(): Expr {
    this.enter();
    let e = this.or();
    while (this.peek(PIPE)) {
      this.op1(this.i);
      this.i++;
      const at = this.i;
      if (at >= this.end || this.toks.kind[at] !== IDENT) throw this.fail("expected a filter name after '|>'");
      this.i++;
      const nameFrom = this.toks.from[at];
      const nameTo = this.toks.to[at];
      let args: Expr[] = NO_ARGS;
      let to = nameTo;
      if (this.peek(LPAREN)) {
        this.i++;
        args = [];
        while (!this.peek(RPAREN)) {
          args.push(this.expr());
          if (!this.peek(COMMA)) break;
          this.i++;
        }
        if (this.i < this.end) to = this.toks.to[this.i];
        this.op(RPAREN);
      }
      e = { k: "filter", input: e, name: this.toks.text(at), args, nameFrom, nameTo, from: e.from, to };
    }
    this.nest--;
    return e;
  }
  // Each level is a plain loop calling the next one directly: no closure per call, since an
  // expression is parsed on every keystroke in the editor.
  private or(): Expr {
    let left = this.and();
    while (this.peek(KW_OR)) {
      this.op1(this.i);
      this.i++;
      const right = this.and();
      left = { k: "binary", op: "or", left, right, from: left.from, to: right.to };
    }
    return left;
  }
  private and(): Expr {
    let left = this.not();
    while (this.peek(KW_AND)) {
      this.op1(this.i);
      this.i++;
      const right = this.not();
      left = { k: "binary", op: "and", left, right, from: left.from, to: right.to };
    }
    return left;
  }
  private not(): Expr {
    if (this.peek(KW_NOT)) {
      this.enter();
      const from = this.toks.from[this.i++];
      const arg = this.not();
      this.nest--;
      return { k: "unary", op: "not", arg, from, to: arg.to };
    }
    return this.cmp();
  }
  private cmp(): Expr {
    const left = this.add();
    const k = this.kind();
    if (k === EQ || k === NE || k === LT || k === LE || k === GT || k === GE) {
      this.op1(this.i);
      this.i++;
      const right = this.add();
      return { k: "binary", op: OP_TEXT[k] as BinaryOp, left, right, from: left.from, to: right.to };
    }
    return left;
  }
  private add(): Expr {
    let left = this.mul();
    for (let k = this.kind(); k === PLUS || k === MINUS; k = this.kind()) {
      this.op1(this.i);
      this.i++;
      const right = this.mul();
      left = { k: "binary", op: OP_TEXT[k] as BinaryOp, left, right, from: left.from, to: right.to };
    }
    return left;
  }
  private mul(): Expr {
    let left = this.unary();
    for (let k = this.kind(); k === STAR || k === SLASH || k === PERCENT; k = this.kind()) {
      this.op1(this.i);
      this.i++;
      const right = this.unary();
      left = { k: "binary", op: OP_TEXT[k] as BinaryOp, left, right, from: left.from, to: right.to };
    }
    return left;
  }
  private unary(): Expr {
    if (this.peek(MINUS)) {
      this.enter();
      const from = this.toks.from[this.i++];
      const arg = this.unary();
      this.nest--;
      return { k: "unary", op: "-", arg, from, to: arg.to };
    }
    return this.postfix();
  }
  private postfix(): Expr {
    let e = this.primary();
    for (;;) {
      const k = this.kind();
      if (k === DOT) {
        this.op1(this.i);
        this.i++;
        const at = this.i;
        if (at >= this.end || this.toks.kind[at] !== IDENT) throw this.fail("expected a field name after '.'");
        this.i++;
        e = { k: "get", obj: e, key: this.toks.text(at), keyFrom: this.toks.from[at], from: e.from, to: this.toks.to[at] };
      } else if (k === LBRACK) {
        this.op1(this.i);
        this.i++;
        const key = this.expr();
        const at = this.i;
        this.op(RBRACK);
        e = { k: "index", obj: e, key, from: e.from, to: this.toks.to[at] };
      } else return e;
    }
  }
  private primary(): Expr {
    if (this.i >= this.end) throw this.fail("expected a value before the end of the tag");
    const at = this.i++;
    const toks = this.toks;
    const from = toks.from[at];
    const to = toks.to[at];
    switch (toks.kind[at]) {
      case NUM:
        return { k: "lit", value: Number(toks.text(at)), from, to };
      case STR:
        return { k: "lit", value: toks.str(at), from, to };
      case IDENT:
        return { k: "var", name: toks.text(at), from, to };
      case KW_TRUE:
        return { k: "lit", value: true, from, to };
      case KW_FALSE:
        return { k: "lit", value: false, from, to };
      case KW_NOTHING:
        return { k: "lit", value: null, from, to };
      case KW_AND:
      case KW_OR:
      case KW_NOT:
      case CLOSER:
        throw this.fail(`'${toks.text(at)}' cannot start a value`, at);
      case LPAREN: {
        const e = this.expr();
        this.op(RPAREN);
        return e;
      }
      default:
        throw this.fail(`expected a value but found '${toks.text(at)}'`, at);
    }
  }
}

/** Shared by every filter without arguments; nothing ever adds to it. */
const NO_ARGS: Expr[] = Object.freeze([]) as unknown as Expr[];
