// The font report: which cues a font's files provide (through a layout), how many variants each
// has, the total size and length, and what is unusual about the files. 44.1 kHz, 16-bit mono is
// the usual target for prop sound boards (common practice); other formats are warnings, not errors.
import { CUES, type Cue } from "../config/schema";
import type { WavReport } from "../audio/riff";
import type { CompiledLayout } from "./layout";

export type FontFinding = { severity: "error" | "warning" | "info"; code: string; path: string; message: string };
export type FontFileInput = { path: string; size: number; wav: WavReport };
export type FontFileRow = {
  path: string;
  size: number;
  cue: Cue | null;
  durationMs: number;
  /** "44.1 kHz · 16-bit · mono" */
  format: string;
  peakDbfs: number | null;
  clippedSamples: number;
};
export type FontReport = {
  layout: string;
  files: FontFileRow[];
  cues: Record<Cue, { variants: number; totalMs: number; files: string[] }>;
  present: Cue[];
  missing: Cue[];
  totalBytes: number;
  totalMs: number;
  /** Length of the first ignite and retract sound (what a wipe should be timed to). */
  igniteMs: number | null;
  retractMs: number | null;
  findings: FontFinding[];
  status: "received" | "invalid";
};

/** Common practice for prop sound boards, not a standard. */
export const USUAL_FORMAT = { sampleRate: 44100, bitsPerSample: 16, channels: 1 } as const;
const NEEDED: Cue[] = ["hum"];
const EXPECTED: Cue[] = ["ignite", "retract", "swing", "clash"];

export function describeFormat(w: WavReport): string {
  const f = w.format;
  if (!f) return "unknown";
  const rate = `${(f.sampleRate / 1000).toLocaleString("en", { maximumFractionDigits: 3 })} kHz`;
  const depth = f.encoding === "float" ? `${f.bitsPerSample}-bit float` : `${f.bitsPerSample}-bit`;
  const ch = f.channels === 1 ? "mono" : f.channels === 2 ? "stereo" : `${f.channels} channels`;
  return `${rate} · ${depth} · ${ch}`;
}

export function fontReport(files: FontFileInput[], layout: CompiledLayout): FontReport {
  const findings: FontFinding[] = [];
  const cues = Object.fromEntries(CUES.map((c) => [c, { variants: 0, totalMs: 0, files: [] as string[] }])) as FontReport["cues"];
  const rows: FontFileRow[] = [];
  const formats = new Map<string, number>();
  let totalBytes = 0;
  let totalMs = 0;
  const sorted = [...files].sort((a, b) => (a.path < b.path ? -1 : a.path > b.path ? 1 : 0));
  for (const file of sorted) {
    const w = file.wav;
    const cue = layout.match(file.path);
    totalBytes += file.size;
    totalMs += w.durationMs;
    for (const f of w.findings) findings.push({ severity: f.severity, code: f.code, path: file.path, message: f.message });
    if (cue) {
      cues[cue].variants++;
      cues[cue].totalMs += w.durationMs;
      cues[cue].files.push(file.path);
    } else findings.push({ severity: "warning", code: "unmatched-file", path: file.path, message: `No pattern of the "${layout.name}" layout matches this file, so no cue plays it.` });
    const fmt = describeFormat(w);
    rows.push({ path: file.path, size: file.size, cue, durationMs: w.durationMs, format: fmt, peakDbfs: w.peakDbfs, clippedSamples: w.clippedSamples });
    formats.set(fmt, (formats.get(fmt) ?? 0) + 1);
    if (w.format && w.ok) formatFindings(file.path, w, findings);
  }
  if (formats.size > 1)
    findings.push({ severity: "warning", code: "mixed-formats", path: "", message: `The files come in ${formats.size} formats (${[...formats.keys()].join("; ")}); many boards expect one format per font (common practice).` });
  const present = CUES.filter((c) => cues[c].variants > 0);
  const missing = CUES.filter((c) => cues[c].variants === 0);
  for (const c of missing) {
    if (NEEDED.includes(c)) findings.push({ severity: "error", code: "no-hum", path: "", message: "The font has no hum sound; a lit blade would be silent. A font needs at least one hum file." });
    else if (EXPECTED.includes(c)) findings.push({ severity: "warning", code: "missing-cue", path: "", message: `The font has no ${c} sound.` });
    else findings.push({ severity: "info", code: "missing-cue", path: "", message: `The font has no ${c} sound.` });
  }
  if (files.length === 0) findings.push({ severity: "error", code: "no-files", path: "", message: "The font has no WAV files." });
  const first = (c: Cue) => {
    const p = cues[c].files[0];
    return p ? (rows.find((r) => r.path === p)?.durationMs ?? null) : null;
  };
  return {
    layout: layout.name,
    files: rows,
    cues,
    present,
    missing,
    totalBytes,
    totalMs,
    igniteMs: first("ignite"),
    retractMs: first("retract"),
    findings,
    status: findings.some((f) => f.severity === "error") ? "invalid" : "received",
  };
}

function formatFindings(path: string, w: WavReport, out: FontFinding[]) {
  const f = w.format!;
  const cp = "(44.1 kHz, 16-bit mono is the usual target; common practice)";
  if (f.sampleRate !== USUAL_FORMAT.sampleRate) out.push({ severity: "warning", code: "unusual-sample-rate", path, message: `Sample rate ${f.sampleRate} Hz ${cp}.` });
  if (f.bitsPerSample !== USUAL_FORMAT.bitsPerSample || f.encoding !== "pcm") out.push({ severity: "warning", code: "unusual-bit-depth", path, message: `${f.bitsPerSample}-bit ${f.encoding === "float" ? "float" : "PCM"} samples ${cp}.` });
  if (f.channels !== USUAL_FORMAT.channels) out.push({ severity: "warning", code: "not-mono", path, message: `${f.channels} channels ${cp}.` });
  if (w.clippedSamples > 0) out.push({ severity: "warning", code: "clipping", path, message: `${w.clippedSamples.toLocaleString("en")} sample(s) sit at full scale; the sound is probably clipped.` });
  if (w.frames > 0 && w.peak === 0) out.push({ severity: "warning", code: "silent", path, message: "The file is completely silent." });
  if (w.frames === 0) out.push({ severity: "warning", code: "no-samples", path, message: "The file holds no samples." });
}
