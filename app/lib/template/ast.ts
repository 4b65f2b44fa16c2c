// The typed AST shared by the parser, the checker and the evaluator. Every node keeps the
// source span it came from, so any later stage can point at it.

export interface Span {
  from: number;
  to: number;
}

export type Expr =
  | ({ k: "lit"; value: string | number | boolean | null } & Span)
  | ({ k: "var"; name: string } & Span)
  | ({ k: "get"; obj: Expr; key: string; keyFrom: number } & Span)
  | ({ k: "index"; obj: Expr; key: Expr } & Span)
  | ({ k: "unary"; op: "not" | "-"; arg: Expr } & Span)
  | ({ k: "binary"; op: BinaryOp; left: Expr; right: Expr } & Span)
  | ({ k: "filter"; input: Expr; name: string; args: Expr[]; nameFrom: number; nameTo: number } & Span);

export type BinaryOp = "or" | "and" | "==" | "!=" | "<" | "<=" | ">" | ">=" | "+" | "-" | "*" | "/" | "%";

export type Node =
  | ({ k: "text"; value: string } & Span)
  | ({ k: "out"; expr: Expr } & Span)
  | ({ k: "if"; branches: { cond: Expr; body: Node[] }[]; otherwise: Node[] | null } & Span)
  | ({ k: "over"; list: Expr; item: string; info: string | null; body: Node[]; none: Node[] | null } & Span)
  | ({ k: "let"; name: string; value: Expr } & Span)
  | ({ k: "use"; name: string; external: boolean; args: { name: string; value: Expr; from: number }[] } & Span);

export interface PieceDef extends Span {
  name: string;
  params: { name: string; fallback: Expr | null }[];
  body: Node[];
}

export interface TemplateAst {
  body: Node[];
  pieces: Map<string, PieceDef>;
  /** Set by `@[ target c ]@`: model strings printed without a C context filter are flagged. */
  target: "text" | "c";
}
