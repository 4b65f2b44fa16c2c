// Drop or pick a font's WAV files or zips; they go up in one multipart request with a progress
// bar and a cancel button (XMLHttpRequest reports upload progress; fetch does not yet).
import { useRef, useState } from "react";
import { DropZone } from "~/components/DropZone";

type Answer = { error?: string; status?: string };
type State = { kind: "idle" } | { kind: "sending"; sent: number; total: number } | { kind: "done"; message: string; ok: boolean };

export function FontUpload({ buildId, fontId, fontName, layouts, onDone }: { buildId: string; fontId: string; fontName: string; layouts: string[]; onDone: () => void }) {
  const [state, setState] = useState<State>({ kind: "idle" });
  const [layout, setLayout] = useState(layouts[0] ?? "");
  const xhr = useRef<XMLHttpRequest | null>(null);
  const picker = useRef<HTMLInputElement>(null);

  function send(files: FileList | File[]) {
    const list = [...files];
    if (list.length === 0) return;
    const form = new FormData();
    form.append("layout", layout);
    for (const f of list) form.append("files", f, f.name);
    const req = new XMLHttpRequest();
    xhr.current = req;
    req.open("POST", `/api/builds/${buildId}/fonts/${fontId}/files`);
    req.responseType = "json";
    req.upload.onprogress = (e) => setState({ kind: "sending", sent: e.loaded, total: e.lengthComputable ? e.total : 0 });
    req.onload = () => {
      xhr.current = null;
      const body = (req.response ?? {}) as Answer;
      if (req.status >= 200 && req.status < 300) {
        setState({ kind: "done", ok: true, message: body.status === "invalid" ? "Stored, but the font failed its checks (see the report)." : "Stored and checked." });
        onDone();
      } else setState({ kind: "done", ok: false, message: body.error ?? `The upload was refused (${req.status}).` });
    };
    req.onerror = () => {
      xhr.current = null;
      setState({ kind: "done", ok: false, message: "The connection broke during the upload; nothing was stored." });
    };
    req.onabort = () => {
      xhr.current = null;
      setState({ kind: "done", ok: false, message: "Upload cancelled; nothing was stored." });
    };
    setState({ kind: "sending", sent: 0, total: list.reduce((n, f) => n + f.size, 0) });
    req.send(form);
  }

  const sending = state.kind === "sending";
  const pct = sending && state.total > 0 ? Math.min(100, Math.round((100 * state.sent) / state.total)) : 0;
  return (
    <div className="space-y-2">
      <DropZone busy={sending} testId={`drop-${fontId}`} onDrop={(data) => send(data.files)}>
        <p>Drop {fontName}'s WAV files or a zip here, or</p>
        <div className="mt-2 flex flex-wrap items-center gap-2">
          <label className="btn" aria-disabled={sending}>
            Choose files…
            <input
              ref={picker}
              type="file"
              multiple
              accept=".wav,.zip,audio/wav,application/zip"
              className="sr-only"
              aria-label={`Font files for ${fontName}`}
              disabled={sending}
              onChange={(e) => {
                if (e.target.files) send(e.target.files);
                e.target.value = "";
              }}
            />
          </label>
          {layouts.length > 1 ? (
            <label className="text-iron-400">
              Layout{" "}
              <select className="field w-auto" value={layout} onChange={(e) => setLayout(e.target.value)}>
                {layouts.map((l) => (
                  <option key={l}>{l}</option>
                ))}
              </select>
            </label>
          ) : null}
        </div>
      </DropZone>
      {sending ? (
        <div className="flex items-center gap-3">
          <progress className="h-2 flex-1" max={100} value={pct} aria-label={`Uploading ${fontName}`} />
          <span className="text-xs tabular-nums">{pct} %</span>
          <button type="button" className="btn" onClick={() => xhr.current?.abort()}>
            Cancel
          </button>
        </div>
      ) : null}
      {state.kind === "done" ? (
        <p role={state.ok ? "status" : "alert"} className={`text-sm ${state.ok ? "text-signal-ok" : "text-signal-error"}`}>
          {state.message}
        </p>
      ) : null}
    </div>
  );
}
