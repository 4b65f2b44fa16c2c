// The model diff as a list a person reads: one line per change, in Hiltbench's words.
import type { Change } from "~/lib/model-diff";

const mark = { added: "+", removed: "−", changed: "~", moved: "↕" } as const;
const tone = { added: "text-signal-ok", removed: "text-signal-error", changed: "text-iron-200", moved: "text-iron-300" } as const;

export function ModelChanges({ changes, testId = "model-diff", empty = "No changes to the config." }: { changes: Change[]; testId?: string; empty?: string }) {
  if (changes.length === 0) return <p className="text-sm text-iron-300">{empty}</p>;
  return (
    <ul className="space-y-1 text-sm" data-testid={testId}>
      {changes.map((c, i) => (
        <li key={i} className={tone[c.kind]} data-kind={c.kind}>
          <span aria-hidden className="mr-2 inline-block w-3 font-mono">
            {mark[c.kind]}
          </span>
          {c.text}
        </li>
      ))}
    </ul>
  );
}
