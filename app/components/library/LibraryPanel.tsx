// The library on a build's Looks page: "update available" for presets that came from an older
// library version (the changes in words, collisions to pick, apply), "Add from library", and
// "Save to library" for each of the build's presets. Plain forms: they work without script.
import { Form, Link, useNavigation } from "react-router";
import type { Change } from "~/lib/model-diff";
import type { Conflict } from "~/lib/model-diff/merge";
import { ModelChanges } from "../revisions/ModelChanges";
import { RefusalAlert } from "./RefusalAlert";

type Update = { presetId: string; presetName: string; libraryPresetId: string; libraryName: string; from: number; to: number; changes: Change[]; conflicts: Conflict[]; notes: { text: string }[] };
type Origin = { presetId: string; libraryPresetId: string; libraryName: string; version: number; latest: number };
type LibraryEntry = { id: string; name: string; latest: number | null; versions: number[] };
export type Answer = { intent?: string; error?: string; ok?: string; notes?: string[]; diagnostics?: { path: string; message: string }[] } | undefined;

export function LibraryPanel(props: {
  version: number;
  presets: { id: string; name: string }[];
  fonts: { id: string; name: string }[];
  origins: Origin[];
  updates: Update[];
  library: LibraryEntry[];
  canApply: boolean;
  canPublish: boolean;
  answer: Answer;
}) {
  const { version, presets, fonts, origins, updates, library, canApply, canPublish, answer } = props;
  const busy = useNavigation().state === "submitting";
  const originOf = (id: string) => origins.find((o) => o.presetId === id);
  return (
    <section className="card space-y-4" aria-labelledby="library-h" data-testid="library-panel">
      <div className="flex flex-wrap items-baseline gap-3">
        <h2 id="library-h">Preset library</h2>
        <Link to="/library">Open the library</Link>
      </div>
      {answer?.ok ? (
        <div role="status" className="rounded-md border border-signal-ok/50 px-3 py-2 text-sm" data-testid="library-ok">
          <p>{answer.ok}</p>
          {answer.notes?.length ? (
            <ul className="mt-1 list-disc pl-5 text-iron-300" data-testid="library-notes">
              {answer.notes.map((n) => (
                <li key={n}>{n}</li>
              ))}
            </ul>
          ) : null}
        </div>
      ) : null}
      {answer?.error ? <RefusalAlert error={answer.error} diagnostics={answer.diagnostics} limit={10} testId="library-error" /> : null}

      {updates.map((u) => (
        <div key={u.presetId} className="space-y-2 rounded-md border border-signal-warning p-3" data-testid="update-available">
          <h3 className="text-base">
            Update available: {u.presetName} — {u.libraryName} v{u.from} → v{u.to}
          </h3>
          <p className="text-sm text-iron-300">What the library changed since this build's version:</p>
          <ModelChanges changes={u.changes} testId="library-changes" empty="Nothing in the looks of this rig." />
          {canApply ? (
            <Form method="post" className="space-y-2">
              <input type="hidden" name="intent" value="apply-update" />
              <input type="hidden" name="presetId" value={u.presetId} />
              <input type="hidden" name="configVersion" value={version} />
              {u.conflicts.length > 0 ? (
                <div className="space-y-2" data-testid="update-conflicts">
                  <p className="text-sm">The library and this build changed the same {u.conflicts.length === 1 ? "value" : "values"}: pick which to keep.</p>
                  {u.conflicts.map((c) => (
                    <fieldset key={c.path} className="rounded-md border border-soot-700 p-2 text-sm">
                      <legend className="px-1">{c.text}</legend>
                      <label className="mr-4 inline-flex items-center gap-2">
                        <input type="radio" name={`choice:${c.path}`} value="mine" required />
                        This build's: <code>{c.mine}</code>
                      </label>
                      <label className="inline-flex items-center gap-2">
                        <input type="radio" name={`choice:${c.path}`} value="theirs" />
                        The library's: <code>{c.theirs}</code>
                      </label>
                    </fieldset>
                  ))}
                </div>
              ) : (
                <p className="text-sm text-iron-300">No collisions with this build's own changes: they merge on their own.</p>
              )}
              <button type="submit" className="btn btn-primary" disabled={busy}>
                Apply v{u.to} to {u.presetName}
              </button>
            </Form>
          ) : null}
        </div>
      ))}

      {canApply && library.length > 0 ? (
        <Form method="post" className="flex flex-wrap items-end gap-3" aria-labelledby="add-lib-h">
          <h3 id="add-lib-h" className="w-full text-base">
            Add from library
          </h3>
          <input type="hidden" name="intent" value="add-from-library" />
          <input type="hidden" name="configVersion" value={version} />
          <div>
            <label className="label" htmlFor="lib-preset">
              Library preset and version
            </label>
            <select id="lib-preset" name="choice" className="field w-72" required>
              {library.map((p) => (
                <optgroup key={p.id} label={p.name}>
                  <option value={`${p.id}@latest`}>
                    {p.name}, latest (v{p.latest})
                  </option>
                  {p.versions.slice(1).map((n) => (
                    <option key={n} value={`${p.id}@${n}`}>
                      {p.name}, v{n}
                    </option>
                  ))}
                </optgroup>
              ))}
            </select>
          </div>
          <div>
            <label className="label" htmlFor="lib-font">
              Font
            </label>
            <select id="lib-font" name="fontId" className="field w-48" required>
              {fonts.map((f) => (
                <option key={f.id} value={f.id}>
                  {f.name}
                </option>
              ))}
            </select>
          </div>
          <button type="submit" className="btn btn-primary" disabled={busy}>
            Add to this build
          </button>
        </Form>
      ) : null}

      <table className="table">
        <caption className="sr-only">The build's presets and where they came from</caption>
        <thead>
          <tr>
            <th scope="col">Preset</th>
            <th scope="col">From the library</th>
            {canPublish ? <th scope="col">Save to library</th> : null}
          </tr>
        </thead>
        <tbody>
          {presets.map((p) => {
            const o = originOf(p.id);
            return (
              <tr key={p.id} data-testid={`preset-origin-${p.id}`}>
                <td>{p.name}</td>
                <td>
                  {o ? (
                    <>
                      <Link to={`/library/${o.libraryPresetId}`}>{o.libraryName}</Link> v{o.version}
                      {o.latest > o.version ? <span className="ml-2 text-signal-warning">update available (v{o.latest})</span> : null}
                    </>
                  ) : (
                    <span className="text-iron-400">—</span>
                  )}
                </td>
                {canPublish ? (
                  <td>
                    <details>
                      <summary className="cursor-pointer">Save {p.name} to library…</summary>
                      <Form method="post" className="mt-2 grid max-w-md gap-2">
                        <input type="hidden" name="intent" value="save-to-library" />
                        <input type="hidden" name="presetId" value={p.id} />
                        {o ? (
                          <fieldset className="text-sm">
                            <legend className="label">Publish as</legend>
                            <label className="mr-4 inline-flex items-center gap-2">
                              <input type="radio" name="libraryPresetId" value={o.libraryPresetId} defaultChecked />
                              version {o.latest + 1} of {o.libraryName}
                            </label>
                            <label className="inline-flex items-center gap-2">
                              <input type="radio" name="libraryPresetId" value="" />a new library preset
                            </label>
                            <input type="hidden" name="baseVersion" value={o.latest} />
                          </fieldset>
                        ) : (
                          <input type="hidden" name="libraryPresetId" value="" />
                        )}
                        <label className="label" htmlFor={`save-name-${p.id}`}>
                          Name in the library
                        </label>
                        <input id={`save-name-${p.id}`} name="name" className="field" defaultValue={o?.libraryName ?? p.name} maxLength={60} required />
                        <label className="label" htmlFor={`save-tags-${p.id}`}>
                          Tags (comma-separated)
                        </label>
                        <input id={`save-tags-${p.id}`} name="tags" className="field" maxLength={600} />
                        <label className="label" htmlFor={`save-log-${p.id}`}>
                          Changelog (one line)
                        </label>
                        <input id={`save-log-${p.id}`} name="changelog" className="field" maxLength={200} required />
                        <button type="submit" className="btn btn-primary justify-self-start" disabled={busy}>
                          Publish to library
                        </button>
                      </Form>
                    </details>
                  </td>
                ) : null}
              </tr>
            );
          })}
        </tbody>
      </table>
    </section>
  );
}
