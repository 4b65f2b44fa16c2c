// A bundle's findings, errors first: names that clash after sanitising (reported, never merged),
// the card's capacity, fonts still to come. Notes (names written differently on the card) are
// folded under one line, since 8.3 mode changes nearly every name.
import type { NameFinding } from "~/lib/bundle/names";

const LABEL = { error: "Error", warning: "Warning", info: "Note" } as const;
const TONE = { error: "text-signal-error", warning: "text-signal-warning", info: "text-iron-300" } as const;

function Item({ f }: { f: NameFinding }) {
  return (
    <li data-code={f.code}>
      <span className={`font-semibold ${TONE[f.severity]}`}>{LABEL[f.severity]}</span> <code className="text-xs text-iron-400">{f.code}</code> {f.message}
    </li>
  );
}

export function FindingList({ findings }: { findings: NameFinding[] }) {
  if (findings.length === 0) return <p className="text-sm text-signal-ok">No findings: every name fits the card and the card has room.</p>;
  const serious = [...findings.filter((f) => f.severity === "error"), ...findings.filter((f) => f.severity === "warning")];
  const notes = findings.filter((f) => f.severity === "info");
  return (
    <div className="space-y-2 text-sm" data-testid="bundle-findings">
      {serious.length ? (
        <ul className="space-y-1">
          {serious.map((f, i) => (
            <Item key={`${f.code}-${i}`} f={f} />
          ))}
        </ul>
      ) : (
        <p className="text-signal-ok">No errors or warnings.</p>
      )}
      {notes.length ? (
        <details>
          <summary className="cursor-pointer text-iron-300">
            {notes.length} {notes.length === 1 ? "note" : "notes"}: names written differently on the card
          </summary>
          <ul className="mt-1 space-y-1">
            {notes.map((f, i) => (
              <Item key={`${f.code}-${i}`} f={f} />
            ))}
          </ul>
        </details>
      ) : null}
    </div>
  );
}
