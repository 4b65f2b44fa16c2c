import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { validateConfig } from "../checks/validate";
import { demoConfig } from "./demo";
import { derivedLayerId, fillLayerIds, freshLayerId } from "./layer-ids";
import { CONFIG_FORMAT, CONFIG_FORMAT_V1, type Config } from "./schema";
import { isOldForm, upgradeConfig, upgradeStored } from "./upgrade";

/** The demo as a "hiltbench.config/1" document: the same, without layer ids. */
function demoV1(): Record<string, unknown> {
  const c = demoConfig();
  return {
    ...c,
    format: CONFIG_FORMAT_V1,
    presets: c.presets.map((p) => ({ ...p, looks: Object.fromEntries(Object.entries(p.looks).map(([k, look]) => [k, { layers: look.layers.map(({ id: _, ...l }) => l) }])) })),
  };
}

const layerIdsOf = (c: unknown) =>
  (c as Config).presets.flatMap((p) => Object.entries(p.looks).map(([channel, look]) => ({ preset: p.id, channel, ids: look.layers.map((l) => l.id) })));

describe("upgrading hiltbench.config/1 to /2", () => {
  it("says /2, gives every layer an id, and changes nothing else", () => {
    const v1 = demoV1();
    const before = JSON.stringify(v1);
    const v2 = upgradeConfig(v1) as Config;
    expect(JSON.stringify(v1)).toBe(before); // the input is not changed
    expect(v2.format).toBe(CONFIG_FORMAT);
    expect(Object.keys(v2)[0]).toBe("format");
    for (const { ids } of layerIdsOf(v2)) for (const id of ids) expect(id).toMatch(/^l-[0-9a-z]{6}$/);
    // Without the ids and the format, it is the same document.
    const strip = (c: unknown) => JSON.stringify(c).replace(/"id":"l-[0-9a-z]{6}",/g, "").replace(CONFIG_FORMAT, CONFIG_FORMAT_V1);
    expect(strip(v2)).toBe(before);
    // The demo is built with the same rule: its v1 form upgrades to exactly it, and it is valid.
    expect(v2).toEqual(demoConfig());
    expect(validateConfig(v1).config).toEqual(demoConfig());
  });

  it("follows the documented rule: l- + base36(FNV-1a-32(preset/channel/index) mod 36^6)", () => {
    const v2 = upgradeConfig(demoV1()) as Config;
    const layers = v2.presets[1].looks.chamber.layers;
    layers.forEach((l, i) => expect(l.id).toBe(derivedLayerId("glasswind", "chamber", i)));
    // Worked by hand outside the project (a Python one-liner): FNV-1a-32("ashfall/blade/0") =
    // 0x152cedc0; mod 36^6 = 355265984 = "5vikzk" in base 36.
    expect(derivedLayerId("ashfall", "blade", 0)).toBe("l-5vikzk");
  });

  it("leaves a /2 document, an unknown format and non-objects as they are (the same value)", () => {
    const c = demoConfig();
    expect(upgradeConfig(c)).toBe(c);
    expect(upgradeStored(c)).toBe(c);
    const odd = { format: "something-else/9", presets: [{ id: "a", looks: { blade: { layers: [{ kind: "fill" }] } } }] };
    expect(upgradeConfig(odd)).toBe(odd);
    for (const x of [null, 3, "hiltbench.config/1", [demoV1()]]) expect(upgradeConfig(x)).toBe(x);
    expect(isOldForm(demoV1())).toBe(true);
    expect(isOldForm(c)).toBe(false);
  });

  it("is idempotent and deterministic", () => {
    const once = upgradeConfig(demoV1());
    expect(upgradeConfig(once)).toBe(once);
    expect(upgradeConfig(demoV1())).toEqual(once);
    expect(JSON.stringify(upgradeConfig(demoV1()))).toBe(JSON.stringify(once));
  });

  it("reads broken documents defensively and leaves them for the validator", () => {
    const broken = { format: CONFIG_FORMAT_V1, presets: [null, { id: 7, looks: { blade: { layers: [1, null, { kind: "fill" }, { id: 5, kind: "fill" }] }, chamber: "x" } }, { looks: [] }] };
    const up = upgradeConfig(broken) as { presets: { looks: { blade: { layers: unknown[] } } }[] };
    expect(up.presets[0]).toBeNull();
    const layers = up.presets[1].looks.blade.layers;
    expect(layers.slice(0, 2)).toEqual([1, null]);
    expect(layers[2]).toEqual({ id: derivedLayerId("", "blade", 2), kind: "fill" });
    expect(layers[3]).toEqual({ id: 5, kind: "fill" }); // an id already there is kept, right or wrong
    // A "__proto__" look key stays a key (JSON.parse makes it an own property).
    const hostile = JSON.parse(`{"format":"${CONFIG_FORMAT_V1}","presets":[{"id":"p","looks":{"__proto__":{"layers":[{"kind":"fill"}]}}}]}`);
    const looks = (upgradeConfig(hostile) as { presets: { looks: object }[] }).presets[0].looks;
    expect(Object.keys(looks)).toEqual(["__proto__"]);
    expect(Object.getPrototypeOf(looks)).toBe(Object.prototype);
  });

  it("property: ids are unique within every look, whatever ids some layers already carry", () => {
    const layer = fc.oneof(
      fc.constant({ kind: "fill" } as Record<string, unknown>),
      // Some v1 files may carry ids already, even ones the rule would derive.
      fc.nat(5).map((i) => ({ kind: "fill", id: derivedLayerId("p", "blade", i) })),
    );
    fc.assert(
      fc.property(fc.array(layer, { maxLength: 12 }), (layers) => {
        const up = upgradeConfig({ format: CONFIG_FORMAT_V1, presets: [{ id: "p", looks: { blade: { layers } } }] }) as { presets: { looks: { blade: { layers: { id: string }[] } } }[] };
        const ids = up.presets[0].looks.blade.layers.map((l) => l.id);
        const given = layers.flatMap((l) => (typeof l.id === "string" ? [l.id] : []));
        // Derived ids never take one already given; only ids given twice repeat (the validator reports those).
        const derived = ids.filter((_, i) => layers[i].id === undefined);
        expect(new Set(derived).size).toBe(derived.length);
        for (const d of derived) expect(given).not.toContain(d);
      }),
    );
  });

  it("gives the same layer the same id in every look of the same preset, channel and position only", () => {
    const ids = new Set(layerIdsOf(upgradeConfig(demoV1())).flatMap((l) => l.ids));
    // 5 presets × (9 or 10 + 3 + 2) layers, all different here.
    expect(ids.size).toBe(layerIdsOf(demoConfig()).reduce((n, l) => n + l.ids.length, 0));
  });
});

describe("fresh layer ids", () => {
  it("are short, readable, random and avoid the ones taken", () => {
    const many = Array.from({ length: 500 }, () => freshLayerId());
    for (const id of many) expect(id).toMatch(/^l-[0-9a-z]{6}$/);
    expect(new Set(many).size).toBe(500);
    const taken = new Set(many);
    expect(taken.has(freshLayerId(taken))).toBe(false);
  });

  it("fillLayerIds keeps a document with every id as the same value", () => {
    const c = demoConfig();
    expect(fillLayerIds(c)).toBe(c);
  });
});
