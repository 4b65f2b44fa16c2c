import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { demoConfig } from "../config/demo";
import type { Config, Layer } from "../config/schema";
import { applyDelta, diffModels, merge3, modelDelta } from ".";

const texts = (a: unknown, b: unknown) => diffModels(a, b).changes.map((c) => c.text);

/** A random edit of a config, as people make them in the editors. */
const edit = fc.oneof(
  fc.record({ op: fc.constant("pixels" as const), ch: fc.nat(2), n: fc.integer({ min: 1, max: 300 }) }),
  fc.record({ op: fc.constant("move-preset" as const), from: fc.nat(20), to: fc.nat(20) }),
  fc.record({ op: fc.constant("drop-preset" as const), at: fc.nat(20) }),
  fc.record({ op: fc.constant("add-preset" as const), at: fc.nat(20), tag: fc.stringMatching(/^[a-z]{3,8}$/) }),
  fc.record({ op: fc.constant("layer-colour" as const), p: fc.nat(20), l: fc.nat(20), c: fc.stringMatching(/^#[0-9a-f]{6}$/) }),
  fc.record({ op: fc.constant("move-layer" as const), p: fc.nat(20), from: fc.nat(20), to: fc.nat(20) }),
  fc.record({ op: fc.constant("drop-layer" as const), p: fc.nat(20), l: fc.nat(20) }),
  fc.record({ op: fc.constant("pins" as const), pins: fc.uniqueArray(fc.integer({ min: 0, max: 40 }), { minLength: 1, maxLength: 5 }) }),
  fc.record({ op: fc.constant("rename-font" as const), f: fc.nat(10), name: fc.stringMatching(/^[A-Z][a-z]{2,9}$/) }),
);
type Edit = typeof edit extends fc.Arbitrary<infer E> ? E : never;

function apply(c: Config, e: Edit): void {
  const P = c.presets;
  const at = (n: number, len: number) => (len === 0 ? 0 : n % len);
  switch (e.op) {
    case "pixels":
      c.rig.channels[at(e.ch, c.rig.channels.length)].pixels = e.n;
      break;
    case "move-preset": {
      if (!P.length) break;
      const [x] = P.splice(at(e.from, P.length), 1);
      P.splice(at(e.to, P.length + 1), 0, x);
      break;
    }
    case "drop-preset":
      if (P.length) P.splice(at(e.at, P.length), 1);
      break;
    case "add-preset":
      if (!P.some((p) => p.id === e.tag)) P.splice(at(e.at, P.length + 1), 0, { ...structuredClone(demoConfig().presets[0]), id: e.tag, name: e.tag });
      break;
    case "layer-colour": {
      if (!P.length) break;
      const layers = P[at(e.p, P.length)].looks.blade?.layers ?? [];
      const l = layers[at(e.l, layers.length)] as Layer & { color?: string };
      if (l && "color" in l) l.color = e.c;
      break;
    }
    case "move-layer": {
      if (!P.length) break;
      const layers = P[at(e.p, P.length)].looks.blade?.layers ?? [];
      if (!layers.length) break;
      const [x] = layers.splice(at(e.from, layers.length), 1);
      layers.splice(at(e.to, layers.length + 1), 0, x);
      break;
    }
    case "drop-layer": {
      if (!P.length) break;
      const layers = P[at(e.p, P.length)].looks.blade?.layers ?? [];
      if (layers.length) layers.splice(at(e.l, layers.length), 1);
      break;
    }
    case "pins":
      c.rig.board.dataPins = e.pins;
      break;
    case "rename-font":
      c.fonts[at(e.f, c.fonts.length)].name = e.name;
      break;
  }
}
const edited = (base: Config, edits: Edit[]) => {
  const c = structuredClone(base);
  for (const e of edits) apply(c, e);
  return c;
};
const edits = fc.array(edit, { maxLength: 6 });

describe("model diff in words", () => {
  it("names a channel field, a moved preset, an added preset and a layer's field", () => {
    const a = demoConfig();
    const b = structuredClone(a);
    b.rig.channels[0].pixels = 128;
    b.presets.splice(1, 0, b.presets.splice(3, 1)[0]);
    b.presets.push({ ...structuredClone(a.presets[0]), id: "squall", name: "Northlight" });
    const chamber = b.presets[0].looks.chamber.layers;
    chamber[0] = { ...chamber[0], periodMs: 2000 } as Layer;
    expect(texts(a, b)).toEqual([
      "Channel Main blade: pixels 132 → 128",
      "Preset Emberdusk moved from 4 to 2",
      "Preset Ashfall › Chamber window › layer 1 (breathe): period 2600 → 2000 ms",
      "Preset Northlight added",
    ]);
  });

  it("reads a drift layer's speed with its unit, and an edit of a layer among reordered ones as an edit", () => {
    const a = demoConfig();
    a.presets[0].looks.chamber.layers.splice(1, 0, { id: "l-embers", kind: "drift", enabled: true, opacity: 1, blend: "normal", when: "always", colors: ["#ff0000", "#0000ff"], bandPixels: 3, speedPixelsPerSecond: 12, direction: "to-tip" });
    const b = structuredClone(a);
    (b.presets[0].looks.chamber.layers[1] as Layer & { speedPixelsPerSecond: number }).speedPixelsPerSecond = 8;
    expect(texts(a, b)).toEqual(["Preset Ashfall › Chamber window › layer 2 (drift): speed 12 → 8 px/s"]);
  });

  it("says nothing for the same config", () => {
    expect(diffModels(demoConfig(), demoConfig()).changes).toEqual([]);
    expect(modelDelta(demoConfig(), demoConfig())).toBeUndefined();
  });

  it("property: diff(a, b) applied to a gives b", () => {
    fc.assert(
      fc.property(edits, edits, (ea, eb) => {
        const a = edited(demoConfig(), ea);
        const b = edited(demoConfig(), eb);
        expect(applyDelta(a, modelDelta(a, b))).toEqual(b);
      }),
      { numRuns: 150 },
    );
  });

  it("property: moving one preset reads as exactly one move", () => {
    fc.assert(
      fc.property(fc.nat(4), fc.nat(4), (from, to) => {
        fc.pre(from !== to);
        const a = demoConfig();
        const b = structuredClone(a);
        b.presets.splice(to, 0, b.presets.splice(from, 1)[0]);
        const changes = diffModels(a, b).changes;
        expect(changes).toHaveLength(1);
        const m = changes[0];
        expect(m.kind).toBe("moved");
        // Neighbours swapped read either way round; the move named must give b.
        const replayed = structuredClone(a);
        replayed.presets.splice(m.to! - 1, 0, replayed.presets.splice(m.from! - 1, 1)[0]);
        expect(replayed).toEqual(b);
        expect(m.text).toBe(`Preset ${a.presets[m.from! - 1].name} moved from ${m.from} to ${m.to}`);
      }),
    );
  });

  it("a reorder of distinct layers is a move, not a removal and an addition", () => {
    const a = demoConfig();
    const b = structuredClone(a);
    const layers = b.presets[2].looks.blade.layers;
    layers.splice(0, 0, layers.splice(4, 1)[0]);
    const changes = diffModels(a, b).changes;
    expect(changes.map((c) => c.kind)).toEqual(["moved"]);
    expect(changes[0].text).toBe("Preset Tidebreak › Main blade: layer (spark) moved from 5 to 1");
  });
});

describe("layers keyed by their ids", () => {
  it("property: moving one layer of a look reads as exactly one move, even among identical layers", () => {
    fc.assert(
      fc.property(fc.nat(9), fc.nat(9), fc.boolean(), (from, to, twins) => {
        const a = demoConfig();
        const layers = a.presets[0].looks.blade.layers;
        fc.pre(from < layers.length && to < layers.length && from !== to);
        // Identical content under different ids: content hashes could not tell these apart.
        if (twins) layers.forEach((l, i) => (layers[i] = { ...layers[0], id: l.id }));
        const b = structuredClone(a);
        const bl = b.presets[0].looks.blade.layers;
        bl.splice(to, 0, bl.splice(from, 1)[0]);
        const changes = diffModels(a, b).changes;
        expect(changes.map((c) => c.kind)).toEqual(["moved"]);
        expect(applyDelta(a, modelDelta(a, b))).toEqual(b);
      }),
    );
  });

  it("reads an insert as one addition and an edit of a moved layer as a change of its field", () => {
    const a = demoConfig();
    const b = structuredClone(a);
    const bl = b.presets[0].looks.blade.layers;
    bl.unshift({ id: "l-embers", kind: "drift", enabled: true, opacity: 1, blend: "normal", when: "always", colors: ["#ff0000", "#0000ff"], bandPixels: 3, speedPixelsPerSecond: 12, direction: "to-tip" });
    const shimmer = bl.findIndex((l) => l.kind === "shimmer");
    (bl[shimmer] as Layer & { rateHz: number }).rateHz = 9;
    expect(texts(a, b)).toEqual(["Preset Ashfall › Main blade: layer 1 (drift) added", "Preset Ashfall › Main blade › layer 3 (shimmer): rate 16 → 9 Hz"]);
  });

  it("reads two layers that swapped content as two edits, not a move (the ids stayed put)", () => {
    const a = demoConfig();
    const b = structuredClone(a);
    const [x, y] = b.presets[0].looks.chamber.layers;
    b.presets[0].looks.chamber.layers[0] = { ...y, id: x.id };
    b.presets[0].looks.chamber.layers[1] = { ...x, id: y.id };
    expect(diffModels(a, b).changes.every((c) => c.kind === "changed")).toBe(true);
    expect(applyDelta(a, modelDelta(a, b))).toEqual(b);
  });

  it("falls back to content keys for layers without ids or with an id twice", () => {
    const a = demoConfig();
    const b = structuredClone(a);
    const bl = b.presets[0].looks.blade.layers;
    bl[1].id = bl[0].id;
    bl.splice(0, 0, bl.splice(4, 1)[0]);
    expect(applyDelta(a, modelDelta(a, b))).toEqual(b);
    expect(merge3(a, a, b)).toEqual({ merged: b, conflicts: [] });
  });
});

describe("three-way merge", () => {
  it("merges a layer edited on one side and moved on the other, and keeps both sides' new layers", () => {
    const base = demoConfig();
    const mine = structuredClone(base);
    const theirs = structuredClone(base);
    const id = base.presets[0].looks.blade.layers[1].id;
    (mine.presets[0].looks.blade.layers[1] as Layer & { amount: number }).amount = 0.3;
    mine.presets[0].looks.blade.layers.push({ ...base.presets[0].looks.blade.layers[0], id: "l-mine00" });
    const tl = theirs.presets[0].looks.blade.layers;
    tl.splice(5, 0, tl.splice(1, 1)[0]);
    tl.push({ ...base.presets[0].looks.blade.layers[0], id: "l-their0" });
    const { merged, conflicts } = merge3(base, mine, theirs);
    expect(conflicts).toEqual([]);
    const ml = merged.presets[0].looks.blade.layers;
    expect(ml.findIndex((l) => l.id === id)).toBe(5);
    expect(ml.find((l) => l.id === id)).toMatchObject({ kind: "shimmer", amount: 0.3 });
    expect(ml.slice(-2).map((l) => l.id).sort()).toEqual(["l-mine00", "l-their0"]);
  });

  it("property: a merge with an empty side gives the other side", () => {
    fc.assert(
      fc.property(edits, edits, (eb, ex) => {
        const base = edited(demoConfig(), eb);
        const other = edited(base, ex);
        expect(merge3(base, base, other)).toEqual({ merged: other, conflicts: [] });
        expect(merge3(base, other, base)).toEqual({ merged: other, conflicts: [] });
      }),
      { numRuns: 150 },
    );
  });

  it("property: edits of different presets merge on their own", () => {
    fc.assert(
      fc.property(fc.stringMatching(/^#[0-9a-f]{6}$/), fc.integer({ min: 100, max: 9000 }), (colour, period) => {
        const base = demoConfig();
        const mine = structuredClone(base);
        const theirs = structuredClone(base);
        (mine.presets[0].looks.blade.layers[0] as Layer & { color: string }).color = colour;
        (theirs.presets[3].looks.chamber.layers[0] as Layer & { periodMs: number }).periodMs = period;
        theirs.presets.splice(0, 0, theirs.presets.splice(4, 1)[0]);
        const { merged, conflicts } = merge3(base, mine, theirs);
        expect(conflicts).toEqual([]);
        const expected = structuredClone(theirs);
        (expected.presets.find((p) => p.id === base.presets[0].id)!.looks.blade.layers[0] as Layer & { color: string }).color = colour;
        expect(merged).toEqual(expected);
      }),
    );
  });

  it("asks when both changed the same layer's colour, and takes the side picked", () => {
    const base = demoConfig();
    const mine = structuredClone(base);
    const theirs = structuredClone(base);
    (mine.presets[1].looks.blade.layers[0] as Layer & { color: string }).color = "#112233";
    (theirs.presets[1].looks.blade.layers[0] as Layer & { color: string }).color = "#445566";
    theirs.rig.channels[0].pixels = 140;
    const first = merge3(base, mine, theirs);
    expect(first.conflicts).toHaveLength(1);
    expect(first.conflicts[0]).toMatchObject({ text: `Preset ${base.presets[1].name} › Main blade › layer 1 (fill): colour`, mine: "#112233", theirs: "#445566" });
    const picked = merge3(base, mine, theirs, { [first.conflicts[0].path]: "mine" });
    expect((picked.merged.presets[1].looks.blade.layers[0] as Layer & { color: string }).color).toBe("#112233");
    expect(picked.merged.rig.channels[0].pixels).toBe(140);
  });

  it("keeps both sides' new presets and layers, and asks when one side removed what the other changed", () => {
    const base = demoConfig();
    const mine = structuredClone(base);
    const theirs = structuredClone(base);
    mine.presets.push({ ...structuredClone(base.presets[0]), id: "northlight-2", name: "Northlight" });
    theirs.presets.push({ ...structuredClone(base.presets[0]), id: "squall", name: "Squall" });
    mine.presets[2].name = "Tidebreak II";
    theirs.presets.splice(2, 1);
    const r = merge3(base, mine, theirs);
    expect(r.merged.presets.map((p) => p.id).sort()).toEqual([...theirs.presets.map((p) => p.id), "northlight-2"].sort());
    expect(r.conflicts).toHaveLength(1);
    expect(r.conflicts[0]).toMatchObject({ mine: expect.stringContaining("Tidebreak II"), theirs: "removed" });
    expect(merge3(base, mine, theirs, { [r.conflicts[0].path]: "mine" }).merged.presets.some((p) => p.name === "Tidebreak II")).toBe(true);
  });
});
