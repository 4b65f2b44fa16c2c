// The library's pure rules: a look keeps its picture when it moves to a rig of another length,
// add-to-build goes by role and says what it skipped, updates merge three ways, the dry run never
// touches a released build.
import { describe, expect, it } from "vitest";
import { demoConfig } from "../config/demo";
import { newLayer } from "../config/layers";
import type { Config, Look } from "../config/schema";
import { validate } from "../checks/validate";
import { lookTimeImage, type RgbaImage } from "../effects/image";
import { addToConfig, bodyFromBuildPreset, looksForRig } from "./adapt";
import { checkBody } from "./check";
import { dryRun, type DryRunBuild } from "./dry-run";
import { presetBodySchema, roleKeyOf, type PresetBody } from "./format";
import { scaleLook } from "./scale";
import { applyPlan, bodyChanges, planUpdate } from "./update";

/** A blade look with every pixel-valued field and no per-pixel noise (shimmer is random per pixel, so it cannot resample). */
function emberLook(): Look {
  return {
    layers: [
      newLayer("fill", { id: "l-base00", color: "#ff4a1c" }),
      newLayer("gradient", { id: "l-grad00", stops: [{ at: 0, color: "#ff4a1c" }, { at: 1, color: "#ffd27a" }], opacity: 0.5 }),
      newLayer("drift", { id: "l-embers", colors: ["#ff8a3d", "#b3124a"], bandPixels: 22, speedPixelsPerSecond: 33, opacity: 0.6 }),
      newLayer("fill", { id: "l-tip000", color: "#ffffff", range: { start: 110, end: 132 }, opacity: 0.4 }),
      newLayer("spark", { id: "l-clash0", event: "clash", color: "#ffffff", position: 0.5, widthPixels: 44, decayMs: 160 }),
      newLayer("hold", { id: "l-lock00", event: "lockup", color: "#fff4b0", position: 0.55, widthPixels: 22, flicker: 0 }),
      newLayer("wipe", { id: "l-ign000", event: "ignition", durationMs: 340, easing: "ease-out" }),
      newLayer("wipe", { id: "l-ret000", event: "retraction", durationMs: 520, easing: "ease-in" }),
    ],
  };
}

function rigWithBlade(pixels: number): Config {
  const c = demoConfig();
  c.rig.channels[0].pixels = pixels;
  c.presets[0].looks.blade = emberLook();
  return c;
}

/** Each row of `img` resampled to `width` pixels by area averaging (box filter). */
function resample(img: RgbaImage, width: number): Float64Array {
  const out = new Float64Array(width * img.height * 3);
  const f = img.width / width;
  for (let y = 0; y < img.height; y++)
    for (let x = 0; x < width; x++) {
      const a = x * f;
      const b = a + f;
      for (let c = 0; c < 3; c++) {
        let sum = 0;
        for (let s = Math.floor(a); s < Math.ceil(b); s++) {
          const w = Math.min(b, s + 1) - Math.max(a, s);
          sum += w * img.rgba[(y * img.width + s) * 4 + c];
        }
        out[(y * width + x) * 3 + c] = sum / f;
      }
    }
  return out;
}

