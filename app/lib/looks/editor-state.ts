// The look editor's state as plain data: the draft config, what was last saved, and an undo/redo
// history. Every edit is an action through one reducer, so the page, the keyboard shortcuts and
// the tests drive the same code. No React, no fetch; the one thing not repeatable is a new
// layer's id, which is fresh (random) for every layer the editor makes, added or copied.
import { freshLayerId } from "~/lib/config/layer-ids";
import { newLayer } from "~/lib/config/layers";
import type { Config, Layer, LayerKind, Look, Preset } from "~/lib/config/schema";

/** Oldest edits fall off the history past this many steps. */
export const HISTORY_LIMIT = 200;

export interface Notice {
  text: string;
  /** The notice offers Undo (a delete that can be taken back). */
  undoable: boolean;
}

export interface EditorState {
  /** The draft being edited; may hold values the schema rejects (the checks say why). */
  config: Config;
  past: Config[];
  future: Config[];
  /** The config as last stored: the draft is dirty while it differs. */
  saved: Config;
  selectedPresetId: string | null;
  /** Edits with the same key in a row coalesce into one history step (typing a number). */
  lastKey: string | null;
  notice: Notice | null;
}

export type LookRef = { presetId: string; channelId: string };

export type EditorAction =
  | { type: "preset/select"; presetId: string }
  | { type: "preset/add" }
  | { type: "preset/duplicate"; presetId: string }
  | { type: "preset/rename"; presetId: string; name: string }
  | { type: "preset/move"; presetId: string; to: number }
  | { type: "preset/delete"; presetId: string }
  | { type: "preset/font"; presetId: string; fontId: string }
  | { type: "layer/add"; presetId: string; channelId: string; kind: LayerKind }
  | { type: "layer/remove"; presetId: string; channelId: string; index: number }
  | { type: "layer/move"; presetId: string; channelId: string; from: number; to: number }
  | { type: "layer/toggle"; presetId: string; channelId: string; index: number }
  | { type: "layer/update"; presetId: string; channelId: string; index: number; patch: Partial<Layer>; key?: string }
  | { type: "look/copy"; from: LookRef; to: LookRef[] }
  | { type: "look/mirror"; presetId: string; channelId: string; sourceChannelId: string }
  | { type: "undo" }
  | { type: "redo" }
  | { type: "notice/dismiss" }
  | { type: "saved"; config: Config }
  | { type: "reset"; config: Config }
  /** Someone saved meanwhile: `base` is what is stored now, `config` my edits put on top of it (undoable). */
  | { type: "rebase"; base: Config; config: Config };

export function initEditor(config: Config): EditorState {
  return { config, past: [], future: [], saved: config, selectedPresetId: config.presets[0]?.id ?? null, lastKey: null, notice: null };
}

export function canUndo(s: EditorState): boolean {
  return s.past.length > 0;
}
export function canRedo(s: EditorState): boolean {
  return s.future.length > 0;
}
export function isDirty(s: EditorState): boolean {
  return s.config !== s.saved && JSON.stringify(s.config) !== JSON.stringify(s.saved);
}
export function selectedPreset(s: EditorState): Preset | undefined {
  return s.config.presets.find((p) => p.id === s.selectedPresetId);
}

/** A fresh id from `base`: base, base-2, base-3… skipping the ones in use; always a valid id. */
export function uniqueId(base: string, taken: Iterable<string>): string {
  const used = new Set(taken);
  const clean = (base.toLowerCase().replace(/[^a-z0-9-]+/g, "-").replace(/^-+/, "") || "preset").slice(0, 40);
  if (!used.has(clean)) return clean;
  for (let i = 2; ; i++) {
    const id = `${clean}-${i}`;
    if (!used.has(id)) return id;
  }
}

/** What a new preset starts with: a fill on every channel, and ignition/retraction wipes on blades. */
export function starterLooks(config: Config): Record<string, Look> {
  const looks: Record<string, Look> = {};
  for (const c of config.rig.channels) {
    const layers: Layer[] = [newLayer("fill")];
    if (c.role === "main-blade") layers.push(newLayer("wipe", { event: "ignition" }), newLayer("wipe", { event: "retraction", durationMs: 500, easing: "ease-in" }));
    looks[c.id] = { layers };
  }
  return looks;
}

