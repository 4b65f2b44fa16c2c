// Electrical limits: peak current against the cell's continuous rating, and the drop in the
// cell leads. The figures come from the power summary computed once per validation.
import { PEAK_WARN_FRACTION, WIRE_DROP_WARN_FRACTION, percent } from "../../power/thresholds";
import { pathOf, type LayerCheck, type RuleContext } from "./context";

const amps = (a: number) => `${a.toFixed(1)} A`;

export const powerLayerCheck: LayerCheck = (ctx, layer, at) => {
  if (layer.kind === "breathe" && layer.floor > layer.ceiling)
    ctx.sink.error("breathe-floor-above-ceiling", pathOf(at, "floor"), `The breathe floor (${layer.floor}) is above its ceiling (${layer.ceiling}).`, "Swap them: the floor is the dimmest point, the ceiling the brightest.");
};

export function powerRules(ctx: RuleContext): void {
  const { config, sink, power } = ctx;
  const p = config.rig.power;
  const rating = p.cellMaxContinuousAmps;
  const cap = power.overall.suggestedBrightnessCap;

  power.presets.forEach((pp, pi) => {
    const preset = config.presets[pi];
    const need = `or fit a cell rated for at least ${amps(pp.peakAmps / PEAK_WARN_FRACTION)} continuous`;
    const capHint = cap < p.brightnessCap ? `Lower rig.power.brightnessCap to ${cap.toFixed(2)} or less (keeps every preset under ${percent(PEAK_WARN_FRACTION)} of the rating), ${need}.` : `Fit a cell with a higher continuous rating (at least ${amps(pp.peakAmps / PEAK_WARN_FRACTION)}).`;
    if (pp.peakAmps > rating)
      sink.error("peak-over-cell-rating", `presets[${pi}]`, `Preset "${preset.name}" can draw about ${amps(pp.peakAmps)} at peak, more than the cell's ${amps(rating)} continuous rating.`, capHint);
    else if (pp.peakAmps > rating * PEAK_WARN_FRACTION)
      sink.warning("peak-near-cell-rating", `presets[${pi}]`, `Preset "${preset.name}" can draw about ${amps(pp.peakAmps)} at peak, over ${percent(PEAK_WARN_FRACTION)} of the cell's ${amps(rating)} continuous rating.`, capHint);
  });

  const drop = power.overall.wireDropVolts;
  const limit = p.cellNominalVolts * WIRE_DROP_WARN_FRACTION;
  if (drop > limit)
    sink.warning("wire-drop-high", "rig.power.wireGaugeAwg", `At the ${amps(power.overall.peakAmps)} peak, ${p.wireGaugeAwg} AWG leads of ${p.wireLengthMm} mm lose about ${drop.toFixed(2)} V (limit ${limit.toFixed(2)} V, ${percent(WIRE_DROP_WARN_FRACTION)} of the cell).`, "Use a thicker gauge (a smaller AWG number), shorten the leads, or lower the brightness cap.");
}
