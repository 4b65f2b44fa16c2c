// The lines power figures are judged against, in one place for the validator's power rules and
// both power displays (the Checks page's card and the look editor's panel).

/** Share of the cell's continuous rating past which a peak is worth a warning. */
export const PEAK_WARN_FRACTION = 0.8;
/**
 * Common practice: addressable LEDs shift colour and may misread data once their supply falls
 * much below the cell, so more than 8 % of the cell's nominal voltage lost in the leads is flagged.
 */
export const WIRE_DROP_WARN_FRACTION = 0.08;
/** Share of the cell's continuous rating kept in reserve when suggesting a cap (peaks stay under 1 − this, i.e. PEAK_WARN_FRACTION). */
export const CAP_MARGIN = 0.2;

/** How a figure reads against its line: over a hard limit, near it, or fine. */
export type Level = "over" | "near" | "ok";

/** A peak against the cell's continuous rating: over it is an error, past PEAK_WARN_FRACTION a warning. */
export function peakLevel(peakAmps: number, ratingAmps: number): Level {
  return peakAmps > ratingAmps ? "over" : peakAmps > ratingAmps * PEAK_WARN_FRACTION ? "near" : "ok";
}

/** The drop in the leads as a share of the cell's nominal voltage. */
export function wireDropLevel(dropShare: number): Level {
  return dropShare > WIRE_DROP_WARN_FRACTION ? "near" : "ok";
}

/** Whole percent, as every power label prints it ("80 %"). */
export const percent = (share: number) => `${Math.round(share * 100)} %`;
