// How much current a lead may carry, for the picture's caution colour. These are the widely
// quoted "chassis wiring" figures for single copper conductors in free air — common practice,
// written from memory, not from a standard; a wire maker's data sheet (insulation, bundling,
// temperature) always wins, and the picture says so.
const CHASSIS_AMPS: Record<number, number> = {
  10: 55, 12: 41, 14: 32, 16: 22, 18: 16, 20: 11, 22: 7, 24: 3.5, 26: 2.2, 28: 1.4, 30: 0.86, 32: 0.53, 34: 0.33, 36: 0.21,
};

/** A lead drawn past this share of its rating is shown in the caution colour (as the cell check uses 80 %). */
export const SAFE_SHARE = 0.8;

/** Rated amps of one conductor of this gauge, or null for a gauge the table does not list. */
export function chassisAmpacity(awg: number): number | null {
  if (CHASSIS_AMPS[awg] !== undefined) return CHASSIS_AMPS[awg];
  // Odd gauges sit between two listed ones; area (and so rating) steps geometrically.
  const below = CHASSIS_AMPS[awg - 1];
  const above = CHASSIS_AMPS[awg + 1];
  return below !== undefined && above !== undefined ? Math.round(Math.sqrt(below * above) * 100) / 100 : null;
}
