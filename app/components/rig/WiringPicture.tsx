// The rig's wiring picture on the Rig tab: drawn in a Web Worker when the page opens and again as
// the rig form changes (the same pure module as the server's SVG route, so the bytes agree), with
// the list of connections as its text alternative and the wiring cautions beside it.
import { useEffect, useRef, useState } from "react";
import { SafetyCautions } from "~/components/SafetyCautions";
import { rigSchema, type Config } from "~/lib/config/schema";
import { rigFromForm } from "~/lib/forms/rig-form";
import type { WiringReply, WiringRequest } from "./wiring.worker";

export type WiringView = { ok: boolean; svg: string; connections: string[]; reasons: string[] };

export function WiringPicture({ config, buildId, title, formId }: { config: Config; buildId: string; title: string; formId: string }) {
  const [view, setView] = useState<WiringView | null>(null);
  const [stale, setStale] = useState(false);
  const seq = useRef(0);
  const sectionRef = useRef<HTMLElement>(null);
  useEffect(() => {
    const form = document.getElementById(formId) as HTMLFormElement | null;
    if (!form || typeof Worker === "undefined") return;
    const worker = new Worker(new URL("./wiring.worker.ts", import.meta.url), { type: "module", name: "wiring" });
    worker.onmessage = (e: MessageEvent<WiringReply>) => {
      if (e.data.id !== seq.current) return;
      if ("error" in e.data) {
        setStale(true);
        return;
      }
      setStale(false);
      setView({ ok: e.data.ok, svg: e.data.svg, connections: e.data.connections, reasons: e.data.reasons });
    };
    let timer: ReturnType<typeof setTimeout> | undefined;
    const redraw = () => {
      if (!wanted) return;
      clearTimeout(timer);
      timer = setTimeout(() => {
        const parsed = rigSchema.safeParse(rigFromForm(new FormData(form)));
        if (!parsed.success) {
          seq.current++;
          setStale(true);
          return;
        }
        worker.postMessage({ id: ++seq.current, config: { ...config, rig: parsed.data }, title } satisfies WiringRequest);
      }, 250);
    };
    // The layout is real work: start when the picture scrolls into view, not on every visit.
    let wanted = false;
    const draw = () => {
      wanted = true;
      redraw();
    };
    const section = sectionRef.current;
    const seen = new IntersectionObserver((entries) => {
      if (entries.some((e) => e.isIntersecting)) {
        seen.disconnect();
        draw();
      }
    });
    if (section) seen.observe(section);
    form.addEventListener("input", redraw);
    form.addEventListener("change", redraw);
    // Rows added or removed change the form without an input event.
    const watch = new MutationObserver(redraw);
    watch.observe(form, { childList: true, subtree: true });
    return () => {
      clearTimeout(timer);
      form.removeEventListener("input", redraw);
      form.removeEventListener("change", redraw);
      watch.disconnect();
      seen.disconnect();
      worker.terminate();
    };
  }, [config, formId, title]);

  return (
    <section ref={sectionRef} className="card wiring-print" aria-labelledby="wiring-heading">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 id="wiring-heading">Wiring picture</h2>
        <a className="text-sm underline" href={`/api/builds/${buildId}/wiring.svg`} download={`wiring-${buildId}.svg`}>
          Download SVG
        </a>
      </div>
      {stale ? (
        <p aria-live="polite" className="mt-2 text-sm text-signal-warning">
          The picture shows the last rig that made sense; fix the fields marked above to redraw it.
        </p>
      ) : null}
      {!view ? (
        <p className="mt-2 text-sm text-iron-300" aria-live="polite">
          Drawing the wiring…
        </p>
      ) : !view.ok ? (
        <div aria-live="polite" className="mt-2 text-sm text-signal-error">
          <p>The validator refuses this rig, so it is not drawn:</p>
          <ul className="list-disc pl-5">
            {view.reasons.slice(0, 8).map((r) => (
              <li key={r}>{r}</li>
            ))}
          </ul>
        </div>
      ) : (
        <>
          <div className="mt-3 overflow-auto rounded-md bg-white p-2" data-testid="wiring-svg" tabIndex={0} aria-label="Wiring picture, scrollable" dangerouslySetInnerHTML={{ __html: view.svg }} />
          <details className="mt-3 text-sm">
            <summary>Connections in words</summary>
            <ul className="mt-2 list-disc space-y-1 pl-5" data-testid="wiring-connections">
              {view.connections.map((c, i) => (
                <li key={i}>{c}</li>
              ))}
            </ul>
          </details>
        </>
      )}
      <SafetyCautions headingLevel={3} className="mt-4" />
    </section>
  );
}
