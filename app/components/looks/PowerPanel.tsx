// The selected preset's current over the demonstration sequence, from the engine's frames, with
// what it means for the cell and the leads, and the shared cautions that go with lithium-ion
// cells and high currents. Figures are worked out after edits settle, never on every keystroke.
import { useEffect, useRef, useState } from "react";
import { CartesianGrid, Line, LineChart, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import type { Config } from "~/lib/config/schema";
import { SafetyCautions } from "~/components/SafetyCautions";
import { PowerFigures } from "~/components/power/PowerFigures";
import { presetPowerFigures, type PresetPowerFigures } from "~/lib/power/figures";
import { formatAmps, type PowerView } from "~/lib/power/labels";
import { PEAK_WARN_FRACTION, percent } from "~/lib/power/thresholds";
import type { PowerReply, PowerRequest } from "./power.worker";

const SETTLE_MS = 350;

/**
 * Figures for (config, preset) once edits settle, from a worker when the browser has one (the
 * main thread would otherwise stall the preview for a heavy look), else on the main thread.
 */
type PowerResult = { figures: PresetPowerFigures | null; where: "worker" | "page"; problem?: string };

function usePowerFigures(config: Config, presetId: string): PowerResult {
  const [result, setResult] = useState<PowerResult>({ figures: null, where: "page" });
  const worker = useRef<Worker | null>(null);
  const latest = useRef(0);
  const first = useRef(true);
  const pending = useRef<{ config: Config; presetId: string } | null>(null);
  const onPage = (c: Config, p: string) => setResult({ figures: presetPowerFigures(c, p), where: "page" });
  useEffect(() => {
    if (typeof Worker === "undefined") return;
    try {
      const w = new Worker(new URL("./power.worker.ts", import.meta.url), { type: "module" });
      w.onmessage = (e: MessageEvent<PowerReply>) => {
        if (e.data.id !== latest.current) return;
        if ("figures" in e.data) setResult({ figures: e.data.figures, where: "worker" });
        else setResult({ figures: null, where: "worker", problem: e.data.error });
      };
      // A worker that cannot start (blocked, failed to load): the page does the work instead.
      w.onerror = () => {
        worker.current = null;
        w.terminate();
        if (pending.current) onPage(pending.current.config, pending.current.presetId);
      };
      worker.current = w;
      return () => {
        w.terminate();
        worker.current = null;
      };
    } catch {
      worker.current = null;
    }
  }, []);
  useEffect(() => {
    const id = ++latest.current;
    const t = setTimeout(
      () => {
        pending.current = { config, presetId };
        if (worker.current) worker.current.postMessage({ id, config, presetId } satisfies PowerRequest);
        else onPage(config, presetId);
      },
      first.current ? 0 : SETTLE_MS,
    );
    first.current = false;
    return () => clearTimeout(t);
  }, [config, presetId]);
  return result;
}

export function PowerPanel({ config, presetId }: { config: Config; presetId: string }) {
  const { figures, where, problem } = usePowerFigures(config, presetId);
  const [mounted, setMounted] = useState(false);
  useEffect(() => setMounted(true), []);

  const rating = config.rig.power.cellMaxContinuousAmps;
  const f = figures;
  const view: PowerView | null = f && {
    rig: { ...config.rig.power, brightnessCap: f.currentCap },
    peakAmps: f.peakAmps,
    peakWhere: `at ${(f.peakAtMs / 1000).toFixed(2)} s`,
    typicalAmps: [f.meanAmps],
    runtimeHours: [f.runtimeHours],
    wireDropVolts: f.wireDropVolts,
    suggestedCap: f.suggestedCap,
  };
  return (
    <section className="card space-y-4" aria-labelledby="power-heading" data-testid="power-panel" data-computed-in={figures ? where : undefined}>
      <h2 id="power-heading" className="text-lg">
        Power for this preset
      </h2>
      {f === null || view === null ? (
        <p className="text-sm text-iron-400">{problem ? `The current could not be worked out for this look (${problem}).` : "Working out the current…"}</p>
      ) : (
        <>
          <PowerFigures view={view} />
          <figure>
            {/* Hidden from assistive technology (the caption says it in words), so it must not take focus either: no accessibility layer. */}
            <div className="h-52 w-full" aria-hidden="true">
              {mounted ? (
                <ResponsiveContainer width="100%" height="100%">
                  <LineChart data={f.series} margin={{ top: 8, right: 12, bottom: 4, left: 0 }} accessibilityLayer={false}>
                    <CartesianGrid stroke="#262a33" strokeDasharray="3 3" />
                    <XAxis dataKey="t" type="number" domain={[0, 7.5]} ticks={[0, 1.5, 2.5, 3.5, 5.5, 6.5, 7.5]} tickFormatter={(v: number) => `${v}s`} stroke="#8d94a3" fontSize={11} />
                    <YAxis domain={[0, (max: number) => Math.max(max, rating) * 1.05]} tickFormatter={(v: number) => `${v.toFixed(1)}`} stroke="#8d94a3" fontSize={11} width={36} unit="A" />
                    <Tooltip
                      contentStyle={{ background: "#13151a", border: "1px solid #353a46", fontSize: 12 }}
                      formatter={(v) => [`${Number(v).toFixed(2)} A`, "Current"]}
                      labelFormatter={(l) => `${Number(l).toFixed(2)} s`}
                    />
                    <ReferenceLine y={rating} stroke="#ff5d5d" strokeDasharray="4 3" label={{ value: "cell rating", fill: "#ff5d5d", fontSize: 10, position: "insideTopRight" }} />
                    <ReferenceLine y={rating * PEAK_WARN_FRACTION} stroke="#f5b93a" strokeDasharray="2 3" label={{ value: percent(PEAK_WARN_FRACTION), fill: "#f5b93a", fontSize: 10, position: "insideBottomRight" }} />
                    <Line type="stepAfter" dataKey="amps" stroke="#f0602a" dot={false} strokeWidth={1.5} isAnimationActive={false} />
                  </LineChart>
                </ResponsiveContainer>
              ) : null}
            </div>
            <figcaption className="mt-1 text-xs text-iron-400">
              Cell current over the demonstration sequence (ignition at 0 s, clash 1.5 s, blast 2.5 s, lockup 3.5–5.5 s, retraction 6.5 s): every channel's rendered
              frames, sampled every {Math.round(f.stepMs)} ms, plus the board and the speaker. Peak {formatAmps(f.peakAmps)}, mean {formatAmps(f.meanAmps)}.
            </figcaption>
          </figure>
        </>
      )}
      <SafetyCautions headingLevel={3} className="border-soot-600 bg-soot-950/60" />
    </section>
  );
}
