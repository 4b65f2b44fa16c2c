// Stage 2: recursive descent over the pieces from the lexer. Block tags are matched against
// their openers so "never closed" points at the opening tag; the parser recovers at tag
// boundaries and reports several problems in one pass.
import type { Expr, Node, PieceDef, TemplateAst } from "./ast";
import { TemplateFailure } from "./errors";
import { DEFAULT_LIMITS } from "./limits";
import { Cursor, KEYWORDS } from "./parse-expr";
import type { Piece, Tok } from "./tokenize";

const BLOCK_END: Record<string, string> = { over: "/over", when: "/when", piece: "/piece", verbatim: "/verbatim" };

interface Open {
  keyword: string;
  from: number;
  to: number;
}

export function parse(pieces: Piece[], errors: TemplateFailure[], maxDepth = DEFAULT_LIMITS.maxDepth): TemplateAst {
  const ast: TemplateAst = { body: [], pieces: new Map(), target: "text" };
  let pos = 0;
  const fail = (msg: string, from: number, to: number) => new TemplateFailure("parse", msg, from, to);

  // Parses nodes until one of `stops` (a statement keyword) is met; returns it without consuming.
  function block(stops: string[], open: Open | null, depth: number): { nodes: Node[]; stop: Tok | null; stopPiece: Piece | null } {
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
          nodes.push({ k: "out", expr: wholeExpr(p.toks, p, depth), from: p.from, to: p.to });
        } catch (e) {
          recover(e);
        }
      } else {
        const head = p.toks[0];
        if (!head) {
          errors.push(fail("empty statement tag", p.from, p.to));
          pos++;
          continue;
        }
        if (stops.includes(head.value)) return { nodes, stop: head, stopPiece: p };
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

  function statement(p: Piece & { kind: "out" | "stmt" }, head: Tok, depth: number): Node | null {
    const t = new Cursor(p.toks, 1, p, depth, maxDepth);
    const open: Open = { keyword: head.value, from: p.from, to: p.to };
    switch (head.value) {
      case "when": {
        const branches = [{ cond: t.exprToEnd(), body: [] as Node[] }];
        let otherwise: Node[] | null = null;
        for (;;) {
          const r = block(["orwhen", "otherwise", "/when"], open, depth + 1);
          (otherwise ?? branches[branches.length - 1].body).push(...r.nodes);
          if (!r.stop) break;
          pos++;
          const c = new Cursor((r.stopPiece as { toks: Tok[] }).toks, 1, r.stopPiece!, depth, maxDepth);
          if (r.stop.value === "/when") {
            c.end();
            break;
          }
          if (otherwise) throw fail(`'${r.stop.value}' after 'otherwise' in the same 'when'`, r.stop.from, r.stop.to);
          if (r.stop.value === "orwhen") branches.push({ cond: c.exprToEnd(), body: [] });
          else {
            c.end();
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
        if (t.peek(",")) {
          t.next();
          info = t.name("a name for the loop information");
        }
        t.end();
        const r = block(["none", "/over"], open, depth + 1);
        let none: Node[] | null = null;
        if (r.stop?.value === "none") {
          pos++;
          new Cursor((r.stopPiece as { toks: Tok[] }).toks, 1, r.stopPiece!, depth, maxDepth).end();
          const r2 = block(["/over"], open, depth + 1);
          none = r2.nodes;
          if (r2.stop) pos++;
        } else if (r.stop) pos++;
        return { k: "over", list, item, info, body: r.nodes, none, from: p.from, to: p.to };
      }
      case "let": {
        const name = t.name("a variable name");
        t.op("=");
        return { k: "let", name, value: t.exprToEnd(), from: p.from, to: p.to };
      }
      case "use": {
        const tok = t.next();
        if (!tok || (tok.kind !== "ident" && tok.kind !== "str")) throw fail("'use' needs a piece name or a quoted template name", p.from, p.to);
        const args: { name: string; value: Expr; from: number }[] = [];
        if (t.peek("(")) {
          t.next();
          while (!t.peek(")")) {
            const at = t.peekTok();
            const name = t.name("an argument name");
            t.op("=");
            args.push({ name, value: t.expr(), from: at?.from ?? p.from });
            if (!t.peek(",")) break;
            t.next();
          }
          t.op(")");
        }
        t.end();
        return { k: "use", name: tok.value, external: tok.kind === "str", args, from: p.from, to: p.to };
      }
      case "piece": {
        if (depth > 0) throw fail("a 'piece' is defined at the top level of a template, not inside a block", p.from, p.to);
        const name = t.name("a piece name");
        const params: PieceDef["params"] = [];
        if (t.peek("(")) {
          t.next();
          while (!t.peek(")")) {
            const pname = t.name("a parameter name");
            let fallback: Expr | null = null;
            if (t.peek("=")) {
              t.next();
              fallback = t.expr();
            }
            params.push({ name: pname, fallback });
            if (!t.peek(",")) break;
            t.next();
          }
          t.op(")");
        }
        t.end();
        const r = block(["/piece"], open, depth + 1);
        if (r.stop) pos++;
        if (ast.pieces.has(name)) throw fail(`a piece named '${name}' is already defined`, p.from, p.to);
        ast.pieces.set(name, { name, params, body: r.nodes, from: p.from, to: p.to });
        return null;
      }
      case "verbatim": {
        t.end();
        const r = block(["/verbatim"], open, depth + 1);
        if (r.stop) pos++;
        return r.nodes.length ? { k: "text", value: r.nodes.map((x) => (x.k === "text" ? x.value : "")).join(""), from: p.from, to: p.to } : null;
      }
      case "target": {
        const what = t.name("'c' or 'text'");
        if (what !== "c" && what !== "text") throw fail(`unknown target '${what}' (use 'c' or 'text')`, p.from, p.to);
        t.end();
        ast.target = what;
        return null;
      }
      default: {
        const known = ["when", "orwhen", "otherwise", "/when", "over", "none", "/over", "let", "use", "piece", "/piece", "verbatim", "/verbatim", "target"];
        if (known.includes(head.value)) throw fail(`'${head.value}' without a matching opening tag`, p.from, p.to);
        throw fail(`unknown statement '${head.value}' (statements: when, over, let, use, piece, verbatim, target)`, head.from, head.to);
      }
    }
  }

  function wholeExpr(toks: Tok[], p: Piece, depth: number): Expr {
    if (toks.length === 0) throw fail("empty output tag", p.from, p.to);
    return new Cursor(toks, 0, p, depth, maxDepth).exprToEnd();
  }

  const r = block([], null, 0);
  ast.body = r.nodes;
  return ast;
}
