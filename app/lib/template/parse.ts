// Stage 2: recursive descent over the pieces from the lexer. Block tags are matched against
// their openers so "never closed" points at the opening tag; the parser recovers at tag
// boundaries and reports several problems in one pass.
import type { Expr, Node, PieceDef, TemplateAst } from "./ast";
import { TemplateFailure } from "./errors";
import { DEFAULT_LIMITS } from "./limits";
import { Cursor } from "./parse-expr";
import { ASSIGN, CLOSER, COMMA, IDENT, LPAREN, RPAREN, STR, type Lexed, type Piece } from "./tokenize";

const BLOCK_END: Record<string, string> = { over: "/over", when: "/when", piece: "/piece", verbatim: "/verbatim" };

const WHEN_STOPS = ["orwhen", "otherwise", "/when"] as const;
const OVER_STOPS = ["none", "/over"] as const;
const OVER_END = ["/over"] as const;
const PIECE_END = ["/piece"] as const;
const VERBATIM_END = ["/verbatim"] as const;
const KNOWN = ["when", "orwhen", "otherwise", "/when", "over", "none", "/over", "let", "use", "piece", "/piece", "verbatim", "/verbatim", "target"];

interface Open {
  keyword: string;
  from: number;
  to: number;
}

export function parse({ pieces, toks }: Lexed, errors: TemplateFailure[], maxDepth = DEFAULT_LIMITS.maxDepth): TemplateAst {
  toks.check();
  const ast: TemplateAst = { body: [], pieces: new Map(), target: "text" };
  let pos = 0;
  const fail = (msg: string, from: number, to: number) => new TemplateFailure("parse", msg, from, to);

  // Parses nodes until one of `stops` (a statement keyword) is met; returns it without consuming.
  function block(stops: readonly string[], open: Open | null, depth: number): { nodes: Node[]; stop: string | null; stopPiece: Piece | null } {
    if (depth > maxDepth) throw fail(`blocks are nested deeper than the limit of ${maxDepth}`, open?.from ?? 0, open?.to ?? 0);
    const nodes: Node[] = [];
    while (pos < pieces.length) {
      const p = pieces[pos];
      if (p.kind === "text") {
        if (p.value) nodes.push({ k: "text", value: p.value, from: p.from, to: p.to });
        pos++;
      } else if (p.kind === "comment") {
        pos++;
      } else if (p.kind === "out") {
        pos++;
        try {
          nodes.push({ k: "out", expr: wholeExpr(p, depth), from: p.from, to: p.to });
        } catch (e) {
          recover(e);
        }
      } else {
        if (p.t1 === p.t0) {
          errors.push(fail("empty statement tag", p.from, p.to));
          pos++;
          continue;
        }
        // Statement words are names or closers ("/over"); anything else is not a statement.
        const hk = toks.kind[p.t0];
        const head = hk === IDENT || hk === CLOSER ? toks.text(p.t0) : "";
        if (head && stops.includes(head)) return { nodes, stop: head, stopPiece: p };
        pos++;
        try {
          const node = statement(p, head, depth);
          if (node) nodes.push(node);
        } catch (e) {
          recover(e);
        }
      }
    }
    if (open) errors.push(fail(`'${open.keyword}' is never closed with '@[ ${BLOCK_END[open.keyword]} ]@'`, open.from, open.to));
    return { nodes, stop: null, stopPiece: null };
  }

  function recover(e: unknown) {
    if (e instanceof TemplateFailure && e.stage === "parse") errors.push(e);
    else throw e;
  }

  function statement(p: Piece, head: string, depth: number): Node | null {
    const t = cursor(p, 1, depth);
    const open: Open = { keyword: head, from: p.from, to: p.to };
    switch (head) {
      case "when": {
        const branches = [{ cond: t.exprToEnd(), body: [] as Node[] }];
        let otherwise: Node[] | null = null;
        for (;;) {
          const r = block(WHEN_STOPS, open, depth + 1);
          (otherwise ?? branches[branches.length - 1].body).push(...r.nodes);
          if (!r.stop) break;
          pos++;
          const c = cursor(r.stopPiece!, 1, depth);
          if (r.stop === "/when") {
            c.done();
            break;
          }
          if (otherwise) throw fail(`'${r.stop}' after 'otherwise' in the same 'when'`, toks.from[r.stopPiece!.t0], toks.to[r.stopPiece!.t0]);
          if (r.stop === "orwhen") branches.push({ cond: c.exprToEnd(), body: [] });
          else {
            c.done();
            otherwise = [];
          }
        }
        return { k: "if", branches, otherwise, from: p.from, to: p.to };
      }
      case "over": {
        const list = t.exprUntil("as");
        t.keyword("as");
        const item = t.name("a name for each item");
        let info: string | null = null;
        if (t.peek(COMMA)) {
          t.i++;
          info = t.name("a name for the loop information");
        }
        t.done();
        const r = block(OVER_STOPS, open, depth + 1);
        let none: Node[] | null = null;
        if (r.stop === "none") {
          pos++;
          cursor(r.stopPiece!, 1, depth).done();
          const r2 = block(OVER_END, open, depth + 1);
          none = r2.nodes;
          if (r2.stop) pos++;
        } else if (r.stop) pos++;
        return { k: "over", list, item, info, body: r.nodes, none, from: p.from, to: p.to };
      }
      case "let": {
        const name = t.name("a variable name");
        t.op(ASSIGN);
        return { k: "let", name, value: t.exprToEnd(), from: p.from, to: p.to };
      }
      case "use": {
        const kind = t.kind();
        if (kind !== IDENT && kind !== STR) throw fail("'use' needs a piece name or a quoted template name", p.from, p.to);
        const at = t.i++;
        const args: { name: string; value: Expr; from: number }[] = [];
        if (t.peek(LPAREN)) {
          t.i++;
          while (!t.peek(RPAREN)) {
            const from = t.atEnd() ? p.from : toks.from[t.i];
            const name = t.name("an argument name");
            t.op(ASSIGN);
            args.push({ name, value: t.expr(), from });
            if (!t.peek(COMMA)) break;
            t.i++;
          }
          t.op(RPAREN);
        }
        t.done();
        return { k: "use", name: kind === STR ? toks.str(at) : toks.text(at), external: kind === STR, args, from: p.from, to: p.to };
      }
      case "piece": {
        if (depth > 0) throw fail("a 'piece' is defined at the top level of a template, not inside a block", p.from, p.to);
        const name = t.name("a piece name");
        const params: PieceDef["params"] = [];
        if (t.peek(LPAREN)) {
          t.i++;
          while (!t.peek(RPAREN)) {
            const pname = t.name("a parameter name");
            let fallback: Expr | null = null;
            if (t.peek(ASSIGN)) {
              t.i++;
              fallback = t.expr();
            }
            params.push({ name: pname, fallback });
            if (!t.peek(COMMA)) break;
            t.i++;
          }
          t.op(RPAREN);
        }
        t.done();
        const r = block(PIECE_END, open, depth + 1);
        if (r.stop) pos++;
        if (ast.pieces.has(name)) throw fail(`a piece named '${name}' is already defined`, p.from, p.to);
        ast.pieces.set(name, { name, params, body: r.nodes, from: p.from, to: p.to });
        return null;
      }
      case "verbatim": {
        t.done();
        const r = block(VERBATIM_END, open, depth + 1);
        if (r.stop) pos++;
        return r.nodes.length ? { k: "text", value: r.nodes.map((x) => (x.k === "text" ? x.value : "")).join(""), from: p.from, to: p.to } : null;
      }
      case "target": {
        const what = t.name("'c' or 'text'");
        if (what !== "c" && what !== "text") throw fail(`unknown target '${what}' (use 'c' or 'text')`, p.from, p.to);
        t.done();
        ast.target = what;
        return null;
      }
      default: {
        if (KNOWN.includes(head)) throw fail(`'${head}' without a matching opening tag`, p.from, p.to);
        const shown = head || toks.text(p.t0);
        throw fail(`unknown statement '${shown}' (statements: when, over, let, use, piece, verbatim, target)`, toks.from[p.t0], toks.to[p.t0]);
      }
    }
  }

  // One cursor serves every tag: a statement is done with its cursor before its body is parsed.
  const shared = new Cursor(toks, 0, 0, pieces[0], 0, maxDepth);
  function cursor(p: Piece, skip: number, depth: number): Cursor {
    return shared.reset(p.t0 + skip, p.t1, p, depth);
  }

  function wholeExpr(p: Piece, depth: number): Expr {
    if (p.t1 === p.t0) throw fail("empty output tag", p.from, p.to);
    return cursor(p, 0, depth).exprToEnd();
  }

  const r = block([], null, 0);
  ast.body = r.nodes;
  return ast;
}
