// The power figures, drawn the one way both pages show them (the Checks page's card for a
// build's presets, the look editor's panel for one preset): labels, notes and levels come from
// app/lib/power/labels.ts; the shared cautions sit beside them on both pages.
import { Figure } from "~/components/Figure";
import { capAdvice, powerFigures, type PowerView } from "~/lib/power/labels";
import type { PowerFigure } from "~/lib/power/labels";

const TONE: Record<PowerFigure["level"], string> = { over: "text-signal-error", near: "text-signal-warning", good: "text-signal-ok", ok: "" };

export function PowerFigures({ view }: { view: PowerView }) {
  const advice = capAdvice(view);
  return (
    <>
      <dl className="grid grid-cols-2 gap-4 sm:grid-cols-4" data-testid="power-figures">
        {powerFigures(view).map((f) => (
          <Figure key={f.key} label={f.label} value={f.value} note={f.note} tone={TONE[f.level]} />
        ))}
      </dl>
      {advice ? (
        <p className="text-sm text-signal-warning" role="status">
          {advice}
        </p>
      ) : null}
    </>
  );
}
