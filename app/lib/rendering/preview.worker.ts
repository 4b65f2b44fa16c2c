// The template editor's draft check and preview, off the page's main thread: a runaway draft
// holds this worker, never the tab, and the page stops it (terminate) when it overruns.
import { runDraft, type DraftJob } from "./draft";

self.onmessage = (e: MessageEvent<DraftJob>) => {
  (self as unknown as Worker).postMessage(runDraft(e.data));
};
