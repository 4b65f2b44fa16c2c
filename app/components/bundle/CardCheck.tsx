// Check a card against its bundle: the card's files (a folder, files, or a zip) are read and
// hashed here with Web Crypto (SHA-256) and compared with the manifest; nothing is uploaded.
import { useState } from "react";
import { cardRelative, compareCard, formatBytes, needsHash, type CardCheck as Result, type ExpectedFile, type FoundFile } from "~/lib/bundle/card-check";
import { blobReader, readCardZip } from "~/lib/bundle/card-zip";
import { DropZone } from "~/components/DropZone";

type Candidate = { path: string; size: number; bytes: () => Promise<ArrayBuffer | Uint8Array<ArrayBuffer>> };
type State = { kind: "idle" } | { kind: "reading"; done: number; total: number } | { kind: "done"; result: Result; source: string } | { kind: "failed"; message: string };

/** More entries than any card bundle has: a zip past this is refused before it is read. */
const MAX_ENTRIES = 20_000;

async function sha256(buf: ArrayBuffer | Uint8Array<ArrayBuffer>): Promise<string> {
  const d = await crypto.subtle.digest("SHA-256", buf);
  return [...new Uint8Array(d)].map((b) => b.toString(16).padStart(2, "0")).join("");
}

/** A zip is read lazily (card-zip.ts): its table of contents now, each file only when its hash is wanted. */
async function fromZip(file: File): Promise<Candidate[]> {
  const entries = await readCardZip(file.size, blobReader(file), { maxEntries: MAX_ENTRIES });
  return entries.map((e) => ({ path: e.path, size: e.size, bytes: e.bytes }));
}

/** Files dropped as folders: walk them (the File System entries API that drag and drop gives). */
async function fromEntry(entry: FileSystemEntry, prefix: string, out: Candidate[]): Promise<void> {
  if (entry.isFile) {
    const file = await new Promise<File>((res, rej) => (entry as FileSystemFileEntry).file(res, rej));
    out.push({ path: prefix + file.name, size: file.size, bytes: () => file.arrayBuffer() });
    return;
  }
  const reader = (entry as FileSystemDirectoryEntry).createReader();
  for (;;) {
    const batch = await new Promise<FileSystemEntry[]>((res, rej) => reader.readEntries(res, rej));
    if (batch.length === 0) break;
    for (const child of batch) await fromEntry(child, `${prefix}${entry.name}/`, out);
  }
}

async function fromFiles(files: File[]): Promise<{ list: Candidate[]; source: string }> {
  if (files.length === 1 && /\.zip$/i.test(files[0].name)) return { list: await fromZip(files[0]), source: files[0].name };
  const list = files.map((f) => ({ path: f.webkitRelativePath || f.name, size: f.size, bytes: () => f.arrayBuffer() }));
  return { list, source: `${files.length} file${files.length === 1 ? "" : "s"}` };
}

