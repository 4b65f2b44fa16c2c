// Moving a preset between a build and the library. To the library: each channel's look goes
// under the channel's role with its pixel count; mirror layers name the role they repeat. To a
// build: each role's look goes to every channel of that role, scaled to its pixels; a role the
// build lacks is skipped, and a channel the preset has no look for gets none. Both directions
// say what they left out, in words, so the page can tell the person.
import type { Config, Layer, Look, Preset } from "../config/schema";
import { roleKeyOf, roleLabel, sortedRoles, type PresetBody } from "./format";
import { scaleLook } from "./scale";

export type Note = { kind: "skipped-role" | "no-look" | "dropped-mirror" | "duplicate-role"; text: string };

/** A build's preset as a library body (name, tags and notes given by the person). */
export function bodyFromBuildPreset(config: Config, presetId: string, meta: { name?: string; tags?: string[]; notes?: string } = {}): { body: PresetBody; notes: Note[] } | null {
  const preset = config.presets.find((p) => p.id === presetId);
  if (!preset) return null;
  const notes: Note[] = [];
  const looks: PresetBody["looks"] = {};
  const roleOfChannel = new Map(config.rig.channels.map((c) => [c.id, roleKeyOf(c)] as const));
  for (const ch of config.rig.channels) {
    const look = preset.looks[ch.id];
    if (!look) continue;
    const role = roleKeyOf(ch);
    if (looks[role]) {
      notes.push({ kind: "duplicate-role", text: `${ch.name}: another channel already gave the ${roleLabel(role)} look; this one was not saved.` });
      continue;
    }
    const layers: Layer[] = [];
    for (const l of look.layers) {
      if (l.kind === "mirror") {
        const target = roleOfChannel.get(l.channelId);
        if (!target) {
          notes.push({ kind: "dropped-mirror", text: `${ch.name}: a mirror of a channel the rig does not have was left out.` });
          continue;
        }
        layers.push(structuredClone({ ...l, channelId: target }));
      } else layers.push(structuredClone(l));
    }
    looks[role] = { pixels: ch.pixels, layers };
  }
  return { body: { name: (meta.name ?? preset.name).trim(), tags: meta.tags ?? [], notes: meta.notes ?? "", looks }, notes };
}

/**
 * The looks of a library body for this build's rig, by channel id. Layer ids are kept, so the
 * same library version always becomes the same looks on the same rig (the merge's base).
 */
export function looksForRig(body: PresetBody, config: Pick<Config, "rig">): { looks: Record<string, Look>; notes: Note[] } {
  const notes: Note[] = [];
  const looks: Record<string, Look> = {};
  const channelOfRole = new Map<string, string>();
  for (const ch of config.rig.channels) {
    const role = roleKeyOf(ch);
    if (!channelOfRole.has(role)) channelOfRole.set(role, ch.id);
  }
  for (const ch of config.rig.channels) {
    const src = body.looks[roleKeyOf(ch)];
    if (!src) {
      notes.push({ kind: "no-look", text: `${ch.name} (${roleLabel(roleKeyOf(ch))}) gets no look: the library preset has none for that role.` });
      continue;
    }
    const scaled = scaleLook({ layers: src.layers }, src.pixels, ch.pixels);
    const layers: Layer[] = [];
    for (const l of scaled.layers) {
      if (l.kind !== "mirror") {
        layers.push(l);
        continue;
      }
      const target = channelOfRole.get(l.channelId);
      if (!target || target === ch.id) {
        notes.push({ kind: "dropped-mirror", text: `${ch.name}: its mirror of the ${roleLabel(l.channelId)} was left out (the rig has no other channel with that role).` });
        continue;
      }
      layers.push({ ...l, channelId: target });
    }
    looks[ch.id] = { layers };
  }
  const present = new Set(config.rig.channels.map(roleKeyOf));
  for (const role of sortedRoles(Object.keys(body.looks))) {
    if (!present.has(role)) notes.push({ kind: "skipped-role", text: `The ${roleLabel(role)} look was skipped: this rig has no channel with that role.` });
  }
  return { looks, notes };
}

/** A free preset id for the config, from the name. */
export function freePresetId(config: Config, name: string): string {
  const base =
    name
      .toLowerCase()
      .normalize("NFKD")
      .replace(/[^a-z0-9]+/g, "-")
      .replace(/^-+|-+$/g, "")
      .slice(0, 40) || "preset";
  const taken = new Set(config.presets.map((p) => p.id));
  if (!taken.has(base)) return base;
  for (let n = 2; ; n++) if (!taken.has(`${base}-${n}`)) return `${base}-${n}`;
}

export type AddResult = { config: Config; presetId: string; notes: Note[] };

/** The config with the library preset added as a new build preset (a copy; the input is not changed). */
export function addToConfig(config: Config, body: PresetBody, opts: { fontId: string; name?: string }): AddResult {
  const { looks, notes } = looksForRig(body, config);
  const name = (opts.name ?? body.name).slice(0, 60);
  const presetId = freePresetId(config, name);
  const preset: Preset = { id: presetId, name, fontId: opts.fontId, looks };
  return { config: { ...structuredClone(config), presets: [...structuredClone(config.presets), preset] }, presetId, notes };
}
