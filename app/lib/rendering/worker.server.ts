// The entry of a template render worker (node:worker_threads), built as its own file next to
// the server bundle (see vite.config.ts). It compiles and renders one template per message with
// the same `compileAndRender` the server used to call inline; the pool in
// pool.server.ts owns the clock and terminates a worker that does not answer in time.
import { parentPort } from "node:worker_threads";
import type { Config } from "../config/schema";
import type { Limits, RenderMeta } from "../template";
import { checkTemplateSource, type CheckOutcome } from "./check";
import { compileAndRender, type RenderOutcome } from "./render";

export type RenderRequest = {
  kind: "render";
  id: number;
  source: string;
  config: Config;
  meta: RenderMeta;
  /** The workshop's template sources by name; the resolver is built here with `partialsFrom`. */
  partials: Record<string, string>;
  limits?: Partial<Limits>;
  cache?: boolean;
};

/** A template save's check: compile only, the error lists capped here so little crosses back. */
export type CheckRequest = {
  kind: "check";
  id: number;
  source: string;
  partials: Record<string, string>;
  limits?: Partial<Limits>;
};

export type WorkerRequest = RenderRequest | CheckRequest;

export type WorkerMessage =
  | { kind: "ready" }
  | { kind: "done"; id: number; outcome: RenderOutcome | CheckOutcome }
  /** compileAndRender threw (a bug, not a template error): the pool answers with an exception. */
  | { kind: "failed"; id: number; message: string };

const port = parentPort;
if (port) {
  port.on("message", (m: WorkerRequest) => {
    let reply: WorkerMessage;
    try {
      const outcome =
        m.kind === "check"
          ? checkTemplateSource(m.source, m.partials, m.limits)
          : compileAndRender(m.source, m.config, m.meta, { partials: m.partials, limits: m.limits, cache: m.cache });
      reply = { kind: "done", id: m.id, outcome };
    } catch (e) {
      reply = { kind: "failed", id: m.id, message: e instanceof Error ? e.message : String(e) };
    }
    port.postMessage(reply);
  });
  // Loading this bundle takes a while on a busy machine; the pool starts a job's clock only now.
  port.postMessage({ kind: "ready" } satisfies WorkerMessage);
}
