import { describe, expect, it } from "vitest";
import { demoConfig } from "~/lib/config/demo";
import { configSchema, LAYER_KINDS } from "~/lib/config/schema";
import { validate } from "~/lib/checks/validate";
import { canRedo, canUndo, editorReducer, HISTORY_LIMIT, initEditor, isDirty, selectedPreset, uniqueId, type EditorAction, type EditorState } from "./editor-state";
import { indexDiagnostics, layerPath, lookPath, presetPath } from "./diagnostic-index";

const run = (s: EditorState, ...actions: EditorAction[]) => actions.reduce(editorReducer, s);
const ids = (s: EditorState) => s.config.presets.map((p) => p.id);
const blade = (s: EditorState, presetId = "ashfall") => s.config.presets.find((p) => p.id === presetId)!.looks.blade.layers;

describe("presets", () => {
  it("adds a preset with a fresh id, a received font and a look per channel, and selects it", () => {
    const s = run(initEditor(demoConfig()), { type: "preset/add" }, { type: "preset/add" });
    expect(ids(s).slice(-2)).toEqual(["new-preset", "new-preset-2"]);
    const p = selectedPreset(s)!;
    expect(p.id).toBe("new-preset-2");
    expect(Object.keys(p.looks).sort()).toEqual(["blade", "chamber", "crystal"]);
    expect(p.looks.blade.layers.map((l) => l.kind)).toEqual(["fill", "wipe", "wipe"]);
    expect(configSchema.safeParse(s.config).success).toBe(true);
  });

  it("duplicates right after the original with a deep copy", () => {
    const s = run(initEditor(demoConfig()), { type: "preset/duplicate", presetId: "ashfall" });
    expect(ids(s).slice(0, 3)).toEqual(["ashfall", "ashfall-copy", "glasswind"]);
    expect(s.config.presets[1].name).toBe("Ashfall (copy)");
    const t = run(s, { type: "layer/update", presetId: "ashfall-copy", channelId: "blade", index: 0, patch: { color: "#00ff00" } });
    expect(blade(t, "ashfall")[0]).toMatchObject({ color: "#ff4a1c" });
    expect(blade(t, "ashfall-copy")[0]).toMatchObject({ color: "#00ff00" });
    // The copy's layers are new layers, with fresh ids.
    const original = new Set(blade(s, "ashfall").map((l) => l.id));
    for (const l of blade(s, "ashfall-copy")) expect(original.has(l.id)).toBe(false);
    expect(validate(s.config).filter((d) => d.code === "duplicate-layer-id")).toEqual([]);
  });

  it("renames, with consecutive keystrokes as one undo step", () => {
    const s = run(
      initEditor(demoConfig()),
      { type: "preset/rename", presetId: "ashfall", name: "A" },
      { type: "preset/rename", presetId: "ashfall", name: "As" },
      { type: "preset/rename", presetId: "ashfall", name: "Ash" },
    );
    expect(s.config.presets[0].name).toBe("Ash");
    expect(s.past).toHaveLength(1);
    expect(run(s, { type: "undo" }).config.presets[0].name).toBe("Ashfall");
  });

  it("moves a preset and clamps the destination; a no-op move leaves no history", () => {
    const s0 = initEditor(demoConfig());
    const s = run(s0, { type: "preset/move", presetId: "tidebreak", to: 0 });
    expect(ids(s)).toEqual(["tidebreak", "ashfall", "glasswind", "emberdusk", "northlight"]);
    expect(ids(run(s0, { type: "preset/move", presetId: "ashfall", to: 99 })).at(-1)).toBe("ashfall");
    expect(run(s0, { type: "preset/move", presetId: "ashfall", to: -3 })).toBe(s0);
  });

  it("deletes with an undoable notice and moves the selection to a preset that exists", () => {
    const s = run(initEditor(demoConfig()), { type: "preset/delete", presetId: "ashfall" });
    expect(ids(s)).not.toContain("ashfall");
    expect(s.notice).toEqual({ text: "Deleted preset “Ashfall”.", undoable: true });
    expect(s.selectedPresetId).toBe("glasswind");
    const back = run(s, { type: "undo" });
    expect(ids(back)[0]).toBe("ashfall");
    expect(back.notice).toBeNull();
  });

  it("sets the font", () => {
    const s = run(initEditor(demoConfig()), { type: "preset/font", presetId: "ashfall", fontId: "glasswind" });
    expect(s.config.presets[0].fontId).toBe("glasswind");
  });
});

