import { describe, expect, it } from "vitest";
import { awgAreaMm2, awgDiameterMm, COPPER_RESISTIVITY_OHM_MM2_PER_M, ohmsPerMetre, roundTripOhms, wireDropVolts, wireHeatWatts } from "./wire";

// NBS Handbook 100, "Copper Wire Tables", solid annealed copper at 20 °C. The handbook rounds
// diameters to four figures, so compare within ±1 %.
const NBS_100 = [
  { awg: 18, d: 1.024, ohmPerKm: 20.95 },
  { awg: 20, d: 0.812, ohmPerKm: 33.31 },
  { awg: 22, d: 0.644, ohmPerKm: 52.96 },
  { awg: 24, d: 0.511, ohmPerKm: 84.22 },
  { awg: 26, d: 0.405, ohmPerKm: 133.9 },
  { awg: 28, d: 0.321, ohmPerKm: 212.9 },
  { awg: 30, d: 0.255, ohmPerKm: 338.6 },
];

const within = (actual: number, expected: number, fraction: number) => Math.abs(actual - expected) <= Math.abs(expected) * fraction;

describe("wire gauge", () => {
  it.each(NBS_100)("$awg AWG diameter matches NBS Handbook 100 within 1 %", ({ awg, d }) => {
    // Source: ASTM B258 formula vs NBS Handbook 100 table.
    expect(within(awgDiameterMm(awg), d, 0.01)).toBe(true);
  });

  it.each(NBS_100)("$awg AWG resistance matches NBS Handbook 100 within 1 %", ({ awg, ohmPerKm }) => {
    // Source: IACS resistivity (1/58 Ω·mm²/m) over the ASTM B258 area vs NBS Handbook 100 table.
    expect(within(ohmsPerMetre(awg) * 1000, ohmPerKm, 0.01)).toBe(true);
  });

  it("uses the ASTM B258 end points", () => {
    // Source: ASTM B258 — 36 AWG is 0.005 in = 0.127 mm; 0000 (n = −3) is 0.46 in = 11.684 mm.
    expect(awgDiameterMm(36)).toBeCloseTo(0.127, 6);
    expect(awgDiameterMm(-3)).toBeCloseTo(11.684, 3);
  });

  it("uses the IACS resistivity of annealed copper", () => {
    // Source: International Annealed Copper Standard, 58 MS/m at 20 °C.
    expect(COPPER_RESISTIVITY_OHM_MM2_PER_M).toBeCloseTo(0.017241, 6);
    expect(awgAreaMm2(22)).toBeCloseTo((Math.PI * awgDiameterMm(22) ** 2) / 4, 12);
  });

  it("reproduces the worked example: 22 AWG, 10 A, 0.3 m of conductor", () => {
    // Source: references.md worked example (from the NBS 100 Ω/km figure): R = 0.01589 Ω,
    // drop 0.159 V, heat 1.59 W. A 0.15 m one-way run is 0.3 m of conductor in the loop.
    expect(roundTripOhms(22, 0.15)).toBeCloseTo(0.01589, 4);
    expect(wireDropVolts(22, 0.15, 10)).toBeCloseTo(0.159, 3);
    expect(wireHeatWatts(22, 0.15, 10)).toBeCloseTo(1.59, 2);
  });

  it("grows resistance with length and gauge number", () => {
    expect(roundTripOhms(22, 0.3)).toBeCloseTo(2 * roundTripOhms(22, 0.15), 12);
    expect(ohmsPerMetre(28)).toBeGreaterThan(ohmsPerMetre(22));
  });
});
