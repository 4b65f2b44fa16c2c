import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { demoConfig, demoConfigSmall } from "../config/demo";
import { fillLayerIds } from "../config/layer-ids";
import { newLayer } from "../config/layers";
import {
  BLEND_MODES, CHANNEL_ROLES, COLOR_ORDERS, CONFIG_FORMAT, CONTROL_EVENTS, CUES, EASINGS, GESTURES, LASTING_EVENTS, MOMENT_EVENTS, MOTIONS,
  configSchema, type Config, type Layer,
} from "../config/schema";
import { builtinSource } from "../template/builtins";
import { compileTemplate, renderTemplate } from "../template/compile";
import { readHeader } from "./readback";
import { ccCheck, hasCC, META } from "../template/test-helpers";
import { C_REFERENCE, hasCxx, TOOLCHAINS, walkTables } from "../template/test-compilers";

// Both forms of the generic header read back: version 1 (C's `[3] = { … }`) and version 2
// (`/* #3 */ { … }`, every field named, C and C++ alike). Files written by either are in the wild.
const FORMS = [1, 2].map((version) => {
  const compiled = compileTemplate(builtinSource("generic-header", version)!);
  if (!compiled.ok) throw new Error(`generic-header v${version} does not compile`);
  return {
    version,
    /** How an entry's line starts: `  [3] = {` or `  /* #3 *\/ {`. */
    entry: (n: number) => (version === 1 ? `  [${n}] = {` : `  /* #${n} */ {`),
    header: (config: Config): string => {
      const r = renderTemplate(compiled.template, config, META);
      if (!r.ok) throw new Error(r.errors[0].message);
      return r.output;
    },
  };
});
const header = FORMS[1].header;

describe("readHeader, version 2 only", () => {
  it("understands index comments only where an entry starts, and HB_EMPTY, 0 and nullptr where v2 writes them", () => {
    const small = demoConfigSmall();
    small.rig.buttons = [];
    small.controls = [];
    small.rig.board.inputPins = [];
    const h = header(small);
    expect(h).toContain(".input_pins = { HB_EMPTY }, .input_pin_count = 0,");
    expect(h).toMatch(/hb_buttons\[HB_BUTTON_COUNT \+ 1\] = \{\n {2}\{ HB_EMPTY \},\n\};/);
    expect(readHeader(h)).toEqual({ config: small, errors: [] });
    // A stray index comment inside an entry is a plain comment; `nullptr` reads as no string.
    const edited = h.replace(".pixels = 7,", ".pixels = /* #9 */ 7,").replace(".channel_id = 0,", ".channel_id = nullptr,");
    expect(edited).not.toBe(h);
    expect(readHeader(edited)).toEqual({ config: small, errors: [] });
  });

  it("reads an entry without an index as the one after the previous entry", () => {
    const lines = header(demoConfig()).split("\n");
    const n = lines.findIndex((l) => l.includes('.id = "chamber"'));
    lines[n] = lines[n].replace("/* #1 */ ", "");
    expect(readHeader(lines.join("\n"))).toEqual({ config: demoConfig(), errors: [] });
  });
});

