// A build's presets and looks in one screen: the preset list, the selected preset's settings, a
// live preview of every channel, one column per channel with its layer stack, and the power
// panel. State lives in the pure editor reducer; checks come from the server as edits settle.
import { useCallback, useEffect, useMemo, useReducer, useState } from "react";
import { useBlocker } from "react-router";
import type { Diagnostic } from "~/lib/checks/diagnostics";
import type { Config } from "~/lib/config/schema";
import { indexDiagnostics } from "~/lib/looks/diagnostic-index";
import { canRedo, canUndo, editorReducer, initEditor, isDirty, type EditorAction } from "~/lib/looks/editor-state";
import { diffModels } from "~/lib/model-diff";
import { MessageField } from "../revisions/MessageField";
import { ModelChanges } from "../revisions/ModelChanges";
import { ConflictPanel, type Stale } from "./ConflictPanel";
import { EditorContext } from "./controls";
import { LivePreview } from "./LivePreview";
import { LookColumn } from "./LookColumn";
import { PowerPanel } from "./PowerPanel";
import { PresetList } from "./PresetList";
import { OtherChecks, PresetSettings } from "./PresetSettings";
import { useLiveChecks } from "./useLiveChecks";

type SaveMessage = { tone: "ok" | "error" | "info"; text: string } | null;

/** Another place to save to (a library preset): answers like the config PUT, in short. */
export type SaveWith = (config: Config, note: string, version: number) => Promise<{ ok: true; version: number; text: string } | { ok: false; status: number; error?: string; diagnostics?: Diagnostic[] }>;

