// The words a person reads for a place in the config and a value: "Preset Ashfall",
// "Channel Main blade", "layer 2 (drift)", "speed", "12 → 8 px/s". Pure.

const FIELDS: Record<string, [label: string, unit?: string]> = {
  format: ["format"],
  id: ["id"],
  profile: ["board profile"],
  dataPins: ["LED data pins"],
  inputPins: ["button pins"],
  maxPixelsPerPin: ["max pixels per pin"],
  idleMilliamps: ["idle current", "mA"],
  name: ["name"],
  role: ["role"],
  pixels: ["pixels"],
  parallelStrips: ["parallel strips"],
  pin: ["pin"],
  colorOrder: ["colour order"],
  kind: ["kind"],
  cellCapacityMah: ["cell capacity", "mAh"],
  cellNominalVolts: ["nominal voltage", "V"],
  cellMaxContinuousAmps: ["max continuous discharge", "A"],
  wireGaugeAwg: ["wire gauge", "AWG"],
  wireLengthMm: ["wire length", "mm"],
  brightnessCap: ["brightness cap"],
  ledMilliampsPerColor: ["LED current per colour", "mA"],
  pixelIdleMilliamps: ["pixel idle current", "mA"],
  impedanceOhms: ["impedance", "Ω"],
  ratedPowerWatts: ["rated power", "W"],
  amplifierEfficiency: ["amplifier efficiency"],
  folder: ["folder"],
  status: ["status"],
  cues: ["cues"],
  fontId: ["font"],
  enabled: ["enabled"],
  opacity: ["opacity"],
  blend: ["blend"],
  range: ["range"],
  start: ["start"],
  end: ["end"],
  when: ["shown"],
  color: ["colour"],
  stops: ["stops"],
  colors: ["colours"],
  bandPixels: ["band", "px"],
  speedPixelsPerSecond: ["speed", "px/s"],
  direction: ["direction"],
  periodMs: ["period", "ms"],
  floor: ["floor"],
  ceiling: ["ceiling"],
  amount: ["amount"],
  rateHz: ["rate", "Hz"],
  event: ["event"],
  position: ["position"],
  widthPixels: ["width", "px"],
  decayMs: ["decay", "ms"],
  flicker: ["flicker"],
  durationMs: ["duration", "ms"],
  easing: ["easing"],
  channelId: ["channel"],
  fit: ["fit"],
  trigger: ["trigger"],
  input: ["input"],
  buttonId: ["button"],
  gesture: ["gesture"],
  motion: ["motion"],
  state: ["state"],
  looks: ["looks"],
  layers: ["layers"],
  board: ["Board"],
  power: ["Cell and wiring"],
  speaker: ["Speaker"],
};

export function fieldLabel(prop: string): string {
  return FIELDS[prop]?.[0] ?? prop;
}
export function fieldUnit(prop: string): string | undefined {
  return FIELDS[prop]?.[1];
}

/** A value as a person reads it: text as is, lists joined, missing as "none". */
export function valueText(v: unknown): string {
  if (v === undefined || v === null) return "none";
  if (typeof v === "string") return v === "" ? '""' : v;
  if (typeof v === "number" || typeof v === "boolean") return v === true ? "yes" : v === false ? "no" : String(v);
  if (Array.isArray(v)) return v.length === 0 ? "none" : v.map((x) => (x && typeof x === "object" ? compact(x) : valueText(x))).join(", ");
  return compact(v);
}

function compact(v: object): string {
  const o = v as Record<string, unknown>;
  if ("start" in o && "end" in o && Object.keys(o).length === 2) return `${o.start}–${o.end}`;
  if ("at" in o && "color" in o) return `${o.color} at ${o.at}`;
  return Object.entries(o)
    .filter(([, x]) => x !== undefined)
    .map(([k, x]) => `${fieldLabel(k)} ${valueText(x)}`)
    .join(", ");
}

export function fromTo(prop: string, before: unknown, after: unknown): string {
  const unit = fieldUnit(prop);
  return `${valueText(before)} → ${valueText(after)}${unit && typeof after === "number" ? ` ${unit}` : ""}`;
}

const LIST_NOUN: Record<string, string> = { channels: "Channel", buttons: "Button", fonts: "Font", presets: "Preset" };

/**
 * The crumb for an item of a keyed list: "Preset Ashfall", "Channel Main blade",
 * "layer 2 (drift)", "control clash (motion impact, lit)". `position` is 1-based.
 */
export function itemCrumb(listProp: string, item: unknown, position: number): string {
  const o = (item ?? {}) as Record<string, unknown>;
  if (listProp === "layers") return `layer ${position} (${String(o.kind ?? "?")})`;
  if (listProp === "controls") {
    const t = (o.trigger ?? {}) as Record<string, unknown>;
    const how = t.input === "button" ? `button ${t.buttonId} ${t.gesture}` : `motion ${t.motion}`;
    return `control ${String(o.event ?? "?")} (${how}, ${t.state ?? "any"})`;
  }
  const noun = LIST_NOUN[listProp] ?? fieldLabel(listProp);
  return `${noun} ${typeof o.name === "string" && o.name ? o.name : typeof o.id === "string" ? o.id : `#${position}`}`;
}

/** A list item's noun without its position, for moves: "layer (drift)". */
export function movedCrumb(listProp: string, item: unknown): string {
  if (listProp === "layers") return `layer (${String((item as { kind?: unknown })?.kind ?? "?")})`;
  return itemCrumb(listProp, item, 0);
}

/** The crumb for a look: the channel's name in the config (else its id). */
export function channelName(config: unknown, channelId: string): string {
  const chans = ((config as { rig?: { channels?: unknown } })?.rig?.channels ?? []) as { id?: string; name?: string }[];
  return (Array.isArray(chans) ? chans.find((c) => c?.id === channelId)?.name : undefined) ?? channelId;
}
