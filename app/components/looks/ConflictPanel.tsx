// A save refused because someone else saved meanwhile: what they changed (the model diff from
// the editor's base to the stored config), and two ways on: reload theirs, or put my changes on
// top (a three-way merge on the model; where both changed the same value, the person picks).
import { useMemo, useState } from "react";
import type { Config } from "~/lib/config/schema";
import { diffModels, merge3, type Side } from "~/lib/model-diff";
import { ModelChanges } from "../revisions/ModelChanges";

export type Stale = { base: Config; mine: Config; theirs: Config; version: number };

export function ConflictPanel({ stale, onReload, onMerged, onCancel }: { stale: Stale; onReload: () => void; onMerged: (merged: Config) => void; onCancel: () => void }) {
  const theirChanges = useMemo(() => diffModels(stale.base, stale.theirs).changes, [stale]);
  const [choices, setChoices] = useState<Record<string, Side>>({});
  const result = useMemo(() => merge3(stale.base, stale.mine, stale.theirs, choices), [stale, choices]);
  const open = result.conflicts.filter((c) => !choices[c.path]);
  return (
    <section className="card space-y-3 border border-signal-warning" role="region" aria-labelledby="conflict-h" data-testid="conflict-panel">
      <h2 id="conflict-h" className="text-lg">
        Someone saved version {stale.version} while you were editing
      </h2>
      <p className="text-sm text-iron-300">Nothing of yours was saved or lost. What they changed:</p>
      <ModelChanges changes={theirChanges} testId="their-changes" empty="Nothing in the config (they saved the same content)." />
      {result.conflicts.length > 0 ? (
        <div className="space-y-2" data-testid="conflicts">
          <p className="text-sm">You both changed {result.conflicts.length === 1 ? "the same value" : `${result.conflicts.length} of the same values`}: pick which to keep.</p>
          {result.conflicts.map((c) => (
            <fieldset key={c.path} className="rounded-md border border-soot-700 p-2 text-sm">
              <legend className="px-1">{c.text}</legend>
              <label className="mr-4 inline-flex items-center gap-2">
                <input type="radio" name={`pick-${c.path}`} checked={choices[c.path] === "mine"} onChange={() => setChoices((x) => ({ ...x, [c.path]: "mine" }))} />
                Yours: <code>{c.mine}</code>
              </label>
              <label className="inline-flex items-center gap-2">
                <input type="radio" name={`pick-${c.path}`} checked={choices[c.path] === "theirs"} onChange={() => setChoices((x) => ({ ...x, [c.path]: "theirs" }))} />
                Theirs: <code>{c.theirs}</code>
              </label>
            </fieldset>
          ))}
        </div>
      ) : (
        <p className="text-sm text-iron-300">Your changes and theirs touch different things: they combine on their own.</p>
      )}
      <div className="flex flex-wrap gap-2">
        <button type="button" className="btn btn-primary" disabled={open.length > 0} onClick={() => onMerged(result.merged)}>
          Put my changes on top
        </button>
        <button type="button" className="btn" onClick={onReload}>
          Reload their version (drop mine)
        </button>
        <button type="button" className="btn" onClick={onCancel}>
          Not now
        </button>
        {open.length > 0 ? <span className="self-center text-xs text-iron-400">Pick a side for each value above first.</span> : null}
      </div>
    </section>
  );
}
