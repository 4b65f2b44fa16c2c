// Checking and previewing a template draft in the browser, in a Web Worker (decision 007): the
// page posts each settled draft, keeps only the newest answer, and terminates a worker that is
// still busy when a newer draft comes or that overruns the render's time limit, so a runaway
// template never freezes the tab. Without Worker support it runs inline.
import { useEffect, useRef, useState } from "react";
import type { Config } from "./config/schema";
import { compileTemplate, DEFAULT_LIMITS, type RenderMeta, type TemplateError } from "./template";
import { compileAndRender, partialsFrom, type RenderOutcome } from "./template-render";

export type DraftJob = { id: number; source: string; config: Config | null; meta: RenderMeta | null; partials: Record<string, string> };
export type DraftResult = { id: number; render: RenderOutcome | null; problems: TemplateError[] };

/** How long past the render's own time limit a silent worker is given before it is stopped. */
const KILL_MARGIN_MS = 500;

function inline(job: DraftJob): DraftResult {
  if (job.config) {
    const r = compileAndRender(job.source, job.config, job.meta!, { partials: job.partials, cache: false });
    return { id: job.id, render: r, problems: r.ok ? r.warnings : [...r.errors, ...r.warnings] };
  }
  const c = compileTemplate(job.source, { partials: partialsFrom(job.partials), cache: false });
  return { id: job.id, render: null, problems: c.ok ? c.warnings : c.errors };
}

function overran(id: number, hasConfig: boolean): DraftResult {
  const message = `rendering took longer than the time limit of ${DEFAULT_LIMITS.maxMillis} ms`;
  const error: TemplateError = { stage: "render", severity: "error", message, line: 1, column: 1, from: 0, to: 0 };
  return { id, render: hasConfig ? { ok: false, errors: [error], warnings: [] } : null, problems: [error] };
}

/**
 * The newest finished check of `source` (rendered against `config` when there is one), or null
 * while the first is still running. `enabled` is false on the server and while hydrating.
 */
export function useDraftPreview(enabled: boolean, source: string, config: Config | null, meta: RenderMeta | null, partials: Record<string, string>): DraftResult | null {
  const [result, setResult] = useState<DraftResult | null>(null);
  const worker = useRef<Worker | null>(null);
  const busy = useRef<{ id: number; timer: ReturnType<typeof setTimeout> } | null>(null);
  const nextId = useRef(0);

  useEffect(() => {
    if (!enabled) return;
    const id = ++nextId.current;
    const job: DraftJob = { id, source, config, meta, partials };
    if (typeof Worker === "undefined") {
      setResult(inline(job));
      return;
    }
    // A worker still on an older draft is stopped: its answer would be thrown away anyway.
    if (busy.current) {
      clearTimeout(busy.current.timer);
      worker.current?.terminate();
      worker.current = null;
      busy.current = null;
    }
    if (!worker.current) {
      const w = new Worker(new URL("./template-preview.worker.ts", import.meta.url), { type: "module", name: "template-preview" });
      w.onmessage = (e: MessageEvent<DraftResult>) => {
        if (busy.current?.id !== e.data.id) return;
        clearTimeout(busy.current.timer);
        busy.current = null;
        setResult(e.data);
      };
      worker.current = w;
    }
    const timer = setTimeout(() => {
      if (busy.current?.id !== id) return;
      worker.current?.terminate();
      worker.current = null;
      busy.current = null;
      setResult(overran(id, config !== null));
    }, DEFAULT_LIMITS.maxMillis + KILL_MARGIN_MS);
    busy.current = { id, timer };
    worker.current.postMessage(job);
  }, [enabled, source, config, meta, partials]);

  // The worker goes with the page.
  useEffect(
    () => () => {
      if (busy.current) clearTimeout(busy.current.timer);
      worker.current?.terminate();
      worker.current = null;
    },
    [],
  );
  return result;
}
