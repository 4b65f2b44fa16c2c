// The preview's timeline: a slider over the session with a mark for every recorded event.
import type { TimelineEvent } from "~/lib/effects/timeline";

const MARK: Record<TimelineEvent["event"], string> = {
  ignition: "bg-signal-ok",
  retraction: "bg-iron-400",
  clash: "bg-iron-100",
  blast: "bg-brass-300",
  lockup: "bg-brass-400",
  drag: "bg-ember-400",
  auxiliary: "bg-signal-info",
};

export function Scrubber({ timeMs, horizonMs, events, onSeek }: { timeMs: number; horizonMs: number; events: readonly TimelineEvent[]; onSeek: (t: number) => void }) {
  const pct = (t: number) => `${Math.min(100, Math.max(0, (t / horizonMs) * 100))}%`;
  return (
    <div className="flex items-center gap-3">
      <div className="relative flex-1">
        <div aria-hidden="true" className="relative mb-1 h-2">
          {events.map((e, i) => (
            <span
              key={i}
              title={`${e.event} at ${(e.atMs / 1000).toFixed(2)} s`}
              className={`absolute top-0 h-2 rounded-sm ${MARK[e.event]}`}
              style={{
                left: pct(e.atMs),
                width: e.untilMs !== undefined && e.untilMs > e.atMs ? `calc(${pct(e.untilMs)} - ${pct(e.atMs)})` : e.untilMs === undefined && (e.event === "lockup" || e.event === "drag") ? `calc(${pct(timeMs)} - ${pct(e.atMs)})` : "2px",
                minWidth: 2,
              }}
            />
          ))}
        </div>
        <input
          type="range"
          aria-label="Time"
          aria-valuetext={`${(timeMs / 1000).toFixed(2)} seconds`}
          min={0}
          max={horizonMs}
          step={10}
          value={Math.min(timeMs, horizonMs)}
          onChange={(e) => onSeek(Number(e.currentTarget.value))}
          className="w-full accent-ember-500"
        />
      </div>
      <span className="w-28 text-right font-mono text-xs tabular-nums text-iron-300">
        {(timeMs / 1000).toFixed(2)} / {(horizonMs / 1000).toFixed(1)} s
      </span>
    </div>
  );
}
