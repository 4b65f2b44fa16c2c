// The one typed truth for a build's configuration: zod schemas, with the TypeScript types
// inferred from them. The JSON form ("hiltbench.config/2") is the public exchange format, so
// field names here are part of a contract: add fields, never rename them. Older forms are
// upgraded when read (upgrade.ts); the format string says which form a document is.
import { z } from "zod";
import { badTextReason } from "../input/edges";

export const CONFIG_FORMAT = "hiltbench.config/2" as const;
/** The first form, before layers had ids; still read, upgraded on the way in (upgrade.ts). */
export const CONFIG_FORMAT_V1 = "hiltbench.config/1" as const;

/** Ids are short slugs so they survive being file names, JSON paths and C identifiers. */
export const idSchema = z
  .string()
  .regex(/^[a-z0-9][a-z0-9-]{0,47}$/, "use 1–48 lowercase letters, digits or dashes, starting with a letter or digit");

/**
 * Free text in the model: no NUL character and no lone UTF-16 surrogate, which PostgreSQL cannot
 * store (decision 011). The validator reports the field's path like any other schema issue.
 */
export const textSchema = () =>
  z.string().check((ctx) => {
    const reason = badTextReason(ctx.value);
    if (reason) ctx.issues.push({ code: "custom", input: ctx.value, message: `${reason.replace(/, which.*$/, "")}; remove it`, continue: false });
  });

