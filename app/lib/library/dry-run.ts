// Applying a newer library version to every build that uses the preset, as a dry run first: for
// each build's preset, would the three-way merge be clean, or does it need hands? Released builds
// are never changed (listed as such); builds already on the version are listed as current.
import type { Config } from "../config/schema";
import type { Conflict } from "../model-diff/merge";
import type { PresetBody } from "./format";
import { applyPlan, planUpdate } from "./update";

export type DryRunBuild = { id: string; name: string; status: string; config: Config; configVersion: number; presetId: string; version: number };
export type DryRunOutcome = "clean" | "conflicts" | "released" | "current" | "missing";
export type DryRunRow = { buildId: string; buildName: string; presetId: string; presetName: string; fromVersion: number; outcome: DryRunOutcome; conflicts: Conflict[] };

/** One build's outcome, with the config it would save for a clean merge. */
export function dryRunOne(b: DryRunBuild, bodies: ReadonlyMap<number, PresetBody>, target: number): DryRunRow & { next?: Config } {
  const preset = b.config.presets.find((p) => p.id === b.presetId);
  const row = { buildId: b.id, buildName: b.name, presetId: b.presetId, presetName: preset?.name ?? b.presetId, fromVersion: b.version, conflicts: [] as Conflict[] };
  if (b.status === "released") return { ...row, outcome: "released" };
  if (b.version >= target) return { ...row, outcome: "current" };
  const base = bodies.get(b.version);
  const next = bodies.get(target);
  if (!preset || !base || !next) return { ...row, outcome: "missing" };
  const plan = planUpdate(b.config, b.presetId, base, next);
  if (!plan) return { ...row, outcome: "missing" };
  if (plan.conflicts.length > 0) return { ...row, outcome: "conflicts", conflicts: plan.conflicts };
  return { ...row, outcome: "clean", next: applyPlan(b.config, plan) };
}

export function dryRun(builds: readonly DryRunBuild[], bodies: ReadonlyMap<number, PresetBody>, target: number): DryRunRow[] {
  return builds.map((b) => {
    const { next: _, ...row } = dryRunOne(b, bodies, target);
    return row;
  });
}