/** A layer of `kind` as the editor adds it; a mirror points at another channel of the rig. */
export function layerForChannel(config: Config, channelId: string, kind: LayerKind): Layer {
  if (kind === "mirror") {
    const other = config.rig.channels.find((c) => c.id !== channelId);
    return newLayer("mirror", { channelId: other?.id ?? channelId });
  }
  return newLayer(kind);
}

/** A copy of a look whose layers are new layers: each gets a fresh id. */
export function copiedLook(look: Look): Look {
  const taken = new Set<string>();
  return {
    ...structuredClone(look),
    layers: look.layers.map((l) => {
      const id = freshLayerId(taken);
      taken.add(id);
      return { ...structuredClone(l), id };
    }),
  };
}

/** `layer` with an id no other layer of `layers` holds (a fresh one if its own is taken). */
function withFreeId(layer: Layer, layers: readonly Layer[]): Layer {
  const taken = new Set(layers.map((l) => l.id));
  return taken.has(layer.id) ? { ...layer, id: freshLayerId(taken) } : layer;
}

function withPresets(config: Config, presets: Preset[]): Config {
  return { ...config, presets };
}

function mapPreset(config: Config, presetId: string, f: (p: Preset) => Preset): Config | null {
  const i = config.presets.findIndex((p) => p.id === presetId);
  if (i < 0) return null;
  const next = f(config.presets[i]);
  if (next === config.presets[i]) return null;
  const presets = config.presets.slice();
  presets[i] = next;
  return withPresets(config, presets);
}

function mapLayers(config: Config, presetId: string, channelId: string, f: (layers: Layer[]) => Layer[] | null): Config | null {
  return mapPreset(config, presetId, (p) => {
    const layers = f((p.looks[channelId]?.layers ?? []).slice());
    if (layers === null) return p;
    return { ...p, looks: { ...p.looks, [channelId]: { layers } } };
  });
}

function move<T>(list: readonly T[], from: number, to: number): T[] | null {
  if (from < 0 || from >= list.length) return null;
  const dest = Math.max(0, Math.min(list.length - 1, to));
  if (dest === from) return null;
  const out = list.slice();
  const [item] = out.splice(from, 1);
  out.splice(dest, 0, item);
  return out;
}

/** Records `config` as the new draft: one history step, unless it continues the same keyed edit. */
function commit(s: EditorState, config: Config | null, key: string | null = null, extra: Partial<EditorState> = {}): EditorState {
  if (config === null) return s;
  const coalesce = key !== null && key === s.lastKey;
  const past = coalesce ? s.past : [...s.past, s.config].slice(-HISTORY_LIMIT);
  return { ...s, config, past, future: [], lastKey: key, notice: null, ...extra };
}

/** Keeps the selection on a preset that exists. */
function settle(s: EditorState): EditorState {
  if (s.selectedPresetId !== null && s.config.presets.some((p) => p.id === s.selectedPresetId)) return s;
  return { ...s, selectedPresetId: s.config.presets[0]?.id ?? null };
}

export function editorReducer(s: EditorState, a: EditorAction): EditorState {
  return settle(step(s, a));
}

