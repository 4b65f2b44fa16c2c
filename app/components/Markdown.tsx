// A small Markdown reader for the app's own documents (the template reference): headings,
// paragraphs, fenced code, tables, lists, and inline code, bold and links. Text is rendered as
// React text nodes, never as HTML, so nothing in a document can inject markup.
import { Fragment, type ReactNode } from "react";

type Block =
  | { kind: "heading"; level: number; text: string }
  | { kind: "para"; text: string }
  | { kind: "code"; text: string }
  | { kind: "table"; head: string[]; rows: string[][] }
  | { kind: "list"; items: string[] };

export function parseMarkdown(md: string): Block[] {
  const lines = md.replace(/\r\n?/g, "\n").split("\n");
  const blocks: Block[] = [];
  let i = 0;
  const cells = (line: string) => line.trim().replace(/^\|/, "").replace(/\|$/, "").split(/(?<!\\)\|/).map((c) => c.trim().replace(/\\\|/g, "|"));
  while (i < lines.length) {
    const line = lines[i];
    if (line.trim() === "") {
      i++;
      continue;
    }
    const fence = /^```/.exec(line);
    if (fence) {
      const body: string[] = [];
      i++;
      while (i < lines.length && !/^```/.test(lines[i])) body.push(lines[i++]);
      i++;
      blocks.push({ kind: "code", text: body.join("\n") });
      continue;
    }
    const h = /^(#{1,6})\s+(.*)$/.exec(line);
    if (h) {
      blocks.push({ kind: "heading", level: h[1].length, text: h[2] });
      i++;
      continue;
    }
    if (line.trimStart().startsWith("|")) {
      const rows: string[][] = [];
      while (i < lines.length && lines[i].trimStart().startsWith("|")) rows.push(cells(lines[i++]));
      const sep = rows.findIndex((r) => r.every((c) => /^:?-+:?$/.test(c)));
      const head = sep === 1 ? rows[0] : [];
      blocks.push({ kind: "table", head, rows: rows.filter((_, k) => k !== sep && !(sep === 1 && k === 0)) });
      continue;
    }
    if (/^\s*[-*]\s+/.test(line)) {
      const items: string[] = [];
      while (i < lines.length && lines[i].trim() !== "" && !/^```/.test(lines[i])) {
        if (/^\s*[-*]\s+/.test(lines[i])) items.push(lines[i].replace(/^\s*[-*]\s+/, ""));
        else items[items.length - 1] += " " + lines[i].trim();
        i++;
      }
      blocks.push({ kind: "list", items });
      continue;
    }
    const para: string[] = [];
    while (i < lines.length && lines[i].trim() !== "" && !/^(```|#{1,6}\s|\s*\||\s*[-*]\s+)/.test(lines[i])) para.push(lines[i++].trim());
    blocks.push({ kind: "para", text: para.join(" ") });
  }
  return blocks;
}

/** Inline spans: `code`, **bold**, [text](href). */
export function inline(text: string): ReactNode[] {
  const out: ReactNode[] = [];
  const re = /`([^`]+)`|\*\*([^*]+)\*\*|\[([^\]]+)\]\(([^)\s]+)\)/g;
  let last = 0;
  let m: RegExpExecArray | null;
  let k = 0;
  while ((m = re.exec(text))) {
    if (m.index > last) out.push(text.slice(last, m.index));
    if (m[1] !== undefined) out.push(<code key={k++} className="rounded bg-soot-800 px-1 py-0.5 font-mono text-[0.9em] text-brass-300">{m[1]}</code>);
    else if (m[2] !== undefined) out.push(<strong key={k++}>{m[2]}</strong>);
    else out.push(<a key={k++} href={/^(https?:|\/|#)/.test(m[4]) ? m[4] : "#"}>{m[3]}</a>);
    last = m.index + m[0].length;
  }
  if (last < text.length) out.push(text.slice(last));
  return out;
}

export const slugify = (s: string) => s.toLowerCase().replace(/`/g, "").replace(/[^a-z0-9]+/g, "-").replace(/^-|-$/g, "");

export function Markdown({ source }: { source: string }) {
  const blocks = parseMarkdown(source);
  return (
    <div className="space-y-4 leading-relaxed">
      {blocks.map((b, n) => {
        switch (b.kind) {
          case "heading": {
            const Tag = (`h${Math.min(b.level, 4)}`) as "h1" | "h2" | "h3" | "h4";
            return <Tag key={n} id={slugify(b.text)} className={b.level > 1 ? "pt-3" : undefined}>{inline(b.text)}</Tag>;
          }
          case "para":
            return <p key={n} className="max-w-3xl text-iron-100">{inline(b.text)}</p>;
          case "code":
            return <pre key={n} tabIndex={0} className="overflow-x-auto rounded-md border border-soot-700 bg-soot-900 p-3 font-mono text-sm text-iron-100">{b.text}</pre>;
          case "list":
            return <ul key={n} className="ml-5 max-w-3xl list-disc space-y-1">{b.items.map((it, j) => <li key={j}>{inline(it)}</li>)}</ul>;
          case "table":
            return (
              <div key={n} className="overflow-x-auto" tabIndex={0} role="region" aria-label="Table">
                <table className="table max-w-4xl">
                  {b.head.length ? <thead><tr>{b.head.map((c, j) => <th key={j} scope="col">{inline(c)}</th>)}</tr></thead> : null}
                  <tbody>{b.rows.map((r, j) => <tr key={j}>{r.map((c, q) => <td key={q}>{inline(c)}</td>)}</tr>)}</tbody>
                </table>
              </div>
            );
        }
        return <Fragment key={n} />;
      })}
    </div>
  );
}
