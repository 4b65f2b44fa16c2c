// Current drawn from the cell: LEDs from a frame of pixel bytes, the board at rest, the
// amplifier, and what that means for runtime, energy and a safe brightness cap.
import { CAP_MARGIN } from "./thresholds";
import type { Board, Channel, Power, Speaker } from "../config/schema";

/**
 * Current of one channel for one frame. The frame holds 3 bytes per pixel exactly as sent to
 * the strip (colour order does not matter for a sum; the brightness cap is already applied).
 * Parallel strips share the data line, so they light the same way and each draws the same.
 */
export function frameCurrentMilliamps(rgb: Uint8ClampedArray, channel: Channel, power: Power): number {
  const bytes = Math.min(rgb.length, channel.pixels * 3);
  let sum = 0;
  for (let i = 0; i < bytes; i++) sum += rgb[i];
  const perStrip = (sum / 255) * power.ledMilliampsPerColor + channel.pixels * power.pixelIdleMilliamps;
  return perStrip * channel.parallelStrips;
}

export function boardIdleMilliamps(board: Board): number {
  return board.idleMilliamps;
}

/**
 * Assumption, not a measurement: small class-D amplifiers are commonly quoted at 80–90 %
 * efficiency, so 0.8 is the cautious default when a rig does not state its own.
 */
export const DEFAULT_AMPLIFIER_EFFICIENCY = 0.8;

/**
 * Assumption: while humming and swinging, the speaker averages about a quarter of its rated
 * power; clashes and ignitions reach the full rating only briefly.
 */
export const TYPICAL_AUDIO_FRACTION = 0.25;

/** Cell current when the speaker plays at its rated power (the worst case, used for peaks). */
export function audioMilliamps(speaker: Speaker, power: Power): number {
  const efficiency = speaker.amplifierEfficiency > 0 ? speaker.amplifierEfficiency : DEFAULT_AMPLIFIER_EFFICIENCY;
  return (speaker.ratedPowerWatts / (power.cellNominalVolts * efficiency)) * 1000;
}

export function typicalAudioMilliamps(speaker: Speaker, power: Power): number {
  return audioMilliamps(speaker, power) * TYPICAL_AUDIO_FRACTION;
}

/** Wh = Ah × nominal V. */
export function energyWh(capacityMah: number, nominalVolts: number): number {
  return (capacityMah / 1000) * nominalVolts;
}

/**
 * Hours a cell lasts at a steady average current; `efficiency` is the share of the stored
 * energy that reaches the load (1 when the load runs straight off the cell).
 */
export function runtimeHours(capacityMah: number, averageMilliamps: number, efficiency = 1): number {
  if (averageMilliamps <= 0) return Infinity;
  return (capacityMah * efficiency) / averageMilliamps;
}

/** Hours at a steady load in watts: Wh × η / W. */
export function runtimeHoursAtWatts(energy: number, loadWatts: number, efficiency = 1): number {
  if (loadWatts <= 0) return Infinity;
  return (energy * efficiency) / loadWatts;
}


/**
 * The highest brightness cap (0–1, rounded down to 0.01) that keeps the peak under the cell's
 * continuous rating less the margin. LED colour current scales with the cap; the board, the
 * amplifier and the pixels' own idle current do not.
 *
 * @param colourMilliampsAtFullCap LED colour current of the worst frame at cap 1
 * @param fixedMilliamps everything the cap does not change
 */
export function suggestedBrightnessCap(
  colourMilliampsAtFullCap: number,
  fixedMilliamps: number,
  cellMaxContinuousAmps: number,
  margin = CAP_MARGIN,
): number {
  const budget = cellMaxContinuousAmps * 1000 * (1 - margin) - fixedMilliamps;
  if (budget <= 0) return 0;
  if (colourMilliampsAtFullCap <= 0) return 1;
  return Math.min(1, Math.floor((budget / colourMilliampsAtFullCap) * 100) / 100);
}