describe.each(FORMS)("readHeader, generic-header v$version", ({ entry, header }) => {
  it("reads the demo header back to the same model", () => {
    expect(readHeader(header(demoConfig()))).toEqual({ config: demoConfig(), errors: [] });
  });

  it("reads a hand-edited file: reordered lines, changed numbers, comments added", () => {
    const lines = header(demoConfig()).split("\n");
    const at = (start: string) => lines.findIndex((l) => l.startsWith(start));
    const ch0 = at(entry(0) + ' .id = "blade"');
    [lines[ch0], lines[ch0 + 2]] = [lines[ch0 + 2], lines[ch0]];
    lines[ch0 + 1] = "  /* the chamber window strip */ " + lines[ch0 + 1].replace(".pixels = 7", ".pixels = 9") + " // edited";
    const power = at("  .brightness_cap");
    lines[power] = "  .brightness_cap = 0.45f, /* lower cap */";
    lines.splice(at("static const hb_fonts") + 1, 0, "  // fonts in order");
    const expected = demoConfig();
    expected.rig.channels[1].pixels = 9;
    expected.rig.power.brightnessCap = 0.45;
    expect(readHeader(lines.join("\n"))).toEqual({ config: expected, errors: [] });
  });

  it("points errors at the lines of the file", () => {
    const lines = header(demoConfig()).split("\n");
    const chLine = lines.findIndex((l) => l.includes('.id = "chamber"'));
    lines[chLine] = lines[chLine].replace("HB_ROLE_CHAMBER_STRIP", "HB_ROLE_CHAMBR").replace(".pin = 3", ".pim = 3");
    const btn = lines.findIndex((l) => l.includes('.id = "auxiliary"'));
    lines[btn] = lines[btn].replace(entry(1), entry(0));
    const r = readHeader(lines.join("\n"));
    expect(r.config).toBeNull();
    expect(r.errors.map((e) => [e.line, e.message])).toEqual([
      [chLine + 1, expect.stringMatching(/'.role': 'HB_ROLE_CHAMBR' is not one of HB_ROLE_MAIN_BLADE, HB_ROLE_CHAMBER_STRIP/)],
      [chLine + 1, "unknown field '.pim' in channel [1]"],
      [btn + 1, expect.stringMatching(/entry \[0\] of 'hb_buttons' is given twice \(first on line \d+\)/)],
    ]);
    expect(r.errors[0].column).toBe(lines[chLine].indexOf("HB_ROLE_CHAMBR") + 1);
  });

  it("catches derived fields a hand edit forgot (counts and indices the firmware reads)", () => {
    const lines = header(demoConfig()).split("\n");
    const n = lines.findIndex((l) => l.startsWith(entry(0) + ' .preset = 0, .channel_id = "blade"'));
    lines[n] = lines[n].replace(".layer_count = 8", ".layer_count = 9");
    const p = lines.findIndex((l) => l.includes('.font_id = "tidebreak"'));
    lines[p] = lines[p].replace(".font = 2", ".font = 1");
    const r = readHeader(lines.join("\n"));
    expect(r.config).toBeNull();
    expect(r.errors.map((e) => e.message)).toEqual([
      "'.font' is 1 but the index of its font is 2",
      "'.layer_count' is 9 but the number of layer entries pointing here is 8",
    ]);
  });

  it("checks values with the model's schema and points at the field", () => {
    const lines = header(demoConfig()).split("\n");
    const n = lines.findIndex((l) => l.includes('.id = "crystal"'));
    lines[n] = lines[n].replace(".pixels = 1", ".pixels = 0");
    const r = readHeader(lines.join("\n"));
    expect(r.errors).toHaveLength(1);
    expect(r.errors[0]).toMatchObject({ line: n + 1, column: lines[n].indexOf(".pixels") + 1 });
    expect(r.errors[0].message).toMatch(/^rig\.channels\.2\.pixels: /);
  });

  it("gives layers the derived ids a header cannot carry: render → read back → render is the same bytes", () => {
    for (const form of FORMS) {
      // Layers made in the editor have fresh random ids; the header does not print them.
      const c = demoConfig();
      c.presets[0].looks.blade.layers.splice(1, 0, newLayer("drift"));
      const first = form.header(c);
      const back = readHeader(first);
      expect(back.errors).toEqual([]);
      expect(form.header(back.config!)).toBe(first);
      // Read twice, the same ids; and they are the derived ones (as a "hiltbench.config/1" upgrade gives).
      expect(readHeader(first).config).toStrictEqual(back.config);
      expect(back.config!.presets[0].looks.blade.layers[1].id).toMatch(/^l-[0-9a-z]{6}$/);
      expect(back.config!.presets[0].looks.blade.layers[1].id).not.toBe(c.presets[0].looks.blade.layers[1].id);
    }
  });

  it("reports broken syntax, missing tables and garbage with a position", () => {
    expect(readHeader("static const hb_board_t hb_board = { .profile = \"x\" ").errors[0]).toMatchObject({ line: 1, message: "this '{' is never closed" });
    expect(readHeader("").errors[0].message).toBe("'hb_board' is missing");
    expect(readHeader("\u0000\u0001 binary \uFFFF").errors.length).toBeGreaterThan(0);
    expect(readHeader("hb_board = " + "{".repeat(100000)).errors[0]).toMatchObject({ line: 1, column: 20, message: "initializers are nested too deeply" });
    expect(readHeader("x".repeat(9 * 1024 * 1024)).errors[0].message).toMatch(/over the limit of 8388608/);
    expect(readHeader('hb_board = { .profile = "\\q" };').errors[0]).toMatchObject({ line: 1, column: 25, message: "unknown escape '\\q' in a string" });
  });
});

