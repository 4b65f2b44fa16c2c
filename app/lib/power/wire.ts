// Copper wire between the cell and the blade: how thick a gauge is, how much it resists, and
// what that costs in volts and heat at a given current. Solid annealed copper at 20 °C; stranded
// wire of the same gauge is close enough for a hilt's few centimetres.

/** ASTM B258: 36 AWG is 0.005 in (0.127 mm) and 0000 AWG is 0.46 in; 39 steps span a ratio of 92. */
export function awgDiameterMm(gauge: number): number {
  return 0.127 * Math.pow(92, (36 - gauge) / 39);
}

export function awgAreaMm2(gauge: number): number {
  const d = awgDiameterMm(gauge);
  return (Math.PI * d * d) / 4;
}

/** International Annealed Copper Standard: 58 MS/m at 20 °C, i.e. 1/58 Ω·mm²/m. */
export const COPPER_RESISTIVITY_OHM_MM2_PER_M = 1 / 58;

export function ohmsPerMetre(gauge: number): number {
  return COPPER_RESISTIVITY_OHM_MM2_PER_M / awgAreaMm2(gauge);
}

/** Current leaves on one conductor and returns on the other, so the loop is twice the run. */
export function roundTripOhms(gauge: number, oneWayMetres: number): number {
  return ohmsPerMetre(gauge) * 2 * oneWayMetres;
}

export function wireDropVolts(gauge: number, oneWayMetres: number, amps: number): number {
  return roundTripOhms(gauge, oneWayMetres) * amps;
}

export function wireHeatWatts(gauge: number, oneWayMetres: number, amps: number): number {
  return roundTripOhms(gauge, oneWayMetres) * amps * amps;
}
