// The editor's draft runner with a stand-in worker: newest answer only, a busy worker stopped by
// a newer draft, a silent one stopped past the time limit and answered for.
import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import { demoConfig } from "../config/demo";
import { DraftRunner, KILL_MARGIN_MS, runDraft, type DraftJob, type DraftResult, type DraftWorker } from "./draft";

class FakeWorker implements DraftWorker {
  onmessage: ((e: MessageEvent<DraftResult>) => void) | null = null;
  jobs: DraftJob[] = [];
  terminated = false;
  postMessage(job: DraftJob) {
    this.jobs.push(job);
  }
  terminate() {
    this.terminated = true;
  }
  /** Answers a job the way the real worker does. */
  answer(job = this.jobs[this.jobs.length - 1]) {
    this.onmessage?.({ data: runDraft(job) } as MessageEvent<DraftResult>);
  }
}

const META = { buildName: "Kestrel", savedAt: "2026-03-14T09:30:00Z", templateName: "t", templateVersion: 1 };

describe("DraftRunner", () => {
  let workers: FakeWorker[];
  let results: DraftResult[];
  let runner: DraftRunner;
  beforeEach(() => {
    vi.useFakeTimers();
    workers = [];
    results = [];
    runner = new DraftRunner(
      () => {
        const w = new FakeWorker();
        workers.push(w);
        return w;
      },
      (r) => results.push(r),
      2000,
    );
  });
  afterEach(() => vi.useRealTimers());

  it("answers with the check and render the worker did", () => {
    runner.submit({ source: "Hello @( meta.buildName )@", config: demoConfig(), meta: META, partials: {} });
    workers[0].answer();
    expect(results).toHaveLength(1);
    expect(results[0].render).toMatchObject({ ok: true, output: "Hello Kestrel" });
    expect(results[0].problems).toEqual([]);
    // Without a build, the draft is only checked.
    runner.submit({ source: "@( meta.bildName )@", config: null, meta: null, partials: {} });
    workers[0].answer();
    expect(results[1].render).toBeNull();
    expect(results[1].problems[0].message).toMatch(/unknown field 'bildName' on meta/);
  });

  it("stops a worker still busy on an older draft and keeps only the newest answer", () => {
    runner.submit({ source: "one", config: demoConfig(), meta: META, partials: {} });
    const first = workers[0];
    runner.submit({ source: "two", config: demoConfig(), meta: META, partials: {} });
    expect(first.terminated).toBe(true);
    expect(workers).toHaveLength(2);
    // A late answer from the stopped worker is ignored.
    first.answer(first.jobs[0]);
    expect(results).toEqual([]);
    workers[1].answer();
    expect(results.map((r) => r.render?.ok && r.render.output)).toEqual(["two"]);
  });

  it("terminates a worker silent past the time limit, answers with the limit, and starts afresh", () => {
    runner.submit({ source: "@( config.format )@", config: demoConfig(), meta: META, partials: {} });
    vi.advanceTimersByTime(2000 + KILL_MARGIN_MS - 1);
    expect(results).toEqual([]);
    vi.advanceTimersByTime(1);
    expect(workers[0].terminated).toBe(true);
    expect(results).toHaveLength(1);
    expect(results[0].problems[0]).toMatchObject({ stage: "render", message: "rendering took longer than the time limit of 2000 ms", line: 1, column: 1 });
    expect(results[0].render).toMatchObject({ ok: false });
    // The next draft gets a new worker, and no stale timer fires for it.
    runner.submit({ source: "fine", config: demoConfig(), meta: META, partials: {} });
    expect(workers).toHaveLength(2);
    workers[1].answer();
    vi.advanceTimersByTime(10_000);
    expect(results.map((r) => r.render?.ok)).toEqual([false, true]);
  });
});
