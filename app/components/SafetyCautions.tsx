// Cautions that go with every power figure Hiltbench shows: lithium-ion cells, high currents in
// thin wiring, solder joints. Shared by the Checks page, the look editor's power panel and the
// client's handoff sheet, so the wording is the same wherever a figure appears.

export type SafetyCautionsProps = {
  /** Heading level of the block's title, to fit the page it sits in. */
  headingLevel?: 2 | 3;
  /** Leave out the wiring and solder cautions (a client's sheet needs only the cell's). */
  cellOnly?: boolean;
  className?: string;
};

export const CELL_CAUTIONS = [
  "Charge only between 0 °C and 40 °C, with the saber's own charger, and stop when the cell is full.",
  "Stop using a cell that smells, changes colour, gets hot, swells, leaks or makes noise.",
  "Store cells away from anything that burns, out of the sun and out of hot cars.",
  "Take spent or damaged cells to a recycling point; never put them in the bin.",
  "Choose certified cells from a source you trust.",
] as const;

export const WIRING_CAUTIONS = [
  "High currents heat thin wiring: size the leads from the cell to the blade for the peak current, keep them short, and treat the wire drop shown as an estimate.",
  "A poor solder joint at the cell, the switch or the blade connector adds resistance and gets hot: inspect each joint, insulate it, relieve the strain on it, and solder with the cell removed.",
] as const;

export const DEFER_NOTE =
  "The cell maker's data sheet, local rules and a qualified person come before any figure shown here; Hiltbench's figures are estimates for planning.";

export function SafetyCautions({ headingLevel = 2, cellOnly = false, className = "" }: SafetyCautionsProps) {
  const H = headingLevel === 2 ? "h2" : "h3";
  const Sub = headingLevel === 2 ? "h3" : "h4"; // one level below, so heading levels never skip
  return (
    <section className={`card border-l-4 border-l-signal-warning ${className}`} aria-labelledby="safety-cautions-heading" data-testid="safety-cautions">
      <H id="safety-cautions-heading" className="text-lg">
        Safety cautions
      </H>
      <p className="mt-1 text-sm font-semibold text-brass-300">{DEFER_NOTE}</p>
      <Sub className="mt-3 text-sm uppercase tracking-wide text-iron-400">Lithium-ion cells</Sub>
      <ul className="mt-1 list-disc space-y-1 pl-5 text-sm">
        {CELL_CAUTIONS.map((c) => (
          <li key={c}>{c}</li>
        ))}
      </ul>
      {cellOnly ? null : (
        <>
          <Sub className="mt-3 text-sm uppercase tracking-wide text-iron-400">Wiring and solder joints</Sub>
          <ul className="mt-1 list-disc space-y-1 pl-5 text-sm">
            {WIRING_CAUTIONS.map((c) => (
              <li key={c}>{c}</li>
            ))}
          </ul>
        </>
      )}
    </section>
  );
}
