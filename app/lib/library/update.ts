// Bringing a build's preset up to a newer library version: a three-way merge (model-diff's
// merge3) with the version the build has as the base, the build's preset as mine and the newer
// version as theirs, both library sides laid on the build's rig the same way (looksForRig), so
// only real changes show. The preset's name and font stay the build's.
import type { Config, Preset } from "../config/schema";
import { diffModels, type Change } from "../model-diff";
import { merge3, type Conflict, type Side } from "../model-diff/merge";
import { looksForRig, type Note } from "./adapt";
import type { PresetBody } from "./format";

export type UpdatePlan = {
  /** The build's preset after the merge (undecided collisions take the library's side). */
  merged: Preset;
  conflicts: Conflict[];
  /** What the library changed from the build's version to the newer one, in words. */
  libraryChanges: Change[];
  notes: Note[];
};

function asPreset(mine: Preset, body: PresetBody, config: Config): { preset: Preset; notes: Note[] } {
  const { looks, notes } = looksForRig(body, config);
  return { preset: { ...mine, looks }, notes };
}

/** The merge of one build preset with a newer library version; null when the preset is gone. */
export function planUpdate(config: Config, presetId: string, baseBody: PresetBody, newBody: PresetBody, choices: Record<string, Side> = {}): UpdatePlan | null {
  const mine = config.presets.find((p) => p.id === presetId);
  if (!mine) return null;
  const base = asPreset(mine, baseBody, config);
  const theirs = asPreset(mine, newBody, config);
  const { merged, conflicts } = merge3(base.preset, mine, theirs.preset, choices);
  const libraryChanges = diffModels({ ...config, presets: [base.preset] }, { ...config, presets: [theirs.preset] }).changes;
  return { merged, conflicts, libraryChanges, notes: theirs.notes };
}

/** The config with the preset replaced by the plan's result (a copy). */
export function applyPlan(config: Config, plan: UpdatePlan): Config {
  return { ...config, presets: config.presets.map((p) => (p.id === plan.merged.id ? plan.merged : p)) };
}

/** A library version's changes from one body to another, in words (laid on a stand-in rig). */
export function bodyChanges(a: PresetBody, b: PresetBody): Change[] {
  // Every change is inside the one preset: its crumb ("Preset Ember drift") says nothing here.
  return diffModels(bodyAsModel(a), bodyAsModel(b)).changes.map((c) => {
    const head = c.where[0];
    if (!head?.startsWith("Preset ") || !c.text.startsWith(head)) return c;
    const where = c.where.slice(1);
    const rest = c.text.slice(head.length).replace(/^ › /, "");
    return { ...c, where, text: rest.startsWith(": ") ? rest.slice(2).replace(/^./, (x) => x.toUpperCase()) : rest };
  });
}

/**
 * A body as a model fragment the diff can word: one preset whose looks are keyed by role and
 * whose channels are named by role, so changes read "main blade › layer 'embers' (drift): …".
 */
export function bodyAsModel(body: PresetBody) {
  const roles = Object.keys(body.looks);
  return {
    rig: { channels: roles.map((r) => ({ id: r, name: roleName(r), pixels: body.looks[r].pixels })) },
    presets: [{ id: "library", name: body.name, tags: body.tags, notes: body.notes, looks: Object.fromEntries(roles.map((r) => [r, { layers: body.looks[r].layers }])) }],
  };
}

const roleName = (r: string) => ({ "main-blade": "Main blade", "chamber-strip": "Chamber strip", "accent-pixel": "Accent pixel" })[r] ?? r.replace(/^custom-/, "").replace(/-/g, " ");
