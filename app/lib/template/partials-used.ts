// Which workshop templates a source brings in with `use "name"(…)`: what a template depends on,
// so a template that others still use is not deleted from under them. Read from the AST, so a
// `use` inside a comment or verbatim block does not count; a source that does not parse falls
// back to a plain text scan, which may over-report but never misses a dependency.
import type { Node } from "./ast";
import { parseTemplate } from "./cache";

function walk(nodes: Node[], out: Set<string>): void {
  for (const n of nodes) {
    switch (n.k) {
      case "use":
        if (n.external) out.add(n.name);
        break;
      case "if":
        for (const b of n.branches) walk(b.body, out);
        if (n.otherwise) walk(n.otherwise, out);
        break;
      case "over":
        walk(n.body, out);
        if (n.none) walk(n.none, out);
        break;
      default:
        break;
    }
  }
}

const USE_TEXT = /use\s+"([^"\n]*)"/g;

/** The names of the templates `source` uses as partials (directly, not through them). */
export function partialsUsed(source: string): Set<string> {
  const out = new Set<string>();
  const parsed = parseTemplate(source);
  if (!parsed.ast) {
    for (const m of source.matchAll(USE_TEXT)) out.add(m[1]);
    return out;
  }
  walk(parsed.ast.body, out);
  for (const p of parsed.ast.pieces.values()) walk(p.body, out);
  return out;
}
