// Every channel of one preset running live: the same engine as the server, driven at display
// rate by requestAnimationFrame, with the hilt's events on buttons, play/pause, a scrubbable
// timeline and the colours in words. Frames go straight to the canvases; React only re-renders
// the controls about ten times a second.
import { useEffect, useMemo, useRef, useState } from "react";
import type { BladeEvent, Config } from "~/lib/config/schema";
import { createRenderer, renderContextFor } from "~/lib/effects/engine";
import * as live from "~/lib/effects/live";
import { SEQUENCE_SEED } from "~/lib/effects/timeline";
import { summarizeFrame, type FrameSummary } from "~/lib/effects/summary";
import type { TimelineEvent } from "~/lib/effects/timeline";
import { ChannelPreview, type ChannelPreviewHandle } from "./ChannelPreview";
import { ColourTable } from "./ColourTable";
import { FireButton, HoldButton } from "./PreviewControls";
import { Scrubber } from "./Scrubber";

interface Snapshot {
  timeMs: number;
  horizonMs: number;
  playing: boolean;
  lit: boolean;
  held: Record<"lockup" | "drag" | "auxiliary", boolean>;
  events: readonly TimelineEvent[];
}

function snapshot(s: live.LiveSession): Snapshot {
  return {
    timeMs: s.timeMs,
    horizonMs: live.horizonMs(s),
    playing: s.playing,
    lit: live.bladeLit(s),
    held: { lockup: live.isHeld(s, "lockup"), drag: live.isHeld(s, "drag"), auxiliary: live.isHeld(s, "auxiliary") },
    events: s.events.map((e) => ({ ...e })),
  };
}

const UI_EVERY_MS = 100;
const TEXT_EVERY_MS = 250;

export function LivePreview({ config, presetId }: { config: Config; presetId: string }) {
  const preset = config.presets.find((p) => p.id === presetId);
  const channels = config.rig.channels;
  const renderer = useMemo(() => createRenderer(renderContextFor(config, presetId)), [config, presetId]);
  const sessionRef = useRef<live.LiveSession | null>(null);
  sessionRef.current ??= live.createLiveSession();
  const session = sessionRef.current;
  const handles = useRef(new Map<string, ChannelPreviewHandle>());
  // Frames drawn since mount, on the section as data-frames-drawn: what the preview's fps test reads.
  const framesDrawn = useRef(0);
  const sectionRef = useRef<HTMLElement>(null);
  const [ui, setUi] = useState<Snapshot>(() => snapshot(session));
  const [summaries, setSummaries] = useState<Record<string, FrameSummary>>({});
  const refresh = () => setUi(snapshot(session));

  useEffect(() => {
    // Respect a wish for less motion: start still, one press of Play away.
    if (window.matchMedia?.("(prefers-reduced-motion: reduce)").matches) {
      session.playing = false;
      setUi(snapshot(session));
    }
  }, [session]);

  useEffect(() => {
    let raf = 0;
    let last = performance.now();
    let lastUi = -Infinity;
    let lastText = -Infinity;
    const loop = (now: number) => {
      live.advance(session, now - last);
      last = now;
      const words = now - lastText >= TEXT_EVERY_MS;
      const next: Record<string, FrameSummary> = {};
      for (const c of channels) {
        const frame = renderer.render(c.id, session.timeMs, session.events, SEQUENCE_SEED);
        handles.current.get(c.id)?.draw(frame);
        if (words) next[c.id] = summarizeFrame(frame);
      }
      if (words) {
        lastText = now;
        setSummaries(next);
      }
      if (now - lastUi >= UI_EVERY_MS) {
        lastUi = now;
        setUi(snapshot(session));
      }
      framesDrawn.current++;
      sectionRef.current?.setAttribute("data-frames-drawn", String(framesDrawn.current));
      raf = requestAnimationFrame(loop);
    };
    raf = requestAnimationFrame(loop);
    return () => cancelAnimationFrame(raf);
  }, [renderer, channels, session]);

  if (!preset) {
    return <p className="card text-signal-warning">There is no preset “{presetId}” in this config.</p>;
  }

  const act = (f: () => void) => () => {
    f();
    refresh();
  };
  const fire = (e: BladeEvent) => act(() => live.fire(session, e));
  const onPress = (e: BladeEvent) => act(() => live.press(session, e))();
  const onRelease = (e: BladeEvent) => act(() => live.release(session, e))();
  const blade = channels.filter((c) => c.role === "main-blade");
  const others = channels.filter((c) => c.role !== "main-blade");
  const bind = (id: string) => (h: ChannelPreviewHandle | null) => {
    if (h) handles.current.set(id, h);
    else handles.current.delete(id);
  };

  return (
    <section ref={sectionRef} className="card space-y-4" aria-label={`Live preview of ${preset.name}`}>
      <div className="flex flex-wrap items-end gap-8">
        {blade.map((c) => (
          <figure key={c.id} className="flex flex-col items-center gap-2">
            <ChannelPreview channel={c} ref={bind(c.id)} />
            <figcaption className="text-xs text-iron-400">
              {c.name} · {c.pixels} px{c.parallelStrips > 1 ? ` × ${c.parallelStrips}` : ""}
            </figcaption>
          </figure>
        ))}
        <div className="flex flex-col gap-5">
          {others.map((c) => (
            <figure key={c.id} className="flex items-center gap-3">
              <ChannelPreview channel={c} ref={bind(c.id)} length={220} />
              <figcaption className="text-xs text-iron-400">
                {c.name} · {c.pixels} px
              </figcaption>
            </figure>
          ))}
          <p className="text-xs text-iron-400">
            Blade {ui.lit ? "lit" : "unlit"} · brightness cap {Math.round(config.rig.power.brightnessCap * 100)} %
          </p>
        </div>
      </div>

      <div role="group" aria-label="Events" className="flex flex-wrap gap-2">
        <FireButton label="Ignite" onFire={fire("ignition")} disabled={ui.lit} />
        <FireButton label="Retract" onFire={fire("retraction")} disabled={!ui.lit} />
        <FireButton label="Clash" onFire={fire("clash")} />
        <FireButton label="Blast" onFire={fire("blast")} />
        <HoldButton label="Lockup" event="lockup" held={ui.held.lockup} onPress={onPress} onRelease={onRelease} />
        <HoldButton label="Drag" event="drag" held={ui.held.drag} onPress={onPress} onRelease={onRelease} />
        <HoldButton label="Auxiliary" event="auxiliary" held={ui.held.auxiliary} onPress={onPress} onRelease={onRelease} />
      </div>

      <div role="group" aria-label="Playback" className="space-y-2">
        <div className="flex flex-wrap gap-2">
          <button type="button" className="btn btn-primary w-20 justify-center" onClick={act(() => (session.playing = !session.playing))} aria-pressed={ui.playing}>
            {ui.playing ? "Pause" : "Play"}
          </button>
          <button type="button" className="btn" onClick={act(() => live.loadDemoSequence(session))}>
            Demonstration sequence
          </button>
          <button type="button" className="btn" onClick={act(() => Object.assign(session, live.createLiveSession([], session.playing)))}>
            Clear
          </button>
        </div>
        <Scrubber timeMs={ui.timeMs} horizonMs={ui.horizonMs} events={ui.events} onSeek={(t) => act(() => live.seek(session, t))()} />
      </div>

      <details className="rounded-md border border-soot-700 p-3">
        <summary className="cursor-pointer text-sm text-iron-300">Colour values as text</summary>
        <div className="mt-3">
          <ColourTable channels={channels} summaries={summaries} timeMs={ui.timeMs} />
        </div>
      </details>
    </section>
  );
}
