// A pasted header read back and checked, as the Render view shows it before anything is stored:
// the read errors (with line and column), else the validator's warnings and errors and a
// one-line summary of what was read.
import type { Config } from "../config/schema";
import { validateConfig, type Diagnostic } from "../checks/validate";
import { readHeader, type ReadError } from "./readback";

export type HeaderCheck = { config: Config | null; errors: ReadError[]; diagnostics: Diagnostic[]; summary: string | null };

/** "3 channels, 1 preset, 2 fonts". */
export function summarize(config: { rig: { channels: unknown[] }; presets: unknown[]; fonts: unknown[] }): string {
  const n = (k: number, w: string) => `${k} ${w}${k === 1 ? "" : "s"}`;
  return `${n(config.rig.channels.length, "channel")}, ${n(config.presets.length, "preset")}, ${n(config.fonts.length, "font")}`;
}

export function readAndCheck(text: string): HeaderCheck {
  const read = readHeader(text);
  if (!read.config || read.errors.length) return { config: null, errors: read.errors, diagnostics: [], summary: null };
  const checked = validateConfig(read.config);
  return { config: read.config, errors: [], diagnostics: checked.diagnostics.filter((d) => d.severity !== "info"), summary: summarize(read.config) };
}
