// A font's report: cues present and missing with their variants, totals, findings, and each
// file with its format and a player for the file itself.
import type { FontReport } from "~/lib/fonts/report";

const SEVERITY_CLASS = { error: "text-signal-error", warning: "text-signal-warning", info: "text-signal-info" } as const;

export type ReportFile = { path: string; sha256: string; size: number; cue: string | null; durationMs: number; format: string; peakDbfs: number | null; clippedSamples: number };

const kb = (n: number) => (n >= 1048576 ? `${(n / 1048576).toFixed(1)} MB` : `${Math.max(1, Math.round(n / 1024))} KB`);
const secs = (ms: number) => `${(ms / 1000).toFixed(ms < 10000 ? 2 : 1)} s`;

export function FontReportView({ buildId, report, files }: { buildId: string; report: FontReport & { ignored?: string[] }; files: ReportFile[] }) {
  return (
    <div className="mt-3 space-y-3 text-sm">
      <p className="text-iron-300">
        {files.length} file{files.length === 1 ? "" : "s"} · {kb(report.totalBytes)} · {secs(report.totalMs)} of sound · layout “{report.layout}”
      </p>
      <div className="flex flex-wrap gap-1.5" aria-label="Cues">
        {Object.entries(report.cues).map(([cue, c]) => (
          <span key={cue} className={`rounded px-2 py-0.5 text-xs ${c.variants > 0 ? "bg-soot-600 text-iron-100" : "bg-soot-800 text-iron-400 line-through"}`} data-testid={`cue-${cue}`}>
            {cue}
            {c.variants > 1 ? ` ×${c.variants}` : ""}
          </span>
        ))}
      </div>
      {report.missing.length ? <p className="text-iron-400">Missing: {report.missing.join(", ")}</p> : null}
      {report.findings.length ? (
        <ul className="space-y-1" aria-label="Findings">
          {report.findings.map((f, i) => (
            <li key={i} className={SEVERITY_CLASS[f.severity]}>
              {f.path ? <code className="mr-1 text-iron-300">{f.path}</code> : null}
              {f.message}
            </li>
          ))}
        </ul>
      ) : null}
      {report.ignored?.length ? <p className="text-iron-400">Not sound files, left out: {report.ignored.join(", ")}</p> : null}
      <table className="table">
        <thead>
          <tr>
            <th>File</th>
            <th>Cue</th>
            <th>Length</th>
            <th>Format</th>
            <th>Peak</th>
            <th>Listen</th>
          </tr>
        </thead>
        <tbody>
          {files.map((f) => (
            <tr key={f.path}>
              <td>
                <code>{f.path}</code>
              </td>
              <td>{f.cue ?? <span className="text-signal-warning">none</span>}</td>
              <td className="tabular-nums">{secs(f.durationMs)}</td>
              <td>{f.format}</td>
              <td className="tabular-nums">
                {f.peakDbfs === null ? "silent" : `${f.peakDbfs.toFixed(1)} dBFS`}
                {f.clippedSamples > 0 ? <span className="text-signal-warning"> · {f.clippedSamples} clipped</span> : null}
              </td>
              <td>
                <audio controls preload="none" src={`/builds/${buildId}/fonts/audio/${f.sha256}`} aria-label={`Play ${f.path}`} className="h-8" />
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
