// Server-side template renders run off the event loop, in a small pool of worker threads
// (decision 007). A template is untrusted code: the library stops a render at its time limit,
// but only where it checks the clock; a worker that has not answered by the time limit plus
// KILL_MARGIN_MS is terminated and replaced, so a runaway template never holds up other requests.
// Requests beyond the pool's size wait in a bounded FIFO queue; past the bound they get a 503.
import { existsSync } from "node:fs";
import { availableParallelism } from "node:os";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { Worker } from "node:worker_threads";
import { data } from "react-router";
import type { Config } from "../config/schema";
import { DEFAULT_LIMITS, type Limits, type RenderMeta } from "../template";
import { checkTemplateSource, stoppedCheck, type CheckOutcome } from "./check";
import { compileAndRender, stoppedRender, type RenderOutcome } from "./render";
import type { WorkerMessage, WorkerRequest } from "./worker.server";

/** The worker's file name in the server build, next to build/server/index.js (vite.config.ts). */
export const WORKER_FILE_NAME = "template-worker.js";
/** How long past a render's own time limit a worker may stay silent before it is terminated. */
export const KILL_MARGIN_MS = 250;
/** Renders that may wait for a worker; one more is refused with a 503. */
export const QUEUE_LIMIT = 32;
/** A worker's heap; a render's output is capped at 4 MiB, so this is ample. */
const WORKER_HEAP_MB = 256;
/** Extra time a worker that has not finished loading gets before its first job counts as overdue. */
const STARTUP_ALLOWANCE_MS = 5000;
/**
 * A save's check gets this long in a worker. A 260 KB hostile template compiles in about 1.5 s
 * on this 2-core machine; a worker still silent past this plus KILL_MARGIN_MS is terminated.
 */
export const CHECK_MILLIS = 5000;

/** HB_TEMPLATE_WORKERS (1–16), by default min(2, available parallelism). */
export function poolSizeFrom(value: string | undefined, cores = availableParallelism()): number {
  if (value === undefined || value === "") return Math.max(1, Math.min(2, cores));
  const n = Number(value);
  if (!Number.isInteger(n) || n < 1 || n > 16) throw new Error(`HB_TEMPLATE_WORKERS must be a whole number from 1 to 16, not '${value}'.`);
  return n;
}
// Read when the server starts, so a wrong value stops it with the name of the setting.
const POOL_SIZE = poolSizeFrom(process.env.HB_TEMPLATE_WORKERS);

/** Refused because the queue is full; routes answer 503. */
export class PoolBusyError extends Error {
  readonly status = 503;
  constructor(queued: number) {
    super(`The server is rendering as many templates as it can (${queued} waiting); try again in a moment.`);
  }
}

export type RenderOptions = { partials?: Record<string, string>; limits?: Partial<Limits>; cache?: boolean };
export type PoolOptions = { workerFile: string; size?: number; queueLimit?: number; killMarginMs?: number; startupAllowanceMs?: number };

type DistributiveOmit<T, K extends keyof T> = T extends unknown ? Omit<T, K> : never;
type Outcome = RenderOutcome | CheckOutcome;
type Job = {
  request: DistributiveOmit<WorkerRequest, "id">;
  maxMillis: number;
  resolve: (o: Outcome) => void;
  reject: (e: Error) => void;
  /** The outcome for a job stopped from outside (time limit, memory). */
  stopped: (message: string) => Outcome;
};
type Running = Job & { id: number; timer: NodeJS.Timeout | null };
type Slot = { worker: Worker | null; ready: boolean; job: Running | null };

export class TemplatePool {
  readonly size: number;
  readonly queueLimit: number;
  readonly killMarginMs: number;
  readonly startupAllowanceMs: number;
  private readonly file: string;
  private readonly slots: Slot[] = [];
  private readonly queue: Job[] = [];
  private seq = 0;
  private closed = false;
  /** Workers terminated for running past their time (for tests and logs). */
  kills = 0;

  constructor(o: PoolOptions) {
    this.file = o.workerFile;
    this.size = o.size ?? POOL_SIZE;
    this.queueLimit = o.queueLimit ?? QUEUE_LIMIT;
    this.killMarginMs = o.killMarginMs ?? KILL_MARGIN_MS;
    this.startupAllowanceMs = o.startupAllowanceMs ?? STARTUP_ALLOWANCE_MS;
    for (let i = 0; i < this.size; i++) this.slots.push({ worker: null, ready: false, job: null });
  }