describe("scaling to the target channel", () => {
  it("a look made on 132 px, added to a 100 px blade, renders the same time-by-pixel picture resampled, and validates clean", () => {
    const source = rigWithBlade(132);
    const { body } = bodyFromBuildPreset(source, "ashfall")!;
    expect(body.looks["main-blade"].pixels).toBe(132);
    const target = demoConfig();
    target.rig.channels[0].pixels = 100;
    const { config, presetId } = addToConfig(target, body, { fontId: "ashfall" });
    expect(validate(config).filter((d) => d.severity === "error")).toEqual([]);

    const want = resample(lookTimeImage(source, "ashfall", "blade"), 100);
    const got = lookTimeImage(config, presetId, "blade");
    expect(got.width).toBe(100);
    let sum = 0;
    const diffs: number[] = [];
    for (let i = 0, p = 0; i < got.width * got.height; i++)
      for (let c = 0; c < 3; c++, p++) {
        const d = Math.abs(got.rgba[i * 4 + c] - want[p]);
        sum += d;
        diffs.push(d);
      }
    diffs.sort((a, b) => a - b);
    // Stated tolerance: mean difference under 4 of 255 per colour, and 99 % of values within 24
    // (band edges and the rounded band width are where whole-pixel rounding shows).
    expect(sum / diffs.length).toBeLessThan(4);
    expect(diffs[Math.floor(diffs.length * 0.99)]).toBeLessThanOrEqual(24);

    // The same look copied without scaling misses by far more: the check has teeth.
    const raw = addToConfig(target, { ...body, looks: { ...body.looks, "main-blade": { ...body.looks["main-blade"], pixels: 100 } } }, { fontId: "ashfall" });
    const unscaled = lookTimeImage(raw.config, raw.presetId, "blade");
    let rawSum = 0;
    for (let i = 0, p = 0; i < unscaled.width * unscaled.height; i++) for (let c = 0; c < 3; c++, p++) rawSum += Math.abs(unscaled.rgba[i * 4 + c] - want[p]);
    expect(rawSum / diffs.length).toBeGreaterThan(2 * (sum / diffs.length));
  });

  it("scales ranges, bands, speeds and widths; keeps ids; leaves fractions and times", () => {
    const s = scaleLook(emberLook(), 132, 66).layers;
    expect(s.map((l) => l.id)).toEqual(emberLook().layers.map((l) => l.id));
    const drift = s.find((l) => l.kind === "drift")!;
    expect(drift).toMatchObject({ bandPixels: 11, speedPixelsPerSecond: 16.5 });
    expect(s[3].range).toEqual({ start: 55, end: 66 });
    expect(s.find((l) => l.kind === "spark")).toMatchObject({ widthPixels: 22, position: 0.5, decayMs: 160 });
    expect(scaleLook(emberLook(), 132, 1).layers[3].range).toEqual({ start: 0, end: 1 });
  });
});

describe("add to a build by role", () => {
  it("skips a role the build lacks, tells about a channel with no look, maps mirrors by role", () => {
    const { body } = bodyFromBuildPreset(demoConfig(), "ashfall")!;
    expect(Object.keys(body.looks).sort()).toEqual(["accent-pixel", "chamber-strip", "main-blade"]);
    expect(body.looks["chamber-strip"].layers.find((l) => l.kind === "mirror")).toMatchObject({ channelId: "main-blade" });
    const c = demoConfig();
    c.rig.channels = c.rig.channels.filter((ch) => ch.id !== "crystal");
    c.rig.channels.push({ id: "pommel", name: "Pommel ring", role: "custom", pixels: 12, parallelStrips: 1, pin: 5, colorOrder: "GRB" });
    c.rig.board.dataPins.push(5);
    const r = addToConfig(c, body, { fontId: "glasswind", name: "Ashfall from the library" });
    expect(r.presetId).toBe("ashfall-from-the-library");
    const p = r.config.presets.at(-1)!;
    expect(Object.keys(p.looks).sort()).toEqual(["blade", "chamber"]);
    expect(p.looks.chamber.layers.find((l) => l.kind === "mirror")).toMatchObject({ channelId: "blade" });
    expect(r.notes.map((n) => n.kind).sort()).toEqual(["no-look", "skipped-role"]);
    expect(r.notes.find((n) => n.kind === "skipped-role")!.text).toMatch(/accent pixel/);
    expect(r.notes.find((n) => n.kind === "no-look")!.text).toMatch(/Pommel ring/);
    expect(roleKeyOf({ role: "custom", name: "Pommel ring" })).toBe("custom-pommel-ring");
    expect(c.presets).toHaveLength(5); // the input is not changed
  });

  it("a body from the demo passes its own schema and the validator on the stand-in rig", () => {
    const { body } = bodyFromBuildPreset(demoConfig(), "glasswind", { tags: ["cool", "demo"] })!;
    expect(presetBodySchema.safeParse(body).success).toBe(true);
    const r = checkBody(body);
    expect(r.counts.errors).toBe(0);
    expect(r.body).not.toBeNull();
  });

  it("refuses a body with errors, with diagnostics", () => {
    const { body } = bodyFromBuildPreset(demoConfig(), "ashfall")!;
    const bad = structuredClone(body) as PresetBody;
    (bad.looks["main-blade"].layers[0] as { color: string }).color = "orange";
    const r = checkBody(bad);
    expect(r.body).toBeNull();
    expect(r.diagnostics.some((d) => d.severity === "error" && /looks/.test(d.path))).toBe(true);
    expect(checkBody({ name: "x", tags: [], notes: "", looks: { "not a role": { pixels: 1, layers: [] } } }).body).toBeNull();
  });
});

