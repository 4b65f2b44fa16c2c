// The template editor's draft check and preview, off the page's main thread: a runaway draft
// holds this worker, never the tab, and the page stops it (terminate) when it overruns.
import type { Config } from "./config/schema";
import { compileTemplate, type RenderMeta } from "./template";
import { compileAndRender, partialsFrom } from "./template-render";
import type { DraftJob, DraftResult } from "./template-preview";

function run(job: DraftJob): DraftResult {
  if (job.config) {
    const r = compileAndRender(job.source, job.config as Config, job.meta as RenderMeta, { partials: job.partials, cache: false });
    return { id: job.id, render: r, problems: r.ok ? r.warnings : [...r.errors, ...r.warnings] };
  }
  const c = compileTemplate(job.source, { partials: partialsFrom(job.partials), cache: false });
  return { id: job.id, render: null, problems: c.ok ? c.warnings : c.errors };
}

self.onmessage = (e: MessageEvent<DraftJob>) => {
  (self as unknown as Worker).postMessage(run(e.data));
};
