// Comment threads as one revision's review page shows them: comments grouped under their
// thread's first comment, and each line-anchored thread placed on this revision's rendered
// text (through the line diff from the text it was made on) or marked outdated.
import { lineMapper } from "./lines";

export type CommentRow = {
  id: string;
  request_id: string;
  thread_id: string | null;
  author_name: string | null;
  body: string;
  line: number | null;
  line_text: string | null;
  model_path: string | null;
  resolved_at: Date | null;
  resolved_by_name: string | null;
  created_at: Date;
  revision: number;
};

export type Thread = {
  id: string;
  madeOnRevision: number;
  /** The line on this page's revision, null when outdated or not a line comment. */
  line: number | null;
  originalLine: number | null;
  lineText: string | null;
  modelPath: string | null;
  outdated: boolean;
  resolved: { at: string; by: string | null } | null;
  comments: { id: string; author: string; body: string; at: string }[];
};

export function threadsFor(rows: CommentRow[], renderedByRequest: Map<string, string>, here: { requestId: string; rendered: string }): Thread[] {
  const mappers = new Map<string, (line: number) => number | null>();
  const mapperFor = (requestId: string) => {
    let m = mappers.get(requestId);
    if (!m) {
      const from = requestId === here.requestId ? here.rendered : (renderedByRequest.get(requestId) ?? "");
      m = lineMapper(from, here.rendered);
      mappers.set(requestId, m);
    }
    return m;
  };
  const threads = new Map<string, Thread>();
  for (const c of rows) {
    if (c.thread_id !== null) continue;
    const line = c.line !== null ? mapperFor(c.request_id)(c.line) : null;
    threads.set(c.id, {
      id: c.id,
      madeOnRevision: c.revision,
      line,
      originalLine: c.line,
      lineText: c.line_text,
      modelPath: c.model_path,
      outdated: c.line !== null && line === null,
      resolved: c.resolved_at ? { at: c.resolved_at.toISOString(), by: c.resolved_by_name } : null,
      comments: [],
    });
  }
  for (const c of rows) {
    const t = threads.get(c.thread_id ?? c.id);
    t?.comments.push({ id: c.id, author: c.author_name ?? "(former member)", body: c.body, at: c.created_at.toISOString() });
  }
  return [...threads.values()];
}