  /** Renders waiting for a worker. */
  get waiting(): number {
    return this.queue.length;
  }

  render(source: string, config: Config, meta: RenderMeta, opts: RenderOptions = {}): Promise<RenderOutcome> {
    return this.submit(
      { kind: "render", source, config, meta, partials: opts.partials ?? {}, limits: opts.limits, cache: opts.cache },
      opts.limits?.maxMillis ?? DEFAULT_LIMITS.maxMillis,
      stoppedRender,
    ) as Promise<RenderOutcome>;
  }

  /** A template save's check (compile only, capped error lists) in a worker, like a render. */
  check(source: string, partials: Record<string, string>, opts: { maxMillis?: number } = {}): Promise<CheckOutcome> {
    return this.submit({ kind: "check", source, partials }, opts.maxMillis ?? CHECK_MILLIS, stoppedCheck) as Promise<CheckOutcome>;
  }

  private submit(request: Job["request"], maxMillis: number, stopped: Job["stopped"]): Promise<Outcome> {
    if (this.closed) return Promise.reject(new Error("The template pool is closed."));
    return new Promise<Outcome>((resolve, reject) => {
      const job: Job = { request, maxMillis, resolve, reject, stopped };
      const free = this.slots.find((s) => s.job === null);
      if (free) return this.start(free, job);
      if (this.queue.length >= this.queueLimit) return reject(new PoolBusyError(this.queue.length));
      this.queue.push(job);
    });
  }

  /** Terminate every worker and refuse what is waiting (tests, shutdown). */
  async close(): Promise<void> {
    this.closed = true;
    for (const job of this.queue.splice(0)) job.reject(new Error("The template pool is closed."));
    await Promise.all(
      this.slots.map((s) => {
        const w = s.worker;
        if (s.job) {
          if (s.job.timer) clearTimeout(s.job.timer);
          s.job.reject(new Error("The template pool is closed."));
          s.job = null;
        }
        s.worker = null;
        return w?.terminate();
      }),
    );
  }

  private spawn(slot: Slot) {
    const w = new Worker(this.file, { resourceLimits: { maxOldGenerationSizeMb: WORKER_HEAP_MB } });
    slot.worker = w;
    slot.ready = false;
    w.unref(); // an idle pool never keeps the process alive
    // Events from a worker this slot has already replaced are ignored.
    w.on("message", (m: WorkerMessage) => slot.worker === w && this.answered(slot, m));
    w.on("error", (e) => slot.worker === w && this.crashed(slot, e));
    w.on("exit", (code) => slot.worker === w && this.crashed(slot, new Error(`the render worker stopped unexpectedly (exit code ${code})`)));
  }

  private start(slot: Slot, job: Job) {
    if (!slot.worker) this.spawn(slot);
    const running: Running = { ...job, id: ++this.seq, timer: null };
    slot.job = running;
    slot.worker!.ref();
    // A cold worker's clock starts when it says it is ready; until then it gets a loading allowance.
    this.startClock(slot, running, slot.ready ? 0 : this.startupAllowanceMs);
    try {
      slot.worker!.postMessage({ id: running.id, ...job.request } as WorkerRequest);
    } catch (e) {
      // Not cloneable (configs are plain JSON, so this is a bug): answer it, free the slot.
      this.finish(slot);
      job.reject(e instanceof Error ? e : new Error(String(e)));
      this.next(slot);
    }
  }

  private startClock(slot: Slot, job: Running, extraMs = 0) {
    if (job.timer) clearTimeout(job.timer);
    job.timer = setTimeout(() => this.overdue(slot, job), job.maxMillis + this.killMarginMs + extraMs);
  }

  private finish(slot: Slot): Running | null {
    const job = slot.job;
    slot.job = null;
    if (job?.timer) clearTimeout(job.timer);
    slot.worker?.unref();
    return job;
  }

  private next(slot: Slot) {
    if (this.closed) return;
    const job = this.queue.shift();
    if (job) this.start(slot, job);
  }