export const colorSchema = z.string().regex(/^#[0-9a-fA-F]{6}$/, "a colour is written #rrggbb, e.g. #ff8800");

const finite = () => z.number().finite();
const fraction = () => finite().min(0).max(1);

export const EVENTS = ["ignition", "retraction", "clash", "blast", "lockup", "drag", "auxiliary"] as const;
export const eventSchema = z.enum(EVENTS);
export type BladeEvent = z.infer<typeof eventSchema>;

/** Events that happen at an instant (a spark answers these). */
export const MOMENT_EVENTS = ["ignition", "retraction", "clash", "blast", "auxiliary"] as const;
/** Events that last a while (a hold answers these). */
export const LASTING_EVENTS = ["lockup", "drag", "auxiliary"] as const;

export const BLEND_MODES = ["normal", "add", "multiply", "screen"] as const;
export const CHANNEL_ROLES = ["main-blade", "chamber-strip", "accent-pixel", "custom"] as const;
export const COLOR_ORDERS = ["RGB", "RBG", "GRB", "GBR", "BRG", "BGR"] as const;
export const EASINGS = ["linear", "ease-in", "ease-out", "ease-in-out"] as const;
export const CUES = ["hum", "swing", "clash", "blast", "lockup", "drag", "ignite", "retract", "boot", "name"] as const;
export const cueSchema = z.enum(CUES);
export type Cue = z.infer<typeof cueSchema>;

// ---------------------------------------------------------------- rig

export const boardSchema = z.strictObject({
  profile: textSchema().min(1).max(80),
  /** GPIO numbers that can drive an LED data line. */
  dataPins: z.array(z.number().int().min(0).max(255)).min(1).max(64),
  /** GPIO numbers that can read a button. */
  inputPins: z.array(z.number().int().min(0).max(255)).max(64),
  maxPixelsPerPin: z.number().int().min(1).max(4096),
  /** Current the board itself draws while running, before LEDs and audio. */
  idleMilliamps: finite().min(0).max(2000),
});

export const channelSchema = z.strictObject({
  id: idSchema,
  name: textSchema().min(1).max(60),
  role: z.enum(CHANNEL_ROLES),
  /** Pixels on one strip. */
  pixels: z.number().int().min(1).max(2048),
  /** Identical strips wired in parallel on the same data line (they show the same frame). */
  parallelStrips: z.number().int().min(1).max(8),
  pin: z.number().int().min(0).max(255),
  colorOrder: z.enum(COLOR_ORDERS),
});

export const buttonSchema = z.strictObject({
  id: idSchema,
  name: textSchema().min(1).max(60),
  kind: z.enum(["activation", "auxiliary"]),
  pin: z.number().int().min(0).max(255),
});

export const powerSchema = z.strictObject({
  cellCapacityMah: finite().min(50).max(20000),
  cellNominalVolts: finite().min(1).max(30),
  cellMaxContinuousAmps: finite().min(0.1).max(100),
  wireGaugeAwg: z.number().int().min(10).max(36),
  /** One-way length from the cell to the blade connector; the drop counts both conductors. */
  wireLengthMm: finite().min(1).max(2000),
  /** Global brightness multiplier applied after every look (0–1). */
  brightnessCap: fraction(),
  /** Current of one colour channel of one pixel at full on (common practice: about 20 mA). */
  ledMilliampsPerColor: finite().min(1).max(100),
  /** Quiescent current of one pixel with all colours off. */
  pixelIdleMilliamps: finite().min(0).max(5),
});

export const speakerSchema = z.strictObject({
  impedanceOhms: finite().min(1).max(64),
  ratedPowerWatts: finite().min(0.1).max(20),
  /** Amplifier efficiency used to turn audio power into cell current (assumption, not measured). */
  amplifierEfficiency: fraction().min(0.1),
});

export const rigSchema = z.strictObject({
  board: boardSchema,
  channels: z.array(channelSchema).min(1).max(16),
  buttons: z.array(buttonSchema).max(8),
  power: powerSchema,
  speaker: speakerSchema,
});

// ---------------------------------------------------------------- fonts

export const fontSchema = z.strictObject({
  id: idSchema,
  name: textSchema().min(1).max(60),
  /** Folder name on the SD card. */
  folder: textSchema().min(1).max(64),
  status: z.enum(["promised", "received", "invalid"]),
  /** Cues the received files provide (empty while promised). */
  cues: z.array(cueSchema).max(CUES.length),
  /** Length of the font's first ignite and retract sounds, set when its files are checked. */
  igniteMs: finite().min(0).max(600000).optional(),
  retractMs: finite().min(0).max(600000).optional(),
});

// ---------------------------------------------------------------- layers and looks

const rangeSchema = z.strictObject({
  /** First pixel (0 = base). */
  start: z.number().int().min(0).max(4096),
  /** One past the last pixel. */
  end: z.number().int().min(1).max(4096),
});

const layerCommon = {
  /** Stable within its look across reorders and edits ("l-" + 6 base-36 characters when made here; see layer-ids.ts). */
  id: idSchema,
  enabled: z.boolean(),
  opacity: fraction(),
  blend: z.enum(BLEND_MODES),
  /** Restrict the layer to some pixels of the channel. */
  range: rangeSchema.optional(),
  /** Show the layer always, only while the blade is lit, or only while it is not. */
  when: z.enum(["always", "lit", "unlit"]),
};

export const fillLayer = z.strictObject({ kind: z.literal("fill"), ...layerCommon, color: colorSchema });

export const gradientLayer = z.strictObject({
  kind: z.literal("gradient"),
  ...layerCommon,
  /** Stops along the channel, `at` from 0 (base) to 1 (tip). */
  stops: z.array(z.strictObject({ at: fraction(), color: colorSchema })).min(2).max(16),
});

export const driftLayer = z.strictObject({
  kind: z.literal("drift"),
  ...layerCommon,
  /** Colours of the repeating bands, in order. */
  colors: z.array(colorSchema).min(2).max(8),
  bandPixels: z.number().int().min(1).max(512),
  speedPixelsPerSecond: finite().min(0).max(2000),
  direction: z.enum(["to-tip", "to-base"]),
});

export const breatheLayer = z.strictObject({
  kind: z.literal("breathe"),
  ...layerCommon,
  color: colorSchema,
  periodMs: finite(),
  floor: fraction(),
  ceiling: fraction(),
});

export const shimmerLayer = z.strictObject({
  kind: z.literal("shimmer"),
  ...layerCommon,
  color: colorSchema,
  /** How far brightness may dip, 0 (steady) to 1 (full flicker). */
  amount: fraction(),
  rateHz: finite(),
});

export const sparkLayer = z.strictObject({
  kind: z.literal("spark"),
  ...layerCommon,
  event: z.enum(MOMENT_EVENTS),
  color: colorSchema,
  /** Centre of the flash, 0 (base) to 1 (tip). */
  position: fraction(),
  widthPixels: z.number().int().min(1).max(4096),
  decayMs: finite(),
});

export const holdLayer = z.strictObject({
  kind: z.literal("hold"),
  ...layerCommon,
  event: z.enum(LASTING_EVENTS),
  color: colorSchema,
  position: fraction(),
  widthPixels: z.number().int().min(1).max(4096),
  flicker: fraction(),
});

export const wipeLayer = z.strictObject({
  kind: z.literal("wipe"),
  ...layerCommon,
  event: z.enum(["ignition", "retraction"]),
  durationMs: finite(),
  easing: z.enum(EASINGS),
});

export const mirrorLayer = z.strictObject({
  kind: z.literal("mirror"),
  ...layerCommon,
  channelId: idSchema,
  fit: z.enum(["stretch", "crop"]),
});

export const layerSchema = z.discriminatedUnion("kind", [
  fillLayer,
  gradientLayer,
  driftLayer,
  breatheLayer,
  shimmerLayer,
  sparkLayer,
  holdLayer,
  wipeLayer,
  mirrorLayer,
]);
export const LAYER_KINDS = ["fill", "gradient", "drift", "breathe", "shimmer", "spark", "hold", "wipe", "mirror"] as const;
export const MAX_LAYERS_PER_LOOK = 256;

export const lookSchema = z.strictObject({
  layers: z.array(layerSchema).max(MAX_LAYERS_PER_LOOK),
});

export const presetSchema = z.strictObject({
  id: idSchema,
  name: textSchema().min(1).max(60),
  fontId: idSchema,
  /** One look per channel, keyed by channel id. */
  looks: z.record(idSchema, lookSchema),
});

// ---------------------------------------------------------------- controls

export const GESTURES = ["press", "double-press", "triple-press", "hold", "long-hold"] as const;
export const MOTIONS = ["swing", "twist", "stab", "impact"] as const;
export const CONTROL_EVENTS = [...EVENTS, "next-preset", "previous-preset"] as const;

export const triggerSchema = z.discriminatedUnion("input", [
  z.strictObject({
    input: z.literal("button"),
    buttonId: idSchema,
    gesture: z.enum(GESTURES),
    /** Whether the gesture counts while the blade is lit, unlit, or either. */
    state: z.enum(["lit", "unlit", "any"]),
  }),
  z.strictObject({
    input: z.literal("motion"),
    motion: z.enum(MOTIONS),
    state: z.enum(["lit", "unlit", "any"]),
  }),
]);

export const controlSchema = z.strictObject({
  event: z.enum(CONTROL_EVENTS),
  trigger: triggerSchema,
});

// ---------------------------------------------------------------- the whole config

export const configSchema = z.strictObject({
  format: z.literal(CONFIG_FORMAT),
  rig: rigSchema,
  fonts: z.array(fontSchema).max(200),
  presets: z.array(presetSchema).max(500),
  controls: z.array(controlSchema).max(64),
});

export type Config = z.infer<typeof configSchema>;
export type Rig = Config["rig"];
export type Board = Rig["board"];
export type Channel = Rig["channels"][number];
export type Button = Rig["buttons"][number];
export type Power = Rig["power"];
export type Speaker = Rig["speaker"];
export type Font = Config["fonts"][number];
export type Preset = Config["presets"][number];
export type Look = z.infer<typeof lookSchema>;
export type Layer = z.infer<typeof layerSchema>;
export type LayerKind = Layer["kind"];
export type LayerOf<K extends LayerKind> = Extract<Layer, { kind: K }>;
export type Control = Config["controls"][number];
export type Trigger = Control["trigger"];
export type ControlEvent = Control["event"];
