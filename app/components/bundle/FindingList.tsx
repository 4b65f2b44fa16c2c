// A bundle's findings, errors first: names that clash after sanitising (reported, never merged),
// the card's capacity, fonts still to come, names written differently on the card.
import type { NameFinding } from "~/lib/bundle/names";

const ORDER = { error: 0, warning: 1, info: 2 } as const;
const LABEL = { error: "Error", warning: "Warning", info: "Note" } as const;
const TONE = { error: "text-signal-error", warning: "text-signal-warning", info: "text-iron-300" } as const;

export function FindingList({ findings }: { findings: NameFinding[] }) {
  if (findings.length === 0) return <p className="text-sm text-signal-ok">No findings: every name fits the card and the card has room.</p>;
  const sorted = [...findings].sort((a, b) => ORDER[a.severity] - ORDER[b.severity]);
  return (
    <ul className="space-y-1 text-sm" data-testid="bundle-findings">
      {sorted.map((f, i) => (
        <li key={`${f.code}-${f.path}-${i}`} data-code={f.code}>
          <span className={`font-semibold ${TONE[f.severity]}`}>{LABEL[f.severity]}</span> <code className="text-xs text-iron-400">{f.code}</code> {f.message}
        </li>
      ))}
    </ul>
  );
}