  private answered(slot: Slot, m: WorkerMessage) {
    if (m.kind === "ready") {
      slot.ready = true;
      if (slot.job) this.startClock(slot, slot.job);
      return;
    }
    if (slot.job?.id !== m.id) return;
    const job = this.finish(slot)!;
    if (m.kind === "done") job.resolve(m.outcome);
    else job.reject(new Error(`Rendering failed inside the worker: ${m.message}`));
    this.next(slot);
  }

  /** The backstop: the render ran past its limit without the library stopping it. */
  private overdue(slot: Slot, job: Running) {
    if (slot.job !== job) return;
    this.finish(slot);
    this.kills++;
    this.replace(slot);
    job.resolve(job.stopped(`${job.request.kind === "check" ? "checking" : "rendering"} took longer than the time limit of ${job.maxMillis} ms`));
    this.next(slot);
  }

  private crashed(slot: Slot, e: Error & { code?: string }) {
    const job = this.finish(slot);
    // A worker that fails on its own is replaced when the next render needs it, so a broken
    // worker file cannot make the pool spawn workers in a loop.
    const old = slot.worker;
    slot.worker = null;
    slot.ready = false;
    void old?.terminate().catch(() => {});
    if (job) {
      if (e.code === "ERR_WORKER_OUT_OF_MEMORY") job.resolve(job.stopped(`${job.request.kind === "check" ? "checking" : "rendering"} used more memory than the limit of ${WORKER_HEAP_MB} MB`));
      else job.reject(e);
    }
    this.next(slot);
  }

  private replace(slot: Slot) {
    const old = slot.worker;
    slot.worker = null;
    void old?.terminate().catch(() => {});
    if (!this.closed) this.spawn(slot); // ready for the next render before it arrives
  }
}

/**
 * The built worker next to this module's bundle (build/server/). In `react-router dev` (the Vite
 * dev server) and in vitest this module runs from app/lib/ as TypeScript and no built worker
 * exists there: renders then fall back to compileAndRender on the calling thread, as before
 * decision 007. Production and `npm start`/`npm test` always run the build, which has it.
 */
export function builtWorkerFile(): string | null {
  const file = path.join(path.dirname(fileURLToPath(import.meta.url)), WORKER_FILE_NAME);
  return existsSync(file) ? file : null;
}

let shared: TemplatePool | null | undefined;

/** The process's pool, created on first use; null when there is no built worker (dev, vitest). */
export function templatePool(): TemplatePool | null {
  if (shared === undefined) {
    const file = builtWorkerFile();
    shared = file ? new TemplatePool({ workerFile: file }) : null;
  }
  return shared;
}

/**
 * compileAndRender in a worker thread: the same outcome, without blocking the event loop.
 * A full queue becomes a 503 (with Retry-After) that pages show and API routes turn into JSON.
 */
export function renderOffThread(source: string, config: Config, meta: RenderMeta, opts: RenderOptions = {}): Promise<RenderOutcome> {
  return renderOn(templatePool(), source, config, meta, opts);
}

/** renderOffThread on a given pool (null: on this thread); tests pass their own. */
export async function renderOn(pool: TemplatePool | null, source: string, config: Config, meta: RenderMeta, opts: RenderOptions = {}): Promise<RenderOutcome> {
  if (!pool) return compileAndRender(source, config, meta, opts);
  try {
    return await pool.render(source, config, meta, opts);
  } catch (e) {
    if (e instanceof PoolBusyError) throw data({ message: e.message }, { status: 503, headers: { "Retry-After": "1" } });
    throw e;
  }
}

/**
 * A template save's check (compile with the workshop's templates, capped error lists) in the
 * render workers, so a hostile save never holds the event loop (decision 011). Inline where
 * there is no built worker (dev, vitest); a full queue is a 503 as for renders.
 */
export function checkOffThread(source: string, partials: Record<string, string>): Promise<CheckOutcome> {
  return checkOn(templatePool(), source, partials);
}

/** checkOffThread on a given pool (null: on this thread); tests pass their own. */
export async function checkOn(pool: TemplatePool | null, source: string, partials: Record<string, string>, opts: { maxMillis?: number } = {}): Promise<CheckOutcome> {
  if (!pool) return checkTemplateSource(source, partials);
  try {
    return await pool.check(source, partials, opts);
  } catch (e) {
    if (e instanceof PoolBusyError) throw data({ message: e.message }, { status: 503, headers: { "Retry-After": "1" } });
    throw e;
  }
}
