// The card zip downloaded with a progress bar and a cancel button: the stream is read here, then
// saved under its own name, with its SHA-256 (Web Crypto) so the workshop can name the bundle.
// A plain link downloads it through the browser's own download manager instead.
import { useRef, useState } from "react";
import { formatBytes } from "~/lib/bundle/card-check";

type State = { kind: "idle" } | { kind: "loading"; received: number } | { kind: "done"; ok: boolean; message: string; sha256?: string };

/** Above this the zip is not hashed in the page (it would be read twice into memory). */
const HASH_LIMIT = 512e6;

export function BundleDownload({ href, name, approxBytes, blocked }: { href: string; name: string; approxBytes: number; blocked: string | null }) {
  const [state, setState] = useState<State>({ kind: "idle" });
  const abort = useRef<AbortController | null>(null);

  async function start() {
    const ac = new AbortController();
    abort.current = ac;
    setState({ kind: "loading", received: 0 });
    try {
      const res = await fetch(href, { signal: ac.signal, headers: { Accept: "application/zip" } });
      if (!res.ok || !res.body) {
        const body = (await res.json().catch(() => ({}))) as { error?: string };
        setState({ kind: "done", ok: false, message: body.error ?? `The bundle was refused (${res.status}).` });
        return;
      }
      const reader = res.body.getReader();
      const parts: Uint8Array<ArrayBuffer>[] = [];
      let received = 0;
      let shown = 0;
      for (;;) {
        const { done, value } = await reader.read();
        if (done) break;
        parts.push(value as Uint8Array<ArrayBuffer>);
        received += value.length;
        // Repaint every ~1 % rather than on every piece.
        if (received - shown > approxBytes / 100) {
          shown = received;
          setState({ kind: "loading", received });
        }
      }
      const blob = new Blob(parts, { type: "application/zip" });
      let sha256: string | undefined;
      if (blob.size <= HASH_LIMIT && globalThis.crypto?.subtle) {
        const digest = await crypto.subtle.digest("SHA-256", await blob.arrayBuffer());
        sha256 = [...new Uint8Array(digest)].map((b) => b.toString(16).padStart(2, "0")).join("");
      }
      const url = URL.createObjectURL(blob);
      const a = document.createElement("a");
      a.href = url;
      a.download = name;
      document.body.append(a);
      a.click();
      a.remove();
      setTimeout(() => URL.revokeObjectURL(url), 60_000);
      setState({ kind: "done", ok: true, message: `Downloaded ${name} (${formatBytes(blob.size)}).`, sha256 });
    } catch (e) {
      const cancelled = e instanceof DOMException && e.name === "AbortError";
      setState({ kind: "done", ok: false, message: cancelled ? "Download cancelled." : "The connection broke during the download; try again." });
    } finally {
      abort.current = null;
    }
  }

  const loading = state.kind === "loading";
  const pct = loading ? Math.min(99, Math.round((100 * state.received) / Math.max(1, approxBytes))) : 0;
  return (
    <div className="space-y-2">
      <div className="flex flex-wrap items-center gap-3">
        <button type="button" className="btn btn-primary" onClick={start} disabled={loading || blocked !== null} aria-describedby={blocked ? "bundle-blocked" : undefined}>
          Download the card zip
        </button>
        {blocked === null ? (
          <a href={href} download={name} className="text-sm">
            or let the browser download it
          </a>
        ) : null}
      </div>
      {blocked ? (
        <p id="bundle-blocked" className="text-sm text-signal-error">
          {blocked}
        </p>
      ) : null}
      {loading ? (
        <div className="flex items-center gap-3">
          <progress className="h-2 flex-1" max={100} value={pct} aria-label="Downloading the card zip" />
          <span className="text-xs tabular-nums">
            {formatBytes(state.received)} of about {formatBytes(approxBytes)}
          </span>
          <button type="button" className="btn" onClick={() => abort.current?.abort()}>
            Cancel
          </button>
        </div>
      ) : null}
      {state.kind === "done" ? (
        <div role={state.ok ? "status" : "alert"} className={`text-sm ${state.ok ? "text-signal-ok" : "text-signal-error"}`}>
          <p>{state.message}</p>
          {state.sha256 ? (
            <p className="text-iron-300">
              SHA-256 of this zip: <code className="break-all" data-testid="zip-sha256">{state.sha256}</code>
            </p>
          ) : null}
        </div>
      ) : null}
    </div>
  );
}
