// The demo workshop's configs (Ember & Anvil Props). Everything here is invented: the builds
// are named after fictional birds of prey, the fonts after invented weather.
import { fillLayerIds } from "./layer-ids";
import { newLayer } from "./layers";
import { CONFIG_FORMAT, type Config, type Look, type Preset } from "./schema";

const BLADE = "blade";
const CHAMBER = "chamber";
const CRYSTAL = "crystal";

function bladeLook(base: string, accent: string, extra: Look["layers"] = []): Look {
  return {
    layers: [
      newLayer("fill", { color: base }),
      ...extra,
      newLayer("shimmer", { amount: 0.12, rateHz: 16 }),
      newLayer("spark", { event: "clash", color: "#ffffff", position: 0.5, widthPixels: 264, decayMs: 160 }),
      newLayer("spark", { event: "blast", color: accent, position: 0.62, widthPixels: 20, decayMs: 260 }),
      newLayer("hold", { event: "lockup", color: "#fff4b0", position: 0.55, widthPixels: 22, flicker: 0.7 }),
      newLayer("hold", { event: "drag", color: "#ffb347", position: 1, widthPixels: 10, flicker: 0.8 }),
      newLayer("wipe", { event: "ignition", durationMs: 340, easing: "ease-out" }),
      newLayer("wipe", { event: "retraction", durationMs: 520, easing: "ease-in" }),
    ],
  };
}

function chamberLook(color: string): Look {
  return {
    layers: [
      newLayer("breathe", { color, periodMs: 2600, floor: 0.2, ceiling: 0.9, when: "unlit" }),
      newLayer("fill", { color, when: "lit" }),
      newLayer("mirror", { channelId: BLADE, fit: "stretch", when: "lit", blend: "screen", opacity: 0.5 }),
    ],
  };
}

function crystalLook(color: string): Look {
  return {
    layers: [
      newLayer("breathe", { color, periodMs: 3200, floor: 0.1, ceiling: 0.8 }),
      newLayer("spark", { event: "auxiliary", color: "#ffffff", position: 0, widthPixels: 1, decayMs: 400 }),
    ],
  };
}

function preset(id: string, name: string, fontId: string, blade: Look, chamber: string, crystal: string): Preset {
  return { id, name, fontId, looks: { [BLADE]: blade, [CHAMBER]: chamberLook(chamber), [CRYSTAL]: crystalLook(crystal) } };
}

/**
 * The demo's layers get derived ids (preset, channel, position), not fresh ones: every call
 * gives the same document, exactly what upgrading its "hiltbench.config/1" form gives.
 */
function withDerivedIds(c: Config): Config {
  const bare = { ...c, presets: c.presets.map((p) => ({ ...p, looks: Object.fromEntries(Object.entries(p.looks).map(([k, look]) => [k, { layers: look.layers.map(({ id: _, ...l }) => l) }])) })) };
  return fillLayerIds(bare) as Config;
}

