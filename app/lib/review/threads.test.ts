import { describe, expect, it } from "vitest";
import { threadsFor, type CommentRow } from "./threads";

const r1 = "a\nb\nc\nd\n";
const r2 = "a\nB changed\nc\nnew\nd\n";
const row = (o: Partial<CommentRow>): CommentRow => ({
  id: "x",
  request_id: "req1",
  thread_id: null,
  author_name: "Demo Reviewer",
  body: "look",
  line: null,
  line_text: null,
  model_path: null,
  resolved_at: null,
  resolved_by_name: null,
  created_at: new Date("2026-12-02T10:00:00Z"),
  revision: 1,
  ...o,
});

describe("threadsFor", () => {
  it("carries a comment on an unchanged line to its new number and marks a changed line outdated", () => {
    const rows = [row({ id: "t1", line: 3, line_text: "c" }), row({ id: "t2", line: 2, line_text: "b" }), row({ id: "t3", line: 4, line_text: "d" }), row({ id: "r1", thread_id: "t1", body: "reply" })];
    const threads = threadsFor(rows, new Map([["req1", r1]]), { requestId: "req2", rendered: r2 });
    expect(threads.map((t) => [t.id, t.line, t.outdated])).toEqual([
      ["t1", 3, false],
      ["t2", null, true],
      ["t3", 5, false],
    ]);
    expect(threads[0].comments.map((c) => c.body)).toEqual(["look", "reply"]);
  });

  it("keeps model-path threads and the page's own threads as they are", () => {
    const rows = [row({ id: "p", model_path: "presets.0.name", request_id: "req2", revision: 2 }), row({ id: "l", line: 2, line_text: "B changed", request_id: "req2", revision: 2 })];
    const threads = threadsFor(rows, new Map(), { requestId: "req2", rendered: r2 });
    expect(threads.map((t) => [t.modelPath, t.line, t.outdated])).toEqual([
      ["presets.0.name", null, false],
      [null, 2, false],
    ]);
  });
});