describe("layers", () => {
  it("adds every kind on top of the stack, and the result still parses", () => {
    let s = initEditor(demoConfig());
    for (const kind of LAYER_KINDS) s = run(s, { type: "layer/add", presetId: "ashfall", channelId: "chamber", kind });
    const layers = s.config.presets[0].looks.chamber.layers;
    expect(layers.slice(-LAYER_KINDS.length).map((l) => l.kind)).toEqual([...LAYER_KINDS]);
    // A new mirror points at another channel, never at its own.
    expect(layers.at(-1)).toMatchObject({ kind: "mirror", channelId: "blade" });
    expect(configSchema.safeParse(s.config).success).toBe(true);
    // Each new layer has a fresh id of its own; the layers that were there keep theirs.
    const ids = layers.map((l) => l.id);
    expect(new Set(ids).size).toBe(ids.length);
    for (const id of ids.slice(-LAYER_KINDS.length)) expect(id).toMatch(/^l-[0-9a-z]{6}$/);
    expect(ids.slice(0, -LAYER_KINDS.length)).toEqual(demoConfig().presets[0].looks.chamber.layers.map((l) => l.id));
  });

  it("keeps a layer's id through moves, toggles and updates (an update cannot change it)", () => {
    const s0 = initEditor(demoConfig());
    const id0 = blade(s0)[0].id;
    const s = run(
      s0,
      { type: "layer/move", presetId: "ashfall", channelId: "blade", from: 0, to: 3 },
      { type: "layer/toggle", presetId: "ashfall", channelId: "blade", index: 3 },
      { type: "layer/update", presetId: "ashfall", channelId: "blade", index: 3, patch: { opacity: 0.4, id: "l-hijack" } },
    );
    expect(blade(s)[3]).toMatchObject({ id: id0, kind: "fill", enabled: false, opacity: 0.4 });
  });

  it("ignores a layer for a channel the rig does not have", () => {
    const s0 = initEditor(demoConfig());
    expect(run(s0, { type: "layer/add", presetId: "ashfall", channelId: "nope", kind: "fill" })).toBe(s0);
  });

  it("removes, moves and toggles", () => {
    const s0 = initEditor(demoConfig());
    const n = blade(s0).length;
    const removed = run(s0, { type: "layer/remove", presetId: "ashfall", channelId: "blade", index: 0 });
    expect(blade(removed)).toHaveLength(n - 1);
    expect(blade(removed)[0].kind).toBe("shimmer");
    const moved = run(s0, { type: "layer/move", presetId: "ashfall", channelId: "blade", from: 0, to: 2 });
    expect(blade(moved).map((l) => l.kind).slice(0, 3)).toEqual(["shimmer", "spark", "fill"]);
    const off = run(s0, { type: "layer/toggle", presetId: "ashfall", channelId: "blade", index: 1 });
    expect(blade(off)[1].enabled).toBe(false);
    expect(blade(run(off, { type: "layer/toggle", presetId: "ashfall", channelId: "blade", index: 1 }))[1].enabled).toBe(true);
  });

  it("updates fields but never the kind, and keeps other presets untouched", () => {
    const s0 = initEditor(demoConfig());
    const s = run(s0, { type: "layer/update", presetId: "ashfall", channelId: "blade", index: 0, patch: { color: "#123456", opacity: 0.5 } });
    expect(blade(s)[0]).toMatchObject({ kind: "fill", color: "#123456", opacity: 0.5 });
    expect(s.config.presets[1]).toBe(s0.config.presets[1]);
    expect(run(s0, { type: "layer/update", presetId: "ashfall", channelId: "blade", index: 0, patch: { kind: "wipe" } as never })).toBe(s0);
  });

  it("keeps out-of-schema numbers in the draft so the checks can point at them", () => {
    const s = run(initEditor(demoConfig()), { type: "layer/update", presetId: "ashfall", channelId: "blade", index: 0, patch: { opacity: 7 } });
    expect(blade(s)[0].opacity).toBe(7);
    expect(configSchema.safeParse(s.config).success).toBe(false);
  });
});