describe("updates: a three-way merge", () => {
  function setup() {
    const v1 = bodyFromBuildPreset(rigWithBlade(132), "ashfall")!.body;
    const build = addToConfig(demoConfig(), v1, { fontId: "ashfall" });
    return { v1, build };
  }

  it("merges changes that do not collide and words the library's changes", () => {
    const { v1, build } = setup();
    const v2 = structuredClone(v1);
    const drift = v2.looks["main-blade"].layers.find((l) => l.id === "l-embers")! as { speedPixelsPerSecond: number };
    drift.speedPixelsPerSecond = 12;
    const mine = structuredClone(build.config);
    const p = mine.presets.find((x) => x.id === build.presetId)!;
    (p.looks.blade.layers.find((l) => l.id === "l-base00") as { color: string }).color = "#ff0000";
    const plan = planUpdate(mine, build.presetId, v1, v2)!;
    expect(plan.conflicts).toEqual([]);
    const merged = applyPlan(mine, plan).presets.find((x) => x.id === build.presetId)!;
    expect(merged.looks.blade.layers.find((l) => l.id === "l-base00")).toMatchObject({ color: "#ff0000" });
    expect(merged.looks.blade.layers.find((l) => l.id === "l-embers")).toMatchObject({ speedPixelsPerSecond: 12 });
    expect(plan.libraryChanges.map((c) => c.text).join("\n")).toMatch(/Main blade › layer 3 \(drift\): speed 33 → 12 px\/s/);
    expect(bodyChanges(v1, v2).map((c) => c.text).join("\n")).toMatch(/Main blade.*speed 33 → 12 px\/s/);
  });

  it("lists a collision and lets the person pick", () => {
    const { v1, build } = setup();
    const v2 = structuredClone(v1);
    (v2.looks["main-blade"].layers[0] as { color: string }).color = "#00ff00";
    const mine = structuredClone(build.config);
    (mine.presets.at(-1)!.looks.blade.layers[0] as { color: string }).color = "#0000ff";
    const plan = planUpdate(mine, build.presetId, v1, v2)!;
    expect(plan.conflicts).toHaveLength(1);
    expect(plan.conflicts[0]).toMatchObject({ mine: "#0000ff", theirs: "#00ff00" });
    const kept = planUpdate(mine, build.presetId, v1, v2, { [plan.conflicts[0].path]: "mine" })!;
    expect(kept.merged.looks.blade.layers[0]).toMatchObject({ color: "#0000ff" });
  });

  it("dry run: clean, needs hands, released never changed, current", () => {
    const { v1, build } = setup();
    const v2 = structuredClone(v1);
    (v2.looks["main-blade"].layers[0] as { color: string }).color = "#00ff00";
    const collide = structuredClone(build.config);
    (collide.presets.at(-1)!.looks.blade.layers[0] as { color: string }).color = "#0000ff";
    const b = (id: string, status: string, config: Config, version = 1): DryRunBuild => ({ id, name: id, status, config, configVersion: 1, presetId: build.presetId, version });
    const rows = dryRun([b("a", "configuring", build.config), b("b", "configuring", collide), b("c", "released", build.config), b("d", "configuring", build.config, 2)], new Map([[1, v1], [2, v2]]), 2);
    expect(rows.map((r) => r.outcome)).toEqual(["clean", "conflicts", "released", "current"]);
  });

  it("the base is the same looks the build got (a build with no local change merges to exactly the new version)", () => {
    const { v1, build } = setup();
    const v2 = structuredClone(v1);
    v2.looks["main-blade"].layers.splice(1, 1);
    const plan = planUpdate(build.config, build.presetId, v1, v2)!;
    expect(plan.conflicts).toEqual([]);
    expect(plan.merged.looks).toEqual(looksForRig(v2, build.config).looks);
  });
});
