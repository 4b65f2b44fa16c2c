// The last section of a template's page: delete it, after typing its name. While builds or
// other templates depend on it, the section says which instead of offering the button; the
// server checks again (409) in case something changed since the page was loaded.
import { useState } from "react";
import { Link, useFetcher } from "react-router";
import type { TemplateDependents } from "~/lib/repo/templates.server";

export type DeleteAnswer = { intent: "delete"; ok: false; message: string; dependents?: TemplateDependents };

function DependentList({ d }: { d: TemplateDependents }) {
  return (
    <ul className="mt-2 list-disc space-y-1 pl-6 text-sm" data-testid="template-dependents">
      {d.pinnedBy.map((b) => (
        <li key={`pin-${b.id}`}>
          Build <Link to={`/builds/${b.id}/render`}>{b.name}</Link>
          {b.archived ? " (archived)" : ""} is pinned to version {b.version}.
        </li>
      ))}
      {d.usedBy.map((t) => (
        <li key={`use-${t.id}`}>
          Template <Link to={`/templates/${t.id}`}>{t.name}</Link> uses it as a partial.
        </li>
      ))}
      {d.usedThroughPins.map((b) => (
        <li key={`via-${b.id}`}>
          Build <Link to={`/builds/${b.id}/render`}>{b.name}</Link> is pinned to {b.template} version {b.version}, which uses it.
        </li>
      ))}
    </ul>
  );
}

export function DeleteTemplate({ name, versions, dependents }: { name: string; versions: number; dependents: TemplateDependents }) {
  const del = useFetcher<DeleteAnswer>();
  const [open, setOpen] = useState(false);
  const [typed, setTyped] = useState("");
  const blocked = dependents.pinnedBy.length + dependents.usedBy.length + dependents.usedThroughPins.length > 0;
  const answer = del.data;
  return (
    <section aria-labelledby="delete-h" className="card border-signal-error/40">
      <h2 id="delete-h" className="text-base">
        Delete this template
      </h2>
      {blocked ? (
        <>
          <p className="mt-1 text-sm text-iron-300">It cannot be deleted while something depends on it:</p>
          <DependentList d={dependents} />
          <p className="mt-2 text-sm text-iron-400">Move those builds to another template on their Render view, or change those templates, first.</p>
        </>
      ) : !open ? (
        <div className="mt-2 flex flex-wrap items-center gap-3">
          <p className="text-sm text-iron-300">
            Removes {name} and all {versions} {versions === 1 ? "version" : "versions"}. No build uses it.
          </p>
          <button type="button" className="btn btn-danger" onClick={() => setOpen(true)}>
            Delete template…
          </button>
        </div>
      ) : (
        <del.Form method="post" className="mt-2 space-y-2">
          <input type="hidden" name="intent" value="delete" />
          <label className="label" htmlFor="delete-confirm">
            Type <span className="font-mono normal-case text-iron-100">{name}</span> to confirm
          </label>
          <div className="flex flex-wrap items-center gap-3">
            <input
              id="delete-confirm"
              name="confirm"
              className="field w-64 font-mono"
              autoComplete="off"
              autoFocus
              value={typed}
              onChange={(e) => setTyped(e.target.value)}
            />
            <button type="submit" className="btn btn-danger" disabled={typed !== name || del.state !== "idle"}>
              Delete {name} and its {versions} {versions === 1 ? "version" : "versions"}
            </button>
            <button
              type="button"
              className="btn"
              onClick={() => {
                setOpen(false);
                setTyped("");
              }}
            >
              Cancel
            </button>
          </div>
        </del.Form>
      )}
      {answer && !answer.ok ? (
        <div role="alert" className="mt-3 text-sm text-signal-error" data-testid="delete-error">
          <p>{answer.message}</p>
          {answer.dependents ? <DependentList d={answer.dependents} /> : null}
        </div>
      ) : null}
    </section>
  );
}