/** A complete, valid config: three channels, two buttons, four fonts received and one promised, five presets. */
export function demoConfig(): Config {
  return withDerivedIds({
    format: CONFIG_FORMAT,
    rig: {
      board: {
        profile: "Generic 32-bit sound board",
        dataPins: [2, 3, 4, 5],
        inputPins: [6, 7, 8],
        maxPixelsPerPin: 300,
        idleMilliamps: 90,
      },
      channels: [
        { id: BLADE, name: "Main blade", role: "main-blade", pixels: 132, parallelStrips: 2, pin: 2, colorOrder: "GRB" },
        { id: CHAMBER, name: "Chamber window", role: "chamber-strip", pixels: 7, parallelStrips: 1, pin: 3, colorOrder: "GRB" },
        { id: CRYSTAL, name: "Crystal", role: "accent-pixel", pixels: 1, parallelStrips: 1, pin: 4, colorOrder: "RGB" },
      ],
      buttons: [
        { id: "activation", name: "Activation", kind: "activation", pin: 6 },
        { id: "auxiliary", name: "Auxiliary", kind: "auxiliary", pin: 7 },
      ],
      power: {
        cellCapacityMah: 3000,
        cellNominalVolts: 3.6,
        cellMaxContinuousAmps: 20,
        wireGaugeAwg: 22,
        wireLengthMm: 150,
        brightnessCap: 0.6,
        ledMilliampsPerColor: 20,
        pixelIdleMilliamps: 0.6,
      },
      speaker: { impedanceOhms: 4, ratedPowerWatts: 3, amplifierEfficiency: 0.8 },
    },
    fonts: [
      { id: "ashfall", name: "Ashfall", folder: "ashfall", status: "received", cues: ["hum", "swing", "clash", "blast", "lockup", "drag", "ignite", "retract", "boot", "name"] },
      { id: "glasswind", name: "Glasswind", folder: "glasswind", status: "received", cues: ["hum", "swing", "clash", "blast", "lockup", "drag", "ignite", "retract"] },
      { id: "tidebreak", name: "Tidebreak", folder: "tidebreak", status: "received", cues: ["hum", "swing", "clash", "blast", "lockup", "drag", "ignite", "retract"] },
      { id: "emberdusk", name: "Emberdusk", folder: "emberdusk", status: "received", cues: ["hum", "swing", "clash", "blast", "lockup", "drag", "ignite", "retract", "boot"] },
      { id: "northlight", name: "Northlight", folder: "northlight", status: "promised", cues: [] },
    ],
    presets: [
      preset("ashfall", "Ashfall", "ashfall", bladeLook("#ff4a1c", "#ffd27a"), "#ff6a00", "#ff3300"),
      preset(
        "glasswind",
        "Glasswind",
        "glasswind",
        bladeLook("#7fd8ff", "#ffffff", [
          newLayer("drift", { colors: ["#7fd8ff", "#2a6cff"], bandPixels: 16, speedPixelsPerSecond: 30, opacity: 0.5 }),
        ]),
        "#4fb0ff",
        "#bfeaff",
      ),
      preset(
        "tidebreak",
        "Tidebreak",
        "tidebreak",
        bladeLook("#1450ff", "#9fd0ff", [
          newLayer("gradient", {
            stops: [
              { at: 0, color: "#1450ff" },
              { at: 1, color: "#00c2b8" },
            ],
            opacity: 0.6,
          }),
        ]),
        "#1450ff",
        "#00c2b8",
      ),
      preset(
        "emberdusk",
        "Emberdusk",
        "emberdusk",
        bladeLook("#b3124a", "#ff8a3d", [newLayer("breathe", { color: "#ff5a2a", periodMs: 1800, floor: 0.3, ceiling: 0.8, opacity: 0.5, blend: "add" })]),
        "#b3124a",
        "#ff8a3d",
      ),
      preset("northlight", "Northlight", "northlight", bladeLook("#3cff8f", "#d8ffe9"), "#1fd17a", "#d8ffe9"),
    ],
    controls: [
      { event: "ignition", trigger: { input: "button", buttonId: "activation", gesture: "press", state: "unlit" } },
      { event: "retraction", trigger: { input: "button", buttonId: "activation", gesture: "hold", state: "lit" } },
      { event: "blast", trigger: { input: "button", buttonId: "activation", gesture: "press", state: "lit" } },
      { event: "clash", trigger: { input: "motion", motion: "impact", state: "lit" } },
      { event: "lockup", trigger: { input: "button", buttonId: "auxiliary", gesture: "hold", state: "lit" } },
      { event: "drag", trigger: { input: "motion", motion: "stab", state: "lit" } },
      { event: "auxiliary", trigger: { input: "button", buttonId: "auxiliary", gesture: "press", state: "lit" } },
      { event: "next-preset", trigger: { input: "button", buttonId: "auxiliary", gesture: "press", state: "unlit" } },
      { event: "previous-preset", trigger: { input: "button", buttonId: "auxiliary", gesture: "double-press", state: "unlit" } },
    ],
  });
}

/** A second, smaller demo: same rig family, fewer presets, for the "Harrier" build. */
export function demoConfigSmall(): Config {
  const c = demoConfig();
  c.presets = c.presets.slice(1, 3);
  c.fonts = c.fonts.filter((f) => f.id === "glasswind" || f.id === "tidebreak");
  return c;
}