describe("looks across presets and channels", () => {
  it("copies a look to other presets and channels as independent copies", () => {
    const s = run(initEditor(demoConfig()), {
      type: "look/copy",
      from: { presetId: "ashfall", channelId: "crystal" },
      to: [
        { presetId: "glasswind", channelId: "crystal" },
        { presetId: "ashfall", channelId: "chamber" },
        { presetId: "ashfall", channelId: "crystal" },
      ],
    });
    const src = s.config.presets[0].looks.crystal;
    // The copies are new layers: the same content under fresh ids.
    const bare = (look: { layers: { id: string }[] }) => look.layers.map(({ id: _, ...l }) => l);
    expect(bare(s.config.presets[1].looks.crystal)).toEqual(bare(src));
    expect(bare(s.config.presets[0].looks.chamber)).toEqual(bare(src));
    const allIds = [src, s.config.presets[1].looks.crystal, s.config.presets[0].looks.chamber].flatMap((l) => l.layers.map((x) => x.id));
    expect(new Set(allIds).size).toBe(allIds.length);
    expect(s.config.presets[1].looks.crystal).not.toBe(src);
    expect(s.past).toHaveLength(1);
  });

  it("sets a channel to mirror another, refusing itself", () => {
    const s0 = initEditor(demoConfig());
    const s = run(s0, { type: "look/mirror", presetId: "ashfall", channelId: "crystal", sourceChannelId: "chamber" });
    expect(s.config.presets[0].looks.crystal.layers).toEqual([expect.objectContaining({ kind: "mirror", channelId: "chamber", fit: "stretch", enabled: true })]);
    expect(run(s0, { type: "look/mirror", presetId: "ashfall", channelId: "crystal", sourceChannelId: "crystal" })).toBe(s0);
  });
});

describe("history", () => {
  it("undoes and redoes in order; a new edit clears the redo list", () => {
    const s0 = initEditor(demoConfig());
    const a = run(s0, { type: "preset/move", presetId: "glasswind", to: 0 }, { type: "preset/font", presetId: "ashfall", fontId: "tidebreak" });
    expect(canUndo(a)).toBe(true);
    const u1 = run(a, { type: "undo" });
    expect(u1.config.presets.find((p) => p.id === "ashfall")!.fontId).toBe("ashfall");
    const u2 = run(u1, { type: "undo" });
    expect(u2.config).toBe(s0.config);
    expect(canUndo(u2)).toBe(false);
    expect(run(u2, { type: "undo" })).toBe(u2);
    const r = run(u2, { type: "redo" }, { type: "redo" });
    expect(r.config).toBe(a.config);
    expect(canRedo(r)).toBe(false);
    const branched = run(u1, { type: "preset/add" });
    expect(canRedo(branched)).toBe(false);
  });

  it("a keyed edit after an undo starts a new step", () => {
    const key = "blade.0.color";
    const up = (color: string): EditorAction => ({ type: "layer/update", presetId: "ashfall", channelId: "blade", index: 0, patch: { color }, key });
    const s = run(initEditor(demoConfig()), up("#000001"), { type: "undo" }, up("#000002"), up("#000003"));
    expect(s.past).toHaveLength(1);
    expect(blade(run(s, { type: "undo" }))[0]).toMatchObject({ color: "#ff4a1c" });
  });

  it("keeps at most HISTORY_LIMIT steps", () => {
    let s = initEditor(demoConfig());
    for (let i = 0; i < HISTORY_LIMIT + 25; i++) s = run(s, { type: "layer/toggle", presetId: "ashfall", channelId: "blade", index: 0 });
    expect(s.past).toHaveLength(HISTORY_LIMIT);
  });

  it("is dirty until saved, and clean again when undone back to the stored config", () => {
    const s0 = initEditor(demoConfig());
    expect(isDirty(s0)).toBe(false);
    const s = run(s0, { type: "preset/rename", presetId: "ashfall", name: "Ash" });
    expect(isDirty(s)).toBe(true);
    expect(isDirty(run(s, { type: "undo" }))).toBe(false);
    expect(isDirty(run(s, { type: "saved", config: s.config }))).toBe(false);
  });
});

describe("uniqueId", () => {
  it("slugs the base and counts up past ids in use", () => {
    expect(uniqueId("Ash Fall!", [])).toBe("ash-fall-");
    expect(uniqueId("x", ["x", "x-2"])).toBe("x-3");
    expect(uniqueId("", [])).toBe("preset");
  });
});

describe("diagnostics at controls", () => {
  it("builds the validator's own paths, so a bad breathe period lands on its control", () => {
    const s = run(initEditor(demoConfig()), { type: "layer/update", presetId: "glasswind", channelId: "chamber", index: 0, patch: { periodMs: 1 } });
    const index = indexDiagnostics(validate(s.config));
    const at = index.at(layerPath(1, "chamber", 0, "periodMs"));
    expect(at.map((d) => d.code)).toEqual(["breathe-period-out-of-range"]);
    expect(index.under(lookPath(1, "chamber")).length).toBe(1);
    expect(index.under(presetPath(1))).toHaveLength(1);
    expect(index.under(presetPath(0))).toHaveLength(0);
    expect(layerPath(0, "blade", 2, "stops", 1, "color")).toBe("presets[0].looks.blade.layers[2].stops[1].color");
  });
});