export function CardCheck({ expected }: { expected: ExpectedFile[] }) {
  const [state, setState] = useState<State>({ kind: "idle" });

  async function check(load: () => Promise<{ list: Candidate[]; source: string }>) {
    try {
      setState({ kind: "reading", done: 0, total: 0 });
      const { list, source } = await load();
      const rel = cardRelative(
        list.map((c) => c.path),
        expected.map((e) => e.path),
      );
      const found: FoundFile[] = [];
      let done = 0;
      for (const c of list) {
        const path = rel(c.path);
        found.push({ path, size: c.size, sha256: needsHash(expected, path, c.size) ? await sha256(await c.bytes()) : null });
        setState({ kind: "reading", done: ++done, total: list.length });
      }
      setState({ kind: "done", result: compareCard(expected, found), source });
    } catch (e) {
      setState({ kind: "failed", message: e instanceof Error ? `Could not read the card's files: ${e.message}` : "Could not read the card's files." });
    }
  }

  const busy = state.kind === "reading";
  return (
    <div className="space-y-4">
      <DropZone
        busy={busy}
        testId="card-drop"
        onDrop={(data) => {
          const entries = [...data.items].map((i) => i.webkitGetAsEntry?.()).filter((x): x is FileSystemEntry => !!x);
          const files = [...data.files];
          if (entries.some((x) => x.isDirectory))
            check(async () => {
              const out: Candidate[] = [];
              for (const x of entries) await fromEntry(x, "", out);
              return { list: out, source: "the dropped folder" };
            });
          else check(() => fromFiles(files));
        }}
      >
        <p>Drop the card's folder, its files or a zip of them here, or choose them:</p>
        <div className="mt-2 flex flex-wrap items-center gap-2">
          <label className="btn" aria-disabled={busy}>
            Choose the card's folder…
            <input
              type="file"
              className="sr-only"
              aria-label="The card's folder"
              disabled={busy}
              // Folder choice: every file below it, with its path.
              {...({ webkitdirectory: "", directory: "" } as Record<string, string>)}
              onChange={(e) => {
                const files = [...(e.target.files ?? [])];
                e.target.value = "";
                if (files.length) check(() => fromFiles(files));
              }}
            />
          </label>
          <label className="btn" aria-disabled={busy}>
            Choose files or a zip…
            <input
              type="file"
              multiple
              className="sr-only"
              aria-label="The card's files or a zip of them"
              disabled={busy}
              onChange={(e) => {
                const files = [...(e.target.files ?? [])];
                e.target.value = "";
                if (files.length) check(() => fromFiles(files));
              }}
            />
          </label>
        </div>
        <p className="mt-2 text-xs text-iron-400">Files chosen one by one are matched at the card's top level; choose the folder or a zip to check the font folders too. Nothing leaves this computer.</p>
      </DropZone>
      {busy ? (
        <div className="flex items-center gap-3">
          <progress className="h-2 flex-1" max={Math.max(1, state.total)} value={state.done} aria-label="Reading the card's files" />
          <span className="text-xs tabular-nums">
            {state.done} of {state.total || "…"} files
          </span>
        </div>
      ) : null}
      {state.kind === "failed" ? (
        <p role="alert" className="text-sm text-signal-error">
          {state.message}
        </p>
      ) : null}
      {state.kind === "done" ? <CheckResult result={state.result} source={state.source} /> : null}
    </div>
  );
}

function CheckResult({ result, source }: { result: Result; source: string }) {
  const { missing, extra, changed, same, ignored } = result;
  const good = missing.length === 0 && extra.length === 0 && changed.length === 0;
  return (
    <section aria-labelledby="card-result-h" className="card space-y-3" data-testid="card-result">
      <h3 id="card-result-h">What {source} holds</h3>
      <p role="status" className={good ? "text-signal-ok" : "text-signal-warning"} data-testid="card-verdict">
        {good
          ? `The card matches the bundle: all ${same.length} files are there and the same.`
          : `${missing.length} missing · ${extra.length} extra · ${changed.length} changed · ${same.length} the same`}
      </p>
      <PathList title="Missing" testId="card-missing" files={missing} />
      <PathList title="Extra (not in the bundle)" testId="card-extra" files={extra} />
      {changed.length ? (
        <div>
          <h4>Changed</h4>
          <ul className="text-sm" data-testid="card-changed">
            {changed.map((c) => (
              <li key={c.path}>
                <span className="font-mono">{c.path}</span>{" "}
                <span className="text-iron-300">
                  {c.why === "size"
                    ? `is ${c.found.size.toLocaleString("en")} bytes; the bundle's is ${c.expected.size.toLocaleString("en")}`
                    : `has the same size but other content (SHA-256 ${c.found.sha256?.slice(0, 12) ?? "?"}…, the bundle's ${c.expected.sha256.slice(0, 12)}…)`}
                </span>
              </li>
            ))}
          </ul>
        </div>
      ) : null}
      {ignored.length ? <p className="text-xs text-iron-400">Left out: {ignored.length} file(s) computers add to cards by themselves.</p> : null}
    </section>
  );
}

/** Files by path and size under a heading; nothing when there are none. */
function PathList({ title, testId, files }: { title: string; testId: string; files: { path: string; size: number }[] }) {
  if (!files.length) return null;
  return (
    <div>
      <h4>{title}</h4>
      <ul className="font-mono text-sm" data-testid={testId}>
        {files.map((m) => (
          <li key={m.path}>
            {m.path} <span className="text-iron-400">({formatBytes(m.size)})</span>
          </li>
        ))}
      </ul>
    </div>
  );
}
