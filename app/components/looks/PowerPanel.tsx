// The selected preset's current over the demonstration sequence, from the engine's frames, with
// what it means for the cell and the leads, and the shared cautions that go with lithium-ion
// cells and high currents. Figures are worked out after edits settle, never on every keystroke.
import { useEffect, useRef, useState } from "react";
import { CartesianGrid, Line, LineChart, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import type { Config } from "~/lib/config/schema";
import { SafetyCautions } from "~/components/SafetyCautions";
import { presetPowerFigures, type PresetPowerFigures } from "~/lib/power/figures";
import type { PowerReply, PowerRequest } from "./power.worker";
import { Figure } from "~/components/Figure";

const SETTLE_MS = 350;

function hours(h: number): string {
  if (!Number.isFinite(h)) return "—";
  const whole = Math.floor(h);
  const min = Math.round((h - whole) * 60);
  return `${whole} h ${String(min).padStart(2, "0")} min`;
}

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
  const over = f !== null && f.peakAmps > rating;
  const near = f !== null && !over && f.peakAmps > rating * 0.8;
  return (
    <section className="card space-y-4" aria-labelledby="power-heading" data-testid="power-panel" data-computed-in={figures ? where : undefined}>
      <h2 id="power-heading" className="text-lg">
        Power for this preset
      </h2>
      {f === null ? (
        <p className="text-sm text-iron-400">{problem ? `The current could not be worked out for this look (${problem}).` : "Working out the current…"}</p>
      ) : (
        <>
          <dl className="grid grid-cols-2 gap-4 sm:grid-cols-3 lg:grid-cols-6">
            <Figure label="Peak" value={`${f.peakAmps.toFixed(2)} A`} note={`at ${(f.peakAtMs / 1000).toFixed(2)} s · ${Math.round(f.ratingShare * 100)} % of the cell's ${rating} A`} tone={over ? "text-signal-error" : near ? "text-signal-warning" : ""} />
            <Figure label="Mean" value={`${f.meanAmps.toFixed(2)} A`} note="over the sequence" />
            <Figure label="Runtime" value={hours(f.runtimeHours)} note={`${config.rig.power.cellCapacityMah} mAh at the mean`} />
            <Figure label="Wire drop at peak" value={`${f.wireDropVolts.toFixed(2)} V`} note={`${config.rig.power.wireGaugeAwg} AWG, ${config.rig.power.wireLengthMm} mm each way · ${(f.wireDropShare * 100).toFixed(1)} % of ${config.rig.power.cellNominalVolts} V`} tone={f.wireDropShare > 0.08 ? "text-signal-warning" : ""} />
            <Figure label="Brightness cap" value={`${Math.round(f.currentCap * 100)} %`} note="set on the rig" />
            <Figure
              label="Highest safe cap"
              value={`${Math.round(f.suggestedCap * 100)} %`}
              note="keeps every frame under 80 % of the cell's continuous rating"
              tone={f.suggestedCap < f.currentCap ? "text-signal-warning" : "text-signal-ok"}
            />
          </dl>
          {f.suggestedCap < f.currentCap ? (
            <p className="text-sm text-signal-warning" role="status">
              Lower the rig's brightness cap to {Math.round(f.suggestedCap * 100)} % or less, or fit a cell with a higher continuous rating.
            </p>
          ) : null}
          <figure>
            <div className="h-52 w-full" aria-hidden="true">
              {mounted ? (
                <ResponsiveContainer width="100%" height="100%">
                  <LineChart data={f.series} margin={{ top: 8, right: 12, bottom: 4, left: 0 }}>
                    <CartesianGrid stroke="#262a33" strokeDasharray="3 3" />
                    <XAxis dataKey="t" type="number" domain={[0, 7.5]} ticks={[0, 1.5, 2.5, 3.5, 5.5, 6.5, 7.5]} tickFormatter={(v: number) => `${v}s`} stroke="#8d94a3" fontSize={11} />
                    <YAxis domain={[0, (max: number) => Math.max(max, rating) * 1.05]} tickFormatter={(v: number) => `${v.toFixed(1)}`} stroke="#8d94a3" fontSize={11} width={36} unit="A" />
                    <Tooltip
                      contentStyle={{ background: "#13151a", border: "1px solid #353a46", fontSize: 12 }}
                      formatter={(v) => [`${Number(v).toFixed(2)} A`, "Current"]}
                      labelFormatter={(l) => `${Number(l).toFixed(2)} s`}
                    />
                    <ReferenceLine y={rating} stroke="#ff5d5d" strokeDasharray="4 3" label={{ value: "cell rating", fill: "#ff5d5d", fontSize: 10, position: "insideTopRight" }} />
                    <ReferenceLine y={rating * 0.8} stroke="#f5b93a" strokeDasharray="2 3" label={{ value: "80 %", fill: "#f5b93a", fontSize: 10, position: "insideBottomRight" }} />
                    <Line type="stepAfter" dataKey="amps" stroke="#f0602a" dot={false} strokeWidth={1.5} isAnimationActive={false} />
                  </LineChart>
                </ResponsiveContainer>
              ) : null}
            </div>
            <figcaption className="mt-1 text-xs text-iron-400">
              Cell current over the demonstration sequence (ignition at 0 s, clash 1.5 s, blast 2.5 s, lockup 3.5–5.5 s, retraction 6.5 s): every channel's rendered
              frames, sampled every {Math.round(f.stepMs)} ms, plus the board and the speaker. Peak {f.peakAmps.toFixed(2)} A, mean {f.meanAmps.toFixed(2)} A.
            </figcaption>
          </figure>
        </>
      )}
      <SafetyCautions headingLevel={3} className="border-soot-600 bg-soot-950/60" />
    </section>
  );
}
