// The selected preset's own settings (name, font, duplicate, delete) and the list of every
// check, which also carries the ones no control on screen shows (other presets, rig, fonts).
import { hasErrors, type Diagnostic } from "~/lib/checks/diagnostics";
import type { Config } from "~/lib/config/schema";
import { presetPath } from "~/lib/looks/diagnostic-index";
import type { EditorAction } from "~/lib/looks/editor-state";
import { ChoiceInput, DiagnosticList, EditorContext } from "./controls";

export function PresetSettings({ config, presetIndex, dispatch }: { config: Config; presetIndex: number; dispatch: (a: EditorAction) => void }) {
  const preset = config.presets[presetIndex];
  return (
    <EditorContext.Consumer>
      {({ checks, readOnly, onePreset }) => (
        <section className="card space-y-3" aria-label={`Preset ${preset.name}`}>
          <div className="grid items-start gap-3 sm:grid-cols-[minmax(0,1fr)_minmax(0,1fr)_auto]">
            <div data-path={presetPath(presetIndex, "name")}>
              <label className="label" htmlFor="preset-name">
                Preset name
              </label>
              <input
                id="preset-name"
                className="field"
                value={preset.name}
                readOnly={readOnly}
                maxLength={80}
                aria-invalid={checks.at(presetPath(presetIndex, "name")).some((d) => d.severity === "error") || undefined}
                onChange={(e) => dispatch({ type: "preset/rename", presetId: preset.id, name: e.currentTarget.value })}
              />
              <DiagnosticList items={checks.at(presetPath(presetIndex, "name"))} />
            </div>
            <ChoiceInput
              label="Font"
              value={preset.fontId}
              path={presetPath(presetIndex, "fontId")}
              options={config.fonts.map((f) => f.id)}
              labels={Object.fromEntries(config.fonts.map((f) => [f.id, `${f.name}${f.status === "received" ? "" : ` (${f.status})`}`]))}
              onChange={(fontId) => dispatch({ type: "preset/font", presetId: preset.id, fontId })}
            />
            {readOnly || onePreset ? null : (
              <div className="flex gap-2 sm:pt-5">
                <button type="button" className="btn" onClick={() => dispatch({ type: "preset/duplicate", presetId: preset.id })}>
                  Duplicate
                </button>
                <button type="button" className="btn btn-danger" onClick={() => dispatch({ type: "preset/delete", presetId: preset.id })}>
                  Delete preset
                </button>
              </div>
            )}
          </div>
          <DiagnosticList items={checks.at(presetPath(presetIndex))} />
        </section>
      )}
    </EditorContext.Consumer>
  );
}

/** Diagnostics no control on screen shows: other presets, the rig, fonts and controls. */
export function OtherChecks({ diagnostics, config, dispatch }: { diagnostics: readonly Diagnostic[]; config: Config; dispatch: (a: EditorAction) => void }) {
  if (diagnostics.length === 0) return null;
  const where = (path: string) => {
    const m = /^presets\[(\d+)\]/.exec(path);
    const p = m ? config.presets[Number(m[1])] : undefined;
    return p ? { label: p.name, id: p.id } : null;
  };
  return (
    <section className="card space-y-2" aria-labelledby="all-checks">
      <h2 id="all-checks" className="text-lg">
        All checks {hasErrors(diagnostics) ? <span className="text-sm text-signal-error">(errors block saving)</span> : null}
      </h2>
      <ul className="max-h-80 space-y-2 overflow-auto text-xs">
        {diagnostics.map((d, i) => {
          const p = where(d.path);
          return (
            <li key={i} className={d.severity === "error" ? "text-signal-error" : d.severity === "warning" ? "text-signal-warning" : "text-signal-info"}>
              {p ? (
                <button type="button" className="mr-1 underline" onClick={() => dispatch({ type: "preset/select", presetId: p.id })}>
                  {p.label}
                </button>
              ) : null}
              {d.message} <span className="block font-mono text-iron-400">{d.path || "(whole config)"}</span>
            </li>
          );
        })}
      </ul>
    </section>
  );
}