// ---------------------------------------------------------------- random valid configs

const id = fc.stringMatching(/^[a-z0-9][a-z0-9-]{0,8}$/);
// NUL is not model text any more: the schema refuses it, since PostgreSQL cannot store it (decision 011).
const text = fc.oneof(
  fc.string({ unit: "grapheme", minLength: 1, maxLength: 12 }).filter((s) => !s.includes("\u0000")),
  fc.string({ unit: fc.constantFrom('"', "\\", "?", "\n", "*", "/", "a", " ", "\t", "\u0001", "é", "🔥"), minLength: 1, maxLength: 20 }),
);
const color = fc.stringMatching(/^#[0-9a-fA-F]{6}$/);
const num = (min: number, max: number) => fc.double({ min, max, noNaN: true });
const int = (min: number, max: number) => fc.integer({ min, max });
const anyFinite = fc.double({ noNaN: true, noDefaultInfinity: true });
const frac = num(0, 1);

const common = fc.record(
  {
    enabled: fc.boolean(),
    opacity: frac,
    blend: fc.constantFrom(...BLEND_MODES),
    range: fc.record({ start: int(0, 4096), end: int(1, 4096) }),
    when: fc.constantFrom("always", "lit", "unlit"),
  },
  { requiredKeys: ["enabled", "opacity", "blend", "when"] },
);
const specific: fc.Arbitrary<Record<string, unknown>> = fc.oneof(
  fc.record({ kind: fc.constant("fill"), color }),
  fc.record({ kind: fc.constant("gradient"), stops: fc.array(fc.record({ at: frac, color }), { minLength: 2, maxLength: 4 }) }),
  fc.record({
    kind: fc.constant("drift"),
    colors: fc.array(color, { minLength: 2, maxLength: 4 }),
    bandPixels: int(1, 512),
    speedPixelsPerSecond: num(0, 2000),
    direction: fc.constantFrom("to-tip", "to-base"),
  }),
  fc.record({ kind: fc.constant("breathe"), color, periodMs: anyFinite, floor: frac, ceiling: frac }),
  fc.record({ kind: fc.constant("shimmer"), color, amount: frac, rateHz: anyFinite }),
  fc.record({ kind: fc.constant("spark"), event: fc.constantFrom(...MOMENT_EVENTS), color, position: frac, widthPixels: int(1, 4096), decayMs: anyFinite }),
  fc.record({ kind: fc.constant("hold"), event: fc.constantFrom(...LASTING_EVENTS), color, position: frac, widthPixels: int(1, 4096), flicker: frac }),
  fc.record({ kind: fc.constant("wipe"), event: fc.constantFrom("ignition", "retraction"), durationMs: anyFinite, easing: fc.constantFrom(...EASINGS) }),
  fc.record({ kind: fc.constant("mirror"), channelId: id, fit: fc.constantFrom("stretch", "crop") }),
);
const layer = fc.tuple(common, specific).map(([c, s]) => ({ ...c, ...s }) as Layer);
const state = fc.constantFrom("lit", "unlit", "any");

const configArb: fc.Arbitrary<Config> = fc.record({
  format: fc.constant(CONFIG_FORMAT),
  rig: fc.record({
    board: fc.record({
      profile: text,
      dataPins: fc.array(int(0, 255), { minLength: 1, maxLength: 6 }),
      inputPins: fc.array(int(0, 255), { maxLength: 4 }),
      maxPixelsPerPin: int(1, 4096),
      idleMilliamps: num(0, 2000),
    }),
    channels: fc.array(
      fc.record({ id, name: text, role: fc.constantFrom(...CHANNEL_ROLES), pixels: int(1, 2048), parallelStrips: int(1, 8), pin: int(0, 255), colorOrder: fc.constantFrom(...COLOR_ORDERS) }),
      { minLength: 1, maxLength: 3 },
    ),
    buttons: fc.array(fc.record({ id, name: text, kind: fc.constantFrom("activation", "auxiliary"), pin: int(0, 255) }), { maxLength: 2 }),
    power: fc.record({
      cellCapacityMah: num(50, 20000),
      cellNominalVolts: num(1, 30),
      cellMaxContinuousAmps: num(0.1, 100),
      wireGaugeAwg: int(10, 36),
      wireLengthMm: num(1, 2000),
      brightnessCap: frac,
      ledMilliampsPerColor: num(1, 100),
      pixelIdleMilliamps: num(0, 5),
    }),
    speaker: fc.record({ impedanceOhms: num(1, 64), ratedPowerWatts: num(0.1, 20), amplifierEfficiency: num(0.1, 1) }),
  }),
  fonts: fc.array(
    fc.record({ id, name: text, folder: text, status: fc.constantFrom("promised", "received", "invalid"), cues: fc.array(fc.constantFrom(...CUES), { maxLength: 10 }) }),
    { maxLength: 3 },
  ),
  presets: fc.array(
    fc.record({ id, name: text, fontId: id, looks: fc.dictionary(id, fc.record({ layers: fc.array(layer, { maxLength: 4 }) }), { maxKeys: 3 }) }),
    { maxLength: 3 },
  ),
  controls: fc.array(
    fc.record({
      event: fc.constantFrom(...CONTROL_EVENTS),
      trigger: fc.oneof(
        fc.record({ input: fc.constant("button" as const), buttonId: id, gesture: fc.constantFrom(...GESTURES), state }),
        fc.record({ input: fc.constant("motion" as const), motion: fc.constantFrom(...MOTIONS), state }),
      ),
    }),
    { maxLength: 4 },
  ),
  // Layers made without ids get the derived ones, which is what a read-back gives them.
}).map((c) => fillLayerIds(c)) as fc.Arbitrary<Config>;

describe("readHeader on random valid configs", () => {
  it("reads every rendered header back to an equal model, in either version's form", () => {
    fc.assert(
      fc.property(configArb, (config) => {
        expect(configSchema.safeParse(config).success).toBe(true);
        for (const form of FORMS) {
          const r = readHeader(form.header(config));
          expect(r.errors).toEqual([]);
          expect(r.config).toStrictEqual(configSchema.parse(config));
        }
      }),
      { numRuns: 150 },
    );
  }, 60_000);

  it.skipIf(!hasCC)("renders headers the C compiler accepts (outside judge: cc -std=c11 -Wall -Werror), v1 and v2", () => {
    fc.assert(
      fc.property(configArb, (config) => {
        for (const form of FORMS) ccCheck(form.header(config));
      }),
      { numRuns: 12 },
    );
  }, 120_000);

  // Firmware's view: a consumer program includes the v2 header, walks every table by its counts
  // and links and fails on any index out of range or any look whose layers are not its own;
  // built as C and as C++ it must read the same values that C reads from the v1 header.
  it.skipIf(!hasCxx || !C_REFERENCE)(`a consumer program walks every table in C and in C++ (${TOOLCHAINS.filter((t) => !t.name.includes("c17")).map((t) => t.name).join(", ")})`, () => {
    const chains = TOOLCHAINS.filter((t) => !t.name.includes("c17"));
    fc.assert(
      fc.property(configArb, (config) => {
        const reference = walkTables(FORMS[0].header(config), C_REFERENCE!);
        expect(reference.code, reference.stderr).toBe(0);
        const v2 = FORMS[1].header(config);
        for (const tc of chains) {
          const r = walkTables(v2, tc);
          expect(r.code, `${tc.name}: ${r.stderr}`).toBe(0);
          expect(r.stdout, tc.name).toBe(reference.stdout);
        }
      }),
      { numRuns: 8 },
    );
  }, 240_000);
});
