// Diagnostics by the control they concern. The validator names a value by its JSON path
// (presets[2].looks.chamber.layers[1].periodMs); the editor builds the same path for each control
// and asks here what to show beside it.
import { joinPath, keySegment, type Diagnostic, type PathSegment } from "~/lib/checks/diagnostics";

export function presetPath(presetIndex: number, field?: string): string {
  const base = `presets[${presetIndex}]`;
  return field ? joinPath(base, field) : base;
}

export function lookPath(presetIndex: number, channelId: string): string {
  return `${presetPath(presetIndex)}.looks${keySegment(channelId)}`;
}

export function layerPath(presetIndex: number, channelId: string, layerIndex: number, ...field: PathSegment[]): string {
  return joinPath(`${lookPath(presetIndex, channelId)}.layers[${layerIndex}]`, ...field);
}

export interface DiagnosticIndex {
  /** Diagnostics whose path is exactly `path`. */
  at(path: string): Diagnostic[];
  /** Diagnostics at `path` or anywhere inside it. */
  under(path: string): Diagnostic[];
  all: readonly Diagnostic[];
}

function inside(path: string, prefix: string): boolean {
  if (prefix === "") return true;
  if (!path.startsWith(prefix)) return false;
  const next = path[prefix.length];
  return next === undefined || next === "." || next === "[";
}

export function indexDiagnostics(list: readonly Diagnostic[]): DiagnosticIndex {
  const exact = new Map<string, Diagnostic[]>();
  for (const d of list) {
    const l = exact.get(d.path);
    if (l) l.push(d);
    else exact.set(d.path, [d]);
  }
  return {
    at: (path) => exact.get(path) ?? [],
    under: (path) => list.filter((d) => inside(d.path, path)),
    all: list,
  };
}

export const EMPTY_INDEX = indexDiagnostics([]);
