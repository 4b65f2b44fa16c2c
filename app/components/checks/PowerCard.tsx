// The build's power summary over every preset: peak, typical draw, runtime, wire drop and heat,
// the brightness cap that keeps peaks under the cell's rating, energy, and a row per preset.
import type { PowerSummary } from "~/lib/power/estimate";
import { Figure } from "~/components/Figure";

export type PowerCardProps = {
  power: PowerSummary;
  /** Which figures these are: rendered frames, or the colour bound for a config too big to render per request. */
  source: "engine" | "estimate";
  presetNames: Record<string, string>;
  rig: { brightnessCap: number; cellCapacityMah: number; cellNominalVolts: number; wireGaugeAwg: number; wireLengthMm: number };
};

export function formatHours(h: number): string {
  if (!Number.isFinite(h) || h < 0) return "—";
  const total = Math.round(h * 60);
  return `${Math.floor(total / 60)} h ${String(total % 60).padStart(2, "0")} min`;
}

export function PowerCard({ power, source, presetNames, rig }: PowerCardProps) {
  const o = power.overall;
  const rating = o.cellMaxContinuousAmps;
  const typicals = power.presets.map((p) => p.typicalAmps);
  const runtimes = power.presets.map((p) => p.runtimeHours);
  const range = (xs: number[], f: (x: number) => string) => (xs.length === 0 ? "—" : Math.min(...xs) === Math.max(...xs) ? f(xs[0]) : `${f(Math.min(...xs))} – ${f(Math.max(...xs))}`);
  const amps = (x: number) => `${x.toFixed(2)} A`;
  const peakTone = o.peakAmps > rating ? "text-signal-error" : o.peakAmps > rating * 0.8 ? "text-signal-warning" : "";
  const dropShare = rig.cellNominalVolts > 0 ? o.wireDropVolts / rig.cellNominalVolts : 0;
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
      <dl className="grid grid-cols-2 gap-4 sm:grid-cols-4">
        <Figure label="Peak" value={amps(o.peakAmps)} note={`${o.worstPresetId ? `in ${presetNames[o.worstPresetId] ?? o.worstPresetId} · ` : ""}${Math.round((o.peakAmps / rating) * 100)} % of the cell's ${rating} A`} tone={peakTone} />
        <Figure label="Typical" value={range(typicals, amps)} note="mean over the sequence, by preset" />
        <Figure label="Runtime" value={range(runtimes, formatHours)} note={`${rig.cellCapacityMah} mAh at the typical draw`} />
        <Figure label="Energy" value={`${o.energyWh.toFixed(1)} Wh`} note={`${rig.cellCapacityMah} mAh × ${rig.cellNominalVolts} V`} />
        <Figure label="Wire drop at peak" value={`${o.wireDropVolts.toFixed(2)} V`} note={`${rig.wireGaugeAwg} AWG, ${rig.wireLengthMm} mm each way · ${(dropShare * 100).toFixed(1)} % of ${rig.cellNominalVolts} V`} tone={dropShare > 0.08 ? "text-signal-warning" : ""} />
        <Figure label="Wire heat at peak" value={`${o.wireHeatWatts.toFixed(2)} W`} note="in the cell leads" />
        <Figure label="Brightness cap" value={`${Math.round(rig.brightnessCap * 100)} %`} note="set on the rig" />
        <Figure
          label="Suggested cap"
          value={`${Math.round(o.suggestedBrightnessCap * 100)} %`}
          note="keeps every preset's peak under 80 % of the cell's rating"
          tone={o.suggestedBrightnessCap < rig.brightnessCap ? "text-signal-warning" : "text-signal-ok"}
        />
      </dl>
      <div className="overflow-x-auto">
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
                <td className="text-right font-mono tabular-nums">{amps(p.peakAmps)}</td>
                <td className="text-right font-mono tabular-nums">{amps(p.typicalAmps)}</td>
                <td className="text-right font-mono tabular-nums">{formatHours(p.runtimeHours)}</td>
                <td className="text-right font-mono tabular-nums">{Math.round((p.peakAmps / rating) * 100)} %</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </section>
  );
}