export function LookEditor({
  buildId,
  initial,
  version: initialVersion,
  canEdit,
  saveWith,
  onePreset = false,
}: {
  buildId: string;
  initial: Config;
  version: number;
  canEdit: boolean;
  /** Save somewhere else than the build's config (the library's stand-in rig); no pictures then. */
  saveWith?: SaveWith;
  /** The editor holds exactly one preset: adding, duplicating and deleting presets are not offered. */
  onePreset?: boolean;
}) {
  const [state, rawDispatch] = useReducer(editorReducer, initial, initEditor);
  const dispatch = useCallback((a: EditorAction) => rawDispatch(a), []);
  const [version, setVersion] = useState(initialVersion);
  const [saving, setSaving] = useState(false);
  const [message, setMessage] = useState<SaveMessage>(null);
  const [note, setNote] = useState("");
  const [stale, setStale] = useState<Stale | null>(null);
  const [showChanges, setShowChanges] = useState(false);
  const checks = useLiveChecks(state.config);
  const index = useMemo(() => indexDiagnostics(checks.diagnostics), [checks.diagnostics]);
  const dirty = isDirty(state);
  const readOnly = !canEdit;
  const context = useMemo(() => ({ checks: index, readOnly, onePreset }), [index, readOnly, onePreset]);

  const presetIndex = state.config.presets.findIndex((p) => p.id === state.selectedPresetId);
  const preset = presetIndex >= 0 ? state.config.presets[presetIndex] : undefined;

  async function save() {
    if (readOnly || saving) return;
    const errors = checks.diagnostics.filter((d) => d.severity === "error");
    if (errors.length > 0) {
      setMessage({ tone: "error", text: `Not saved: ${errors.length} error${errors.length > 1 ? "s" : ""} to fix first. ${errors[0].message}` });
      return;
    }
    const sent = state.config;
    setSaving(true);
    setMessage({ tone: "info", text: "Saving…" });
    try {
      if (saveWith) {
        const r = await saveWith(sent, note, version);
        if (r.ok) {
          setVersion(r.version);
          dispatch({ type: "saved", config: sent });
          setNote("");
          setMessage({ tone: "ok", text: r.text });
        } else if (r.status === 422 && r.diagnostics?.length) {
          checks.accept(sent, r.diagnostics);
          setMessage({ tone: "error", text: `Not saved: ${r.error ?? "the preset has errors"}` });
        } else setMessage({ tone: "error", text: `Not saved: ${r.error ?? `the server answered ${r.status}`}` });
        return;
      }
      const res = await fetch(`/api/builds/${buildId}/config`, {
        method: "PUT",
        headers: { "Content-Type": "application/json", Accept: "application/json" },
        body: JSON.stringify({ config: sent, version, ...(note.trim() ? { message: note } : {}) }),
      });
      const body = (await res.json().catch(() => null)) as { version?: number; diagnostics?: Diagnostic[]; error?: string } | null;
      if (res.ok && typeof body?.version === "number") {
        setVersion(body.version);
        dispatch({ type: "saved", config: sent });
        setNote("");
        setStale(null);
        setMessage({ tone: "ok", text: `Saved as revision ${body.version}.` });
      } else if (res.status === 422 && Array.isArray(body?.diagnostics)) {
        checks.accept(sent, body.diagnostics);
        const errs = body.diagnostics.filter((d) => d.severity === "error");
        setMessage({ tone: "error", text: `Not saved: the config has ${errs.length} error${errs.length === 1 ? "" : "s"}. ${errs[0]?.message ?? ""}` });
      } else if (res.status === 409) {
        // Show what they changed and offer to merge: fetch what is stored now.
        const now = await fetch(`/api/builds/${buildId}/config`, { headers: { Accept: "application/json" } });
        const cur = (await now.json().catch(() => null)) as { config?: Config; version?: number } | null;
        if (now.ok && cur?.config && typeof cur.version === "number") {
          setStale({ base: state.saved, mine: sent, theirs: cur.config, version: cur.version });
          setMessage({ tone: "error", text: `Not saved: someone else saved this build after you opened it (it is now version ${cur.version}). Your edits are still here.` });
        } else {
          setMessage({ tone: "error", text: "Not saved: someone else saved this build after you opened it, and their version could not be read. Your edits are still here." });
        }
      } else {
        setMessage({ tone: "error", text: `Not saved: ${body?.error ?? `the server answered ${res.status}`}.` });
      }
    } catch (e) {
      setMessage({ tone: "error", text: `Not saved: the server could not be reached (${e instanceof Error ? e.message : String(e)}).` });
    } finally {
      setSaving(false);
    }
  }

  // Undo / redo / save from anywhere on the page.
  useEffect(() => {
    if (readOnly) return;
    const onKey = (e: KeyboardEvent) => {
      if (!(e.ctrlKey || e.metaKey) || e.altKey) return;
      const k = e.key.toLowerCase();
      if (k === "z") {
        e.preventDefault();
        dispatch({ type: e.shiftKey ? "redo" : "undo" });
      } else if (k === "y") {
        e.preventDefault();
        dispatch({ type: "redo" });
      } else if (k === "s") {
        e.preventDefault();
        document.getElementById("looks-save")?.click();
      }
    };
    window.addEventListener("keydown", onKey);
    return () => window.removeEventListener("keydown", onKey);
  }, [readOnly, dispatch]);

  // Leaving with unsaved edits: the browser's own prompt for reloads and closing the tab, ours
  // for links inside the app.
  useEffect(() => {
    if (!dirty) return;
    const onUnload = (e: BeforeUnloadEvent) => {
      e.preventDefault();
      e.returnValue = "";
    };
    window.addEventListener("beforeunload", onUnload);
    return () => window.removeEventListener("beforeunload", onUnload);
  }, [dirty]);
  const blocker = useBlocker(({ currentLocation, nextLocation }) => dirty && currentLocation.pathname !== nextLocation.pathname);

  const errors = checks.diagnostics.filter((d) => d.severity === "error").length;
  const warnings = checks.diagnostics.filter((d) => d.severity === "warning").length;

  return (
    <EditorContext.Provider value={context}>
      <div className="space-y-4">
        <div className="card sticky top-0 z-10 flex flex-wrap items-center gap-3 py-2" role="toolbar" aria-label="Editing">
          {readOnly ? (
            <p className="text-sm text-iron-300" data-testid="read-only">
              Read-only: your role can look at these presets but not change them.
            </p>
          ) : (
            <>
              <button type="button" className="btn" onClick={() => dispatch({ type: "undo" })} disabled={!canUndo(state)} aria-keyshortcuts="Control+Z">
                Undo
              </button>
              <button type="button" className="btn" onClick={() => dispatch({ type: "redo" })} disabled={!canRedo(state)} aria-keyshortcuts="Control+Shift+Z">
                Redo
              </button>
              <button id="looks-save" type="button" className="btn btn-primary" onClick={save} disabled={saving || !dirty} aria-keyshortcuts="Control+S">
                {saving ? "Saving…" : "Save"}
              </button>
              <MessageField id="looks-message" className="min-w-56" value={note} onChange={setNote} />
              <span className="text-xs text-iron-400">{dirty ? "Unsaved changes" : "All changes saved"} · version {version}</span>
              {dirty ? (
                <button type="button" className="text-xs text-iron-300 underline" aria-expanded={showChanges} onClick={() => setShowChanges((x) => !x)}>
                  {showChanges ? "Hide my changes" : "Show my changes"}
                </button>
              ) : null}
            </>
          )}
          <span className="ml-auto text-xs" aria-live="polite" data-testid="check-status">
            {checks.status === "checking" ? (
              <span className="text-iron-400">Checking…</span>
            ) : checks.status === "failed" ? (
              <span className="text-signal-warning">{checks.problem}</span>
            ) : errors + warnings === 0 ? (
              <span className="text-signal-ok">No problems found</span>
            ) : (
              <span className={errors ? "text-signal-error" : "text-signal-warning"}>
                {errors} error{errors === 1 ? "" : "s"}, {warnings} warning{warnings === 1 ? "" : "s"}
              </span>
            )}
          </span>
        </div>
        {message ? (
          <p role={message.tone === "error" ? "alert" : "status"} data-testid="save-message" className={message.tone === "ok" ? "text-signal-ok" : message.tone === "error" ? "text-signal-error" : "text-iron-300"}>
            {message.text}
          </p>
        ) : null}
        {showChanges && dirty ? (
          <section className="card" aria-label="Unsaved changes">
            <ModelChanges changes={diffModels(state.saved, state.config).changes} testId="unsaved-changes" />
          </section>
        ) : null}
        {stale ? (
          <ConflictPanel
            stale={stale}
            onCancel={() => setStale(null)}
            onReload={() => {
              dispatch({ type: "reset", config: stale.theirs });
              setVersion(stale.version);
              setStale(null);
              setMessage({ tone: "info", text: `Showing version ${stale.version}; your edits were dropped.` });
            }}
            onMerged={(merged) => {
              dispatch({ type: "rebase", base: stale.theirs, config: merged });
              setVersion(stale.version);
              setStale(null);
              setMessage({ tone: "info", text: `Your changes are on top of version ${stale.version}. Check them and save.` });
            }}
          />
        ) : null}
        {state.notice ? (
          <p role="status" className="flex items-center gap-3 text-sm text-iron-300">
            {state.notice.text}
            {state.notice.undoable ? (
              <button type="button" className="btn" onClick={() => dispatch({ type: "undo" })}>
                Undo
              </button>
            ) : null}
            <button type="button" className="text-xs text-iron-400 underline" onClick={() => dispatch({ type: "notice/dismiss" })}>
              Dismiss
            </button>
          </p>
        ) : null}
        {!checks.valid ? (
          <p className="text-sm text-signal-warning" role="status">
            Some values are not valid yet: the preview and the power figures show the last valid version until they are fixed.
          </p>
        ) : null}

        <div className="grid gap-4 lg:grid-cols-[16rem_minmax(0,1fr)]">
          <div className="space-y-4">
            <PresetList config={state.config} selectedId={state.selectedPresetId} checks={index} dispatch={dispatch} />
            <OtherChecks diagnostics={checks.diagnostics} config={state.config} dispatch={dispatch} />
          </div>
          <div className="min-w-0 space-y-4">
            {preset ? (
              <>
                <PresetSettings key={preset.id} config={state.config} presetIndex={presetIndex} dispatch={dispatch} />
                <LivePreview config={checks.lastValid} presetId={preset.id} />
                <div className="grid gap-4 xl:grid-cols-3">
                  {state.config.rig.channels.map((c) => (
                    <LookColumn
                      key={c.id}
                      config={state.config}
                      preset={preset}
                      presetIndex={presetIndex}
                      channel={c}
                      checks={index}
                      dispatch={dispatch}
                      pictureUrl={
                        !saveWith && state.saved.presets.some((p) => p.id === preset.id && p.looks[c.id])
                          ? `/api/builds/${buildId}/looks.png?preset=${encodeURIComponent(preset.id)}&channel=${encodeURIComponent(c.id)}&v=${version}`
                          : null
                      }
                    />
                  ))}
                </div>
                <PowerPanel config={checks.lastValid} presetId={preset.id} />
              </>
            ) : (
              <p className="card text-iron-300">{state.config.presets.length ? "Choose a preset." : "This build has no presets yet."}</p>
            )}
          </div>
        </div>
      </div>

      {blocker.state === "blocked" ? (
        <div role="alertdialog" aria-modal="true" aria-labelledby="leave-title" className="fixed inset-0 z-50 flex items-center justify-center bg-black/60 p-4">
          <div className="card max-w-md space-y-3">
            <h2 id="leave-title" className="text-lg">
              Leave without saving?
            </h2>
            <p className="text-sm text-iron-300">The looks have changes that are not saved. Leaving drops them.</p>
            <div className="flex gap-2">
              <button type="button" className="btn" autoFocus onClick={() => blocker.reset?.()}>
                Stay here
              </button>
              <button type="button" className="btn btn-danger" onClick={() => blocker.proceed?.()}>
                Leave and drop changes
              </button>
            </div>
          </div>
        </div>
      ) : null}
    </EditorContext.Provider>
  );
}
