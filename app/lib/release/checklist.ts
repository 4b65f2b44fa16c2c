// The bench check: the list of things to try on the bench before a revision is released,
// generated from the revision's config. Pure. Only the ticks are stored (bench_check_ticks), so
// every item has a key that stays the same across revisions for the same thing: a preset's
// clash is `preset:<presetId>:clash` in revision 3 and in revision 9.
import type { BladeEvent, Config, Control, Cue, Font } from "../config/schema";

export type BenchGroupKind = "preset" | "channel" | "buttons" | "power" | "card";
export type BenchItem = {
  /** Stable across revisions for the same thing; at most 200 characters (the column's check). */
  key: string;
  label: string;
  /** A short hint under the label (what to look or listen for, where a figure comes from). */
  hint?: string;
  /** Marks a rule of thumb: common practice, not a figure from a data sheet. */
  commonPractice?: boolean;
};
export type BenchGroup = { key: string; kind: BenchGroupKind; title: string; items: BenchItem[] };

/** The preset events in the order a person tries them on the bench. */
const EVENT_ORDER: readonly BladeEvent[] = ["ignition", "retraction", "clash", "blast", "lockup", "drag", "auxiliary"];

const GESTURE_WORDS = { press: "Press", "double-press": "Press twice", "triple-press": "Press three times", hold: "Hold", "long-hold": "Hold for a long moment" } as const;
const MOTION_WORDS = { swing: "Swing the hilt", twist: "Twist the hilt", stab: "Stab forward", impact: "Hit something (gently, on the bench)" } as const;
const STATE_WORDS = { lit: " while lit", unlit: " while off", any: "" } as const;
const EFFECT_WORDS: Record<Control["event"], string> = {
  ignition: "lights the blade",
  retraction: "puts the blade away",
  clash: "fires the clash",
  blast: "fires the blast",
  lockup: "holds the lockup",
  drag: "holds the drag",
  auxiliary: "fires the auxiliary effect",
  "next-preset": "moves to the next preset",
  "previous-preset": "moves to the previous preset",
};

function eventItem(presetId: string, event: BladeEvent, font: Font | undefined): BenchItem {
  const key = `preset:${presetId}:${event}`;
  const has = (cue: Cue) => font?.cues.includes(cue) ?? false;
  const withSound = (cue: Cue, what: string) => (has(cue) ? ` and lands with the ${what} sound` : "");
  const plays = (cue: Cue) => (has(cue) ? ", with its sound" : "");
  switch (event) {
    case "ignition":
      return { key, label: `Ignition looks right on every channel${withSound("ignite", "ignite")}` };
    case "retraction":
      return { key, label: `Retraction looks right on every channel${withSound("retract", "retract")}` };
    case "clash":
      return { key, label: `Clash flashes${plays("clash")}` };
    case "blast":
      return { key, label: `Blast flashes${plays("blast")}` };
    case "lockup":
      return { key, label: `Lockup shows for as long as it is held${plays("lockup")}` };
    case "drag":
      return { key, label: `Drag shows at the tip for as long as it is held${plays("drag")}` };
    case "auxiliary":
      return { key, label: "The auxiliary effect shows and ends as it should" };
  }
}

/** How a control is fired, in plain words. */
export function controlWords(ctl: Control, c: Config): string {
  const t = ctl.trigger;
  if (t.input === "motion") return `${MOTION_WORDS[t.motion]}${STATE_WORDS[t.state]}`;
  const button = c.rig.buttons.find((b) => b.id === t.buttonId)?.name ?? t.buttonId;
  return `${GESTURE_WORDS[t.gesture]} ${button}${STATE_WORDS[t.state]}`;
}

function controlKey(ctl: Control): string {
  const t = ctl.trigger;
  return t.input === "motion" ? `control:${ctl.event}:motion:${t.motion}:${t.state}` : `control:${ctl.event}:button:${t.buttonId}:${t.gesture}:${t.state}`;
}

/** The bench check of a config, grouped, in the order the groups and items are worked through. */
export function benchChecklist(c: Config): BenchGroup[] {
  const fired = new Set(c.controls.map((x) => x.event));
  const events = EVENT_ORDER.filter((e) => fired.has(e));
  const groups: BenchGroup[] = [];

  for (const p of c.presets) {
    const font = c.fonts.find((f) => f.id === p.fontId);
    const fontName = font?.name ?? p.fontId;
    groups.push({
      key: `preset:${p.id}`,
      kind: "preset",
      title: `Preset: ${p.name}`,
      items: [
        { key: `preset:${p.id}:select`, label: `Select ${p.name}` },
        { key: `preset:${p.id}:font`, label: `The font ${fontName} plays (hum, and swing sounds when swung)` },
        ...events.map((e) => eventItem(p.id, e, font)),
      ],
    });
  }

  for (const ch of c.rig.channels) {
    const pixels = ch.pixels * ch.parallelStrips;
    groups.push({
      key: `channel:${ch.id}`,
      kind: "channel",
      title: `Channel: ${ch.name}`,
      items: [
        {
          key: `channel:${ch.id}:pixels`,
          label: `Every pixel lights at full white, briefly, at the brightness cap (${Math.round(c.rig.power.brightnessCap * 100)} %)`,
          hint: `${ch.pixels} pixel${ch.pixels === 1 ? "" : "s"}${ch.parallelStrips > 1 ? ` on each of ${ch.parallelStrips} strips in parallel (${pixels} in all)` : ""}; look for dark or odd-coloured pixels.`,
        },
        { key: `channel:${ch.id}:color-order`, label: `Colour order is right (${ch.colorOrder}): red shows red, green green, blue blue` },
      ],
    });
  }

  const seen = new Set<string>();
  const controls: BenchItem[] = [];
  for (const ctl of c.controls) {
    const key = controlKey(ctl);
    if (seen.has(key)) continue; // the same control twice is one thing to try
    seen.add(key);
    controls.push({ key, label: `${controlWords(ctl, c)}: ${EFFECT_WORDS[ctl.event]}` });
  }
  if (controls.length) groups.push({ key: "buttons", kind: "buttons", title: "Buttons and motions", items: controls });

  groups.push({
    key: "power",
    kind: "power",
    title: "Power",
    items: [
      { key: "power:cell-seated", label: "The cell is seated the right way round and secured so it cannot move" },
      { key: "power:charging", label: "Charging works as the cell maker's data says (charger, current, temperature)", hint: "The cell maker's data sheet and a qualified person come first." },
      {
        key: "power:no-hot-spots",
        label: "No hot spots after a few minutes lit (cell, leads, solder joints, blade connector)",
        hint: "A rule of thumb, not a rating: the cell maker's data, local rules and a qualified person decide what is safe.",
        commonPractice: true,
      },
    ],
  });

  groups.push({
    key: "card",
    kind: "card",
    title: "SD card",
    items: [{ key: "card:matches", label: "The SD card matches the bundle: Check a card reports no differences", hint: "Check a card is on the Bundle tab; choose the same template, names and card size as below." }],
  });
  return groups;
}

/** Every item of the check, in order. */
export function benchItems(c: Config): BenchItem[] {
  return benchChecklist(c).flatMap((g) => g.items);
}
