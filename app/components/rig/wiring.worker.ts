// Redraws the wiring picture off the main thread: validating with power figures and ELK's layout
// take long enough to stall typing in the rig form. One message in (config, title), one out.
import { drawWiring } from "~/lib/wiring";

export type WiringRequest = { id: number; config: unknown; title: string };
export type WiringReply = { id: number; ok: boolean; svg: string; connections: string[]; reasons: string[] } | { id: number; error: string };

// A listener, never `self.onmessage =`: elkjs's bundled build, when it first starts inside a
// worker, installs its own `self.onmessage` (to serve as an ELK worker), which replaced ours
// after the first drawing, so the picture never redrew as the rig form changed.
self.addEventListener("message", async (e: MessageEvent<WiringRequest>) => {
  const { id, config, title } = e.data;
  try {
    const p = await drawWiring(config, title);
    const reply: WiringReply = p.ok ? { id, ok: true, svg: p.svg, connections: p.connections, reasons: [] } : { id, ok: false, svg: p.svg, connections: [], reasons: p.reasons };
    self.postMessage(reply);
  } catch (err) {
    self.postMessage({ id, error: err instanceof Error ? err.message : String(err) } satisfies WiringReply);
  }
});
