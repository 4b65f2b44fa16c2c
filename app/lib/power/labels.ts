// Every power figure as a person reads it: the same labels, units, notes and levels on the Checks
// page (a build's presets together) and in the look editor (one preset), so the two pages never
// disagree about what a number means or when it is a worry. Pure; the component only draws these.
import { CAP_MARGIN, peakLevel, percent, wireDropLevel, type Level } from "./thresholds";

export type PowerView = {
  rig: { cellMaxContinuousAmps: number; cellCapacityMah: number; cellNominalVolts: number; wireGaugeAwg: number; wireLengthMm: number; brightnessCap: number };
  peakAmps: number;
  /** Where the peak is: "in Northlight" (a build's worst preset) or "at 1.50 s" (one preset's sequence). */
  peakWhere: string | null;
  /** Mean current over the demonstration sequence: one per preset (shown as a range), or one. */
  typicalAmps: number[];
  /** Runtime on the rig's cell at each typical draw. */
  runtimeHours: number[];
  wireDropVolts: number;
  wireHeatWatts?: number;
  energyWh?: number;
  /** Highest brightness cap keeping every peak under the rating less CAP_MARGIN. */
  suggestedCap: number;
};

/** `good` marks a figure that is fine and worth saying so (a cap with room to spare). */
export type PowerFigure = { key: string; label: string; value: string; note: string; level: Level | "good" };

export const formatAmps = (a: number) => `${a.toFixed(2)} A`;

export function formatHours(h: number): string {
  if (!Number.isFinite(h) || h < 0) return "—";
  const total = Math.round(h * 60);
  return `${Math.floor(total / 60)} h ${String(total % 60).padStart(2, "0")} min`;
}

/** One value, or "low – high" when the presets differ. */
export function formatRange(xs: readonly number[], f: (x: number) => string): string {
  if (xs.length === 0) return "—";
  const lo = Math.min(...xs);
  const hi = Math.max(...xs);
  return lo === hi ? f(lo) : `${f(lo)} – ${f(hi)}`;
}

export function powerFigures(p: PowerView): PowerFigure[] {
  const r = p.rig;
  const rating = r.cellMaxContinuousAmps;
  const dropShare = r.cellNominalVolts > 0 ? p.wireDropVolts / r.cellNominalVolts : 0;
  const out: PowerFigure[] = [
    { key: "peak", label: "Peak", value: formatAmps(p.peakAmps), note: `${p.peakWhere ? `${p.peakWhere} · ` : ""}${percent(p.peakAmps / rating)} of the cell's ${rating} A`, level: peakLevel(p.peakAmps, rating) },
    { key: "typical", label: "Typical", value: formatRange(p.typicalAmps, formatAmps), note: `mean over the sequence${p.typicalAmps.length > 1 ? ", by preset" : ""}`, level: "ok" },
    { key: "runtime", label: "Runtime", value: formatRange(p.runtimeHours, formatHours), note: `${r.cellCapacityMah} mAh at the typical draw`, level: "ok" },
  ];
  if (p.energyWh !== undefined) out.push({ key: "energy", label: "Energy", value: `${p.energyWh.toFixed(1)} Wh`, note: `${r.cellCapacityMah} mAh × ${r.cellNominalVolts} V`, level: "ok" });
  out.push({
    key: "wire-drop",
    label: "Wire drop at peak",
    value: `${p.wireDropVolts.toFixed(2)} V`,
    note: `${r.wireGaugeAwg} AWG, ${r.wireLengthMm} mm each way · ${(dropShare * 100).toFixed(1)} % of ${r.cellNominalVolts} V`,
    level: wireDropLevel(dropShare),
  });
  if (p.wireHeatWatts !== undefined) out.push({ key: "wire-heat", label: "Wire heat at peak", value: `${p.wireHeatWatts.toFixed(2)} W`, note: "in the cell leads", level: "ok" });
  out.push(
    { key: "cap", label: "Brightness cap", value: percent(r.brightnessCap), note: "set on the rig", level: "ok" },
    {
      key: "suggested-cap",
      label: "Suggested cap",
      value: percent(p.suggestedCap),
      note: `keeps every peak under ${percent(1 - CAP_MARGIN)} of the cell's continuous rating`,
      level: p.suggestedCap < r.brightnessCap ? "near" : "good",
    },
  );
  return out;
}

/** What to do when the rig's cap is above the suggested one; null when it is not. */
export function capAdvice(p: PowerView): string | null {
  if (p.suggestedCap >= p.rig.brightnessCap) return null;
  return `Lower the rig's brightness cap to ${percent(p.suggestedCap)} or less, or fit a cell with a higher continuous rating.`;
}
