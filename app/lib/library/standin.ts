// A stand-in rig for a library preset: one channel per role at the pixel count the look was made
// on, a generous board, one received font, the usual controls. The validator and the look
// preview run on it, so a library preset is checked like a build's preset without a build.
import { CONFIG_FORMAT, CUES, type Config } from "../config/schema";
import { roleLabel, sortedRoles, type PresetBody } from "./format";

export const STANDIN_PRESET_ID = "library";
export const STANDIN_FONT_ID = "font";

/** The role's channel id on the stand-in rig is the role key itself. */
export function standInConfig(body: PresetBody, pixelsByRole: Record<string, number> = {}): Config {
  const roles = sortedRoles(Object.keys(body.looks));
  const channels = roles.map((role, i) => ({
    id: role,
    name: roleLabel(role).replace(/^./, (c) => c.toUpperCase()).slice(0, 60),
    role: role.startsWith("custom-") ? ("custom" as const) : (role as "main-blade" | "chamber-strip" | "accent-pixel"),
    pixels: pixelsByRole[role] ?? body.looks[role].pixels,
    parallelStrips: 1,
    pin: i,
    colorOrder: "GRB" as const,
  }));
  return {
    format: CONFIG_FORMAT,
    rig: {
      board: { profile: "Stand-in rig", dataPins: roles.map((_, i) => i), inputPins: [20, 21], maxPixelsPerPin: 2048, idleMilliamps: 90 },
      channels,
      buttons: [
        { id: "activation", name: "Activation", kind: "activation", pin: 20 },
        { id: "auxiliary", name: "Auxiliary", kind: "auxiliary", pin: 21 },
      ],
      power: { cellCapacityMah: 3000, cellNominalVolts: 3.6, cellMaxContinuousAmps: 20, wireGaugeAwg: 22, wireLengthMm: 150, brightnessCap: 0.6, ledMilliampsPerColor: 20, pixelIdleMilliamps: 0.6 },
      speaker: { impedanceOhms: 4, ratedPowerWatts: 3, amplifierEfficiency: 0.8 },
    },
    fonts: [{ id: STANDIN_FONT_ID, name: "Stand-in font", folder: "font", status: "received", cues: [...CUES] }],
    presets: [{ id: STANDIN_PRESET_ID, name: body.name || "Library preset", fontId: STANDIN_FONT_ID, looks: Object.fromEntries(roles.map((r) => [r, { layers: body.looks[r].layers }])) }],
    controls: [
      { event: "ignition", trigger: { input: "button", buttonId: "activation", gesture: "press", state: "unlit" } },
      { event: "retraction", trigger: { input: "button", buttonId: "activation", gesture: "hold", state: "lit" } },
      { event: "blast", trigger: { input: "button", buttonId: "activation", gesture: "press", state: "lit" } },
      { event: "clash", trigger: { input: "motion", motion: "impact", state: "lit" } },
      { event: "lockup", trigger: { input: "button", buttonId: "auxiliary", gesture: "hold", state: "lit" } },
      { event: "drag", trigger: { input: "motion", motion: "stab", state: "lit" } },
      { event: "auxiliary", trigger: { input: "button", buttonId: "auxiliary", gesture: "press", state: "lit" } },
    ],
  };
}
