// The template editor's draft check and preview, in a Web Worker (decision 007), so a runaway
// template never freezes the tab. Without Worker support it runs inline.
import { useEffect, useRef, useState } from "react";
import type { Config } from "../config/schema";
import type { RenderMeta } from "../template";
import { DraftRunner, runDraft, type DraftResult, type DraftWorker } from "./draft";

/**
 * The newest finished check of `source` (rendered against `config` when there is one), or null
 * while the first is still running. `enabled` is false on the server and while hydrating.
 */
export function useDraftPreview(enabled: boolean, source: string, config: Config | null, meta: RenderMeta | null, partials: Record<string, string>): DraftResult | null {
  const [result, setResult] = useState<DraftResult | null>(null);
  const runner = useRef<DraftRunner | null>(null);

  useEffect(() => {
    if (!enabled) return;
    if (typeof Worker === "undefined") {
      setResult(runDraft({ id: 0, source, config, meta, partials }));
      return;
    }
    runner.current ??= new DraftRunner(
      () => new Worker(new URL("./preview.worker.ts", import.meta.url), { type: "module", name: "template-preview" }) as unknown as DraftWorker,
      setResult,
    );
    runner.current.submit({ source, config, meta, partials });
  }, [enabled, source, config, meta, partials]);

  // The worker goes with the page.
  useEffect(() => () => runner.current?.stop(), []);
  return result;
}
