// The look editor's power panel in numbers: current over the demonstration sequence from the
// engine's frames (sequenceCurrent), and what it means for the cell, the leads and the
// brightness cap. Pure; the panel only draws these.
import type { Config } from "~/lib/config/schema";
import { audioAt, sequenceCurrent } from "~/lib/power/sequence";
import { bladeStateAt, DEMO_SEQUENCE, type BladeState } from "~/lib/effects/timeline";
import { boardIdleMilliamps, runtimeHours } from "~/lib/power/current";
import { CAP_MARGIN } from "~/lib/power/thresholds";
import { wireDropVolts } from "~/lib/power/wire";

export interface PresetPowerFigures {
  /** Seconds and amps, one point per sampled frame. */
  series: { t: number; amps: number }[];
  stepMs: number;
  peakAmps: number;
  peakAtMs: number;
  meanAmps: number;
  /** Hours on the rig's cell at the sequence's mean current. */
  runtimeHours: number;
  /** Round-trip drop in the cell leads at the peak. */
  wireDropVolts: number;
  wireDropShare: number;
  cellMaxContinuousAmps: number;
  /** Peak as a share of the cell's continuous rating. */
  ratingShare: number;
  /** Highest cap (0–1, down to 0.01) keeping every sampled frame under the rating less CAP_MARGIN. */
  suggestedCap: number;
  currentCap: number;
}

/** Current every pixel draws whatever it shows (all parallel strips). */
function pixelIdleMa(config: Config): number {
  const p = config.rig.power.pixelIdleMilliamps;
  return config.rig.channels.reduce((s, c) => s + c.pixels * c.parallelStrips * p, 0);
}

/**
 * Frames get heavier with layers × pixels; past a budget the panel samples less often so it
 * stays responsive (the step is shown beside the plot). ~6000 layer-pixels keep every 60 fps frame.
 */
export function sampleStepMs(config: Config, presetId: string): number {
  const preset = config.presets.find((p) => p.id === presetId);
  let work = 0;
  for (const c of config.rig.channels) work += (preset?.looks[c.id]?.layers.length ?? 0) * c.pixels;
  const every = Math.max(1, Math.min(12, Math.ceil(work / 6000)));
  return (1000 / 60) * every;
}

/**
 * The cap keeps each frame's LED colour current scaled (the board, the amplifier and the pixels'
 * own idle current do not scale), so the highest safe cap is the smallest, over frames, of
 * (budget − fixed) / colour-at-full-cap.
 */
export function capForFrames(colourAtFullMa: readonly number[], fixedMa: readonly number[], cellMaxContinuousAmps: number, margin = CAP_MARGIN): number {
  const budget = cellMaxContinuousAmps * 1000 * (1 - margin);
  let cap = 1;
  for (let i = 0; i < colourAtFullMa.length; i++) {
    const room = budget - fixedMa[i];
    if (room <= 0) return 0;
    if (colourAtFullMa[i] > 0) cap = Math.min(cap, room / colourAtFullMa[i]);
  }
  return Math.max(0, Math.floor(cap * 100 + 1e-9) / 100);
}

export function presetPowerFigures(config: Config, presetId: string, stepMs = sampleStepMs(config, presetId)): PresetPowerFigures {
  const { power, board } = config.rig;
  const run = sequenceCurrent(config, presetId, stepMs);
  const state: BladeState = { lit: false, sinceMs: NaN };
  const idle = boardIdleMilliamps(board) + pixelIdleMa(config);
  const fixed = run.timesMs.map((t) => idle + audioAt(config, DEMO_SEQUENCE, t, bladeStateAt(DEMO_SEQUENCE, t, state)));
  let colourAtFull: number[];
  if (power.brightnessCap > 0) {
    colourAtFull = run.milliamps.map((ma, i) => Math.max(0, ma - fixed[i]) / power.brightnessCap);
  } else {
    // A zero cap hides how bright the looks are: measure them again at full brightness.
    const full: Config = { ...config, rig: { ...config.rig, power: { ...power, brightnessCap: 1 } } };
    colourAtFull = sequenceCurrent(full, presetId, stepMs).milliamps.map((ma, i) => Math.max(0, ma - fixed[i]));
  }
  let peakAt = 0;
  run.milliamps.forEach((ma, i) => {
    if (ma > run.milliamps[peakAt]) peakAt = i;
  });
  const drop = wireDropVolts(power.wireGaugeAwg, power.wireLengthMm / 1000, run.peakAmps);
  return {
    series: run.timesMs.map((t, i) => ({ t: t / 1000, amps: run.milliamps[i] / 1000 })),
    stepMs,
    peakAmps: run.peakAmps,
    peakAtMs: run.timesMs[peakAt] ?? 0,
    meanAmps: run.meanAmps,
    runtimeHours: runtimeHours(power.cellCapacityMah, run.meanAmps * 1000),
    wireDropVolts: drop,
    wireDropShare: drop / power.cellNominalVolts,
    cellMaxContinuousAmps: power.cellMaxContinuousAmps,
    ratingShare: run.peakAmps / power.cellMaxContinuousAmps,
    suggestedCap: capForFrames(colourAtFull, fixed, power.cellMaxContinuousAmps),
    currentCap: power.brightnessCap,
  };
}
