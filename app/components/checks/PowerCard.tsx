// The build's power summary over every preset (the shared power figures: peak, typical draw,
// runtime, energy, wire drop and heat, the caps), with a row per preset.
import { PowerFigures } from "~/components/power/PowerFigures";
import type { PowerSummary } from "~/lib/power/estimate";
import { formatAmps, formatHours, type PowerView } from "~/lib/power/labels";
import { percent } from "~/lib/power/thresholds";

export type PowerCardProps = {
  power: PowerSummary;
  /** Which figures these are: rendered frames, or the colour bound for a config too big to render per request. */
  source: "engine" | "estimate";
  presetNames: Record<string, string>;
  rig: { brightnessCap: number; cellCapacityMah: number; cellNominalVolts: number; wireGaugeAwg: number; wireLengthMm: number };
};

export function PowerCard({ power, source, presetNames, rig }: PowerCardProps) {
  const o = power.overall;
  const rating = o.cellMaxContinuousAmps;
  const view: PowerView = {
    rig: { ...rig, cellMaxContinuousAmps: rating },
    peakAmps: o.peakAmps,
    peakWhere: o.worstPresetId ? `in ${presetNames[o.worstPresetId] ?? o.worstPresetId}` : null,
    typicalAmps: power.presets.map((p) => p.typicalAmps),
    runtimeHours: power.presets.map((p) => p.runtimeHours),
    wireDropVolts: o.wireDropVolts,
    wireHeatWatts: o.wireHeatWatts,
    energyWh: o.energyWh,
    suggestedCap: o.suggestedBrightnessCap,
  };
  return (
    <section className="card space-y-4" aria-labelledby="power-card-heading" data-testid="power-card">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 id="power-card-heading" className="text-lg">
          Power
        </h2>
        <p className="text-xs text-iron-400">
          {source === "engine" ? "From frames the effect engine renders over the demonstration sequence." : "From the colour estimate: this config is too large to render in one request, so figures are upper bounds."}
        </p>
      </div>
      <PowerFigures view={view} />
      <div className="overflow-x-auto" tabIndex={0} role="region" aria-label="Power by preset">
        <table className="table w-full" aria-label="Power by preset">
          <thead>
            <tr>
              <th scope="col">Preset</th>
              <th scope="col" className="text-right">Peak</th>
              <th scope="col" className="text-right">Typical</th>
              <th scope="col" className="text-right">Runtime</th>
              <th scope="col" className="text-right">Share of rating</th>
            </tr>
          </thead>
          <tbody>
            {power.presets.map((p) => (
              <tr key={p.presetId}>
                <th scope="row" className="border-soot-800 text-sm font-normal normal-case tracking-normal text-iron-100">{presetNames[p.presetId] ?? p.presetId}</th>
                <td className="text-right font-mono tabular-nums">{formatAmps(p.peakAmps)}</td>
                <td className="text-right font-mono tabular-nums">{formatAmps(p.typicalAmps)}</td>
                <td className="text-right font-mono tabular-nums">{formatHours(p.runtimeHours)}</td>
                <td className="text-right font-mono tabular-nums">{percent(p.peakAmps / rating)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </section>
  );
}
