// Checking and previewing a template draft off the page's main thread (decision 007): the check
// the worker runs, and the runner that keeps one draft at a time in a worker, keeps only the
// newest answer, and terminates a worker that is still busy when a newer draft comes or that
// overruns the render's time limit. No React here, so the worker bundle stays small.
import type { Config } from "../config/schema";
import { compileTemplate, DEFAULT_LIMITS, type RenderMeta, type TemplateError } from "../template";
import { compileAndRender, partialsFrom, stoppedRender, type RenderOutcome } from "./render";

export type DraftJob = { id: number; source: string; config: Config | null; meta: RenderMeta | null; partials: Record<string, string> };
export type DraftResult = { id: number; render: RenderOutcome | null; problems: TemplateError[] };

/** How long past the render's own time limit a silent worker is given before it is stopped. */
export const KILL_MARGIN_MS = 500;

/** The check itself, as the worker runs it (and the page, when there are no workers). */
export function runDraft(job: DraftJob): DraftResult {
  if (job.config) {
    const r = compileAndRender(job.source, job.config, job.meta!, { partials: job.partials, cache: false });
    return { id: job.id, render: r, problems: r.ok ? r.warnings : [...r.errors, ...r.warnings] };
  }
  const c = compileTemplate(job.source, { partials: partialsFrom(job.partials), cache: false });
  return { id: job.id, render: null, problems: c.ok ? c.warnings : c.errors };
}

function overran(id: number, hasConfig: boolean, limitMs: number): DraftResult {
  const stopped = stoppedRender(`rendering took longer than the time limit of ${limitMs} ms`);
  return { id, render: hasConfig ? stopped : null, problems: stopped.errors };
}

/** What the runner needs of a Worker (a fake in tests). */
export interface DraftWorker {
  onmessage: ((e: MessageEvent<DraftResult>) => void) | null;
  postMessage(job: DraftJob): void;
  terminate(): void;
}

/**
 * One draft at a time in a worker: `submit` replaces whatever is running (terminating a busy
 * worker), and a worker silent past `limitMs + KILL_MARGIN_MS` is terminated and answered for.
 * A new worker is made on demand after each termination.
 */
export class DraftRunner {
  private worker: DraftWorker | null = null;
  private busy: { id: number; timer: ReturnType<typeof setTimeout> } | null = null;
  private nextId = 0;
  constructor(
    private readonly makeWorker: () => DraftWorker,
    private readonly onResult: (r: DraftResult) => void,
    private readonly limitMs = DEFAULT_LIMITS.maxMillis,
  ) {}

  submit(job: Omit<DraftJob, "id">): void {
    const id = ++this.nextId;
    // A worker still on an older draft is stopped: its answer would be thrown away anyway.
    if (this.busy) this.stop();
    if (!this.worker) {
      const w = this.makeWorker();
      w.onmessage = (e) => {
        if (this.busy?.id !== e.data.id) return;
        clearTimeout(this.busy.timer);
        this.busy = null;
        this.onResult(e.data);
      };
      this.worker = w;
    }
    const timer = setTimeout(() => {
      if (this.busy?.id !== id) return;
      this.stop();
      this.onResult(overran(id, job.config !== null, this.limitMs));
    }, this.limitMs + KILL_MARGIN_MS);
    this.busy = { id, timer };
    this.worker.postMessage({ ...job, id });
  }

  /** Terminates the worker (a busy one included); the next submit makes a new one. */
  stop(): void {
    if (this.busy) clearTimeout(this.busy.timer);
    this.busy = null;
    this.worker?.terminate();
    this.worker = null;
  }
}
