// The ordered preset list: select, add, duplicate, delete, and reorder by drag, by the move
// buttons or with Alt+↑ / Alt+↓ on a preset.
import { useContext } from "react";
import type { Config } from "~/lib/config/schema";
import type { EditorAction } from "~/lib/looks/editor-state";
import { presetPath, type DiagnosticIndex } from "~/lib/looks/diagnostic-index";
import { EditorContext } from "./controls";
import { dragProps, reorderKey } from "./reorder";

export function PresetList({ config, selectedId, checks, dispatch }: { config: Config; selectedId: string | null; checks: DiagnosticIndex; dispatch: (a: EditorAction) => void }) {
  const { readOnly, onePreset } = useContext(EditorContext);
  const presets = config.presets;
  const move = (from: number, to: number) => {
    const p = presets[from];
    if (!p) return;
    dispatch({ type: "preset/move", presetId: p.id, to });
    requestAnimationFrame(() => document.getElementById(`preset-${p.id}`)?.focus());
  };
  return (
    <nav aria-label="Presets" className="card space-y-3">
      <div className="flex items-center justify-between">
        <h2 className="text-lg">Presets</h2>
        {readOnly || onePreset ? null : (
          <button type="button" className="btn" onClick={() => dispatch({ type: "preset/add" })}>
            Add preset
          </button>
        )}
      </div>
      {presets.length === 0 ? <p className="text-sm text-iron-400">No presets yet.</p> : null}
      <ol className="space-y-1" aria-label="Preset order">
        {presets.map((p, i) => {
          const found = checks.under(presetPath(i));
          const errors = found.filter((d) => d.severity === "error").length;
          const selected = p.id === selectedId;
          const font = config.fonts.find((f) => f.id === p.fontId);
          return (
            <li
              key={p.id}
              data-testid="preset"
              data-preset-id={p.id}
              className={`flex items-center gap-1 rounded-md border ${selected ? "border-ember-500 bg-soot-800" : "border-transparent"}`}
              {...dragProps("preset", "presets", i, move, !readOnly)}
            >
              {readOnly ? null : (
                <span aria-hidden="true" className="cursor-grab select-none pl-1 text-iron-400" title="Drag to reorder">
                  ⋮⋮
                </span>
              )}
              <button
                type="button"
                id={`preset-${p.id}`}
                className="min-w-0 flex-1 px-2 py-1.5 text-left"
                aria-current={selected ? "true" : undefined}
                aria-keyshortcuts={readOnly ? undefined : "Alt+ArrowUp Alt+ArrowDown"}
                onClick={() => dispatch({ type: "preset/select", presetId: p.id })}
                onKeyDown={(e) => !readOnly && reorderKey(e, i, presets.length, move)}
              >
                <span className="block truncate text-sm font-medium">
                  <span className="text-iron-400 tabular-nums">{i + 1}.</span> {p.name}
                </span>
                <span className="block truncate text-xs text-iron-400">
                  {font ? font.name : `font “${p.fontId}” missing`}
                  {errors ? <span className="ml-2 text-signal-error">{errors} error{errors > 1 ? "s" : ""}</span> : found.length ? <span className="ml-2 text-signal-warning">{found.length} note{found.length > 1 ? "s" : ""}</span> : null}
                </span>
              </button>
              {readOnly ? null : (
                <span className="flex shrink-0 gap-0.5 pr-1">
                  <button type="button" className="btn px-1.5 py-0.5" aria-label={`Move ${p.name} up`} title="Move up (Alt+↑)" disabled={i === 0} onClick={() => move(i, i - 1)}>
                    ↑
                  </button>
                  <button type="button" className="btn px-1.5 py-0.5" aria-label={`Move ${p.name} down`} title="Move down (Alt+↓)" disabled={i === presets.length - 1} onClick={() => move(i, i + 1)}>
                    ↓
                  </button>
                </span>
              )}
            </li>
          );
        })}
      </ol>
      {onePreset ? (
        <p className="text-xs text-iron-400">A library preset is one preset: it is edited here alone, and other presets belong in a build.</p>
      ) : readOnly ? null : (
        <p className="text-xs text-iron-400">Reorder: drag, the arrows, or Alt+↑ / Alt+↓ on a preset.</p>
      )}
    </nav>
  );
}