function step(s: EditorState, a: EditorAction): EditorState {
  const c = s.config;
  switch (a.type) {
    case "preset/select":
      return c.presets.some((p) => p.id === a.presetId) ? { ...s, selectedPresetId: a.presetId, lastKey: null } : s;
    case "preset/add": {
      const id = uniqueId("new-preset", c.presets.map((p) => p.id));
      const n = c.presets.length + 1;
      const preset: Preset = { id, name: `New preset ${n}`, fontId: c.fonts[0]?.id ?? "font", looks: starterLooks(c) };
      return commit(s, withPresets(c, [...c.presets, preset]), null, { selectedPresetId: id });
    }
    case "preset/duplicate": {
      const i = c.presets.findIndex((p) => p.id === a.presetId);
      if (i < 0) return s;
      const src = c.presets[i];
      const id = uniqueId(`${src.id.slice(0, 40)}-copy`, c.presets.map((p) => p.id));
      const looks = Object.fromEntries(Object.entries(src.looks).map(([k, look]) => [k, copiedLook(look)]));
      const copy: Preset = { ...structuredClone(src), id, name: `${src.name} (copy)`.slice(0, 60), looks };
      const presets = c.presets.slice();
      presets.splice(i + 1, 0, copy);
      return commit(s, withPresets(c, presets), null, { selectedPresetId: id });
    }
    case "preset/rename":
      return commit(s, mapPreset(c, a.presetId, (p) => (p.name === a.name ? p : { ...p, name: a.name })), `rename:${a.presetId}`);
    case "preset/move": {
      const from = c.presets.findIndex((p) => p.id === a.presetId);
      const presets = move(c.presets, from, a.to);
      return presets ? commit(s, withPresets(c, presets)) : s;
    }
    case "preset/delete": {
      const victim = c.presets.find((p) => p.id === a.presetId);
      if (!victim) return s;
      return commit(s, withPresets(c, c.presets.filter((p) => p.id !== a.presetId)), null, {
        notice: { text: `Deleted preset “${victim.name}”.`, undoable: true },
      });
    }
    case "preset/font":
      return commit(s, mapPreset(c, a.presetId, (p) => (p.fontId === a.fontId ? p : { ...p, fontId: a.fontId })));
    case "layer/add":
      if (!c.rig.channels.some((ch) => ch.id === a.channelId)) return s;
      return commit(s, mapLayers(c, a.presetId, a.channelId, (layers) => [...layers, withFreeId(layerForChannel(c, a.channelId, a.kind), layers)]));
    case "layer/remove":
      return commit(
        s,
        mapLayers(c, a.presetId, a.channelId, (layers) => (a.index >= 0 && a.index < layers.length ? layers.filter((_, i) => i !== a.index) : null)),
        null,
        { notice: { text: "Removed a layer.", undoable: true } },
      );
    case "layer/move":
      return commit(s, mapLayers(c, a.presetId, a.channelId, (layers) => move(layers, a.from, a.to)));
    case "layer/toggle":
      return commit(
        s,
        mapLayers(c, a.presetId, a.channelId, (layers) => {
          const l = layers[a.index];
          if (!l) return null;
          layers[a.index] = { ...l, enabled: !l.enabled };
          return layers;
        }),
      );
    case "layer/update":
      return commit(
        s,
        mapLayers(c, a.presetId, a.channelId, (layers) => {
          const l = layers[a.index];
          // The kind is what the other fields mean, the id what diffs follow; an update changes neither.
          if (!l || ("kind" in a.patch && a.patch.kind !== l.kind)) return null;
          layers[a.index] = { ...l, ...a.patch, id: l.id } as Layer;
          return layers;
        }),
        a.key ?? null,
      );
    case "look/copy": {
      const from = c.presets.find((p) => p.id === a.from.presetId)?.looks[a.from.channelId];
      if (!from) return s;
      let next = c;
      for (const t of a.to) {
        if (t.presetId === a.from.presetId && t.channelId === a.from.channelId) continue;
        if (!c.rig.channels.some((ch) => ch.id === t.channelId)) continue;
        next = mapPreset(next, t.presetId, (p) => ({ ...p, looks: { ...p.looks, [t.channelId]: copiedLook(from) } })) ?? next;
      }
      return next === c ? s : commit(s, next);
    }
    case "look/mirror":
      if (a.sourceChannelId === a.channelId || !c.rig.channels.some((ch) => ch.id === a.sourceChannelId)) return s;
      return commit(
        s,
        mapPreset(c, a.presetId, (p) => ({ ...p, looks: { ...p.looks, [a.channelId]: { layers: [newLayer("mirror", { channelId: a.sourceChannelId, fit: "stretch" })] } } })),
      );
    case "undo": {
      if (s.past.length === 0) return s;
      const prev = s.past[s.past.length - 1];
      return { ...s, config: prev, past: s.past.slice(0, -1), future: [c, ...s.future], lastKey: null, notice: null };
    }
    case "redo": {
      if (s.future.length === 0) return s;
      const [next, ...rest] = s.future;
      return { ...s, config: next, past: [...s.past, c].slice(-HISTORY_LIMIT), future: rest, lastKey: null, notice: null };
    }
    case "notice/dismiss":
      return s.notice ? { ...s, notice: null } : s;
    case "saved":
      // Typing on the same field after a save starts a new step.
      return { ...s, saved: a.config, lastKey: null };
    case "reset":
      return { ...initEditor(a.config), selectedPresetId: s.selectedPresetId };
    case "rebase":
      return { ...s, saved: a.base, config: a.config, past: [...s.past, c].slice(-HISTORY_LIMIT), future: [], lastKey: null, notice: null };
  }
}
