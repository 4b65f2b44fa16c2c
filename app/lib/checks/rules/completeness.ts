// A config can be well-formed and still leave the client stuck: a channel with no look, no way
// to ignite, a font that never arrived, an effect nothing can fire.
import type { BladeEvent, Cue, Layer } from "../../config/schema";
import { layerPath, lookPath, plural, type RuleContext } from "./context";

/** The sound cue a layer answering an event would want the font to play with it. */
const CUE_FOR_EVENT: Partial<Record<BladeEvent, Cue>> = {
  ignition: "ignite",
  retraction: "retract",
  clash: "clash",
  blast: "blast",
  lockup: "lockup",
  drag: "drag",
};

function answeredEvent(layer: Layer): BladeEvent | null {
  if (!layer.enabled) return null;
  if (layer.kind === "spark" || layer.kind === "hold" || layer.kind === "wipe") return layer.event;
  return null;
}

export function completenessRules(ctx: RuleContext): void {
  const { config, sink } = ctx;
  if (config.presets.length === 0) sink.error("no-presets", "presets", "The config has no presets, so the blade has nothing to show.", "Add at least one preset.");

  // Events the looks answer, with the first layer that does (for effect-without-control).
  const answered = new Map<BladeEvent, string>();
  const fontsUsed = new Set<string>();
  const cuesByFont = new Map<string, Set<Cue>>();

  config.presets.forEach((p, pi) => {
    fontsUsed.add(p.fontId);
    const wanted = new Set<Cue>(["hum"]);
    for (const channel of config.rig.channels) {
      const look = p.looks[channel.id];
      if (!look) {
        sink.error("missing-look", lookPath(pi, channel.id), `Preset "${p.name}" has no look for channel "${channel.name}".`, "Add a look for it (an empty fill keeps it dark on purpose).");
        continue;
      }
      if (!look.layers.some((l) => l.enabled)) sink.warning("empty-look", lookPath(pi, channel.id), `The ${channel.name} look of "${p.name}" has no enabled layers, so the channel stays dark.`, "Add a layer, or enable one that is switched off.");
      let ignitionWipe = false;
      let retractionWipe = false;
      look.layers.forEach((layer, li) => {
        const event = answeredEvent(layer);
        if (!event) return;
        if (!answered.has(event)) answered.set(event, layerPath(pi, channel.id, li));
        const cue = CUE_FOR_EVENT[event];
        if (cue) wanted.add(cue);
        if (layer.kind === "wipe") {
          if (layer.event === "ignition") ignitionWipe = true;
          else retractionWipe = true;
        }
      });
      if (channel.role === "main-blade") {
        if (!ignitionWipe) sink.warning("blade-without-ignition-wipe", lookPath(pi, channel.id), `The ${channel.name} look of "${p.name}" has no ignition wipe, so the blade appears all at once.`, "Add a wipe layer for ignition, timed to the font's ignite sound.");
        if (!retractionWipe) sink.warning("blade-without-retraction-wipe", lookPath(pi, channel.id), `The ${channel.name} look of "${p.name}" has no retraction wipe, so the blade vanishes all at once.`, "Add a wipe layer for retraction, timed to the font's retract sound.");
      }
    }
    const font = ctx.fonts.get(p.fontId);
    if (!font) return;
    const path = `presets[${pi}].fontId`;
    if (font.status === "promised") sink.warning("font-promised", path, `Preset "${p.name}" uses font "${font.name}", which the client promised but has not sent yet.`, "Ask the client for the font, or pick another until it arrives.");
    else if (font.status === "invalid") sink.error("font-invalid", path, `Preset "${p.name}" uses font "${font.name}", whose files failed the checks.`, "Open the font's check report and ask the client for fixed files.");
    else {
      let have = cuesByFont.get(font.id);
      if (!have) cuesByFont.set(font.id, (have = new Set(font.cues)));
      const missing = [...wanted].filter((c) => !have.has(c));
      if (missing.length > 0) sink.warning("font-missing-cue", path, `Font "${font.name}" has no ${missing.join(", ")} sound${missing.length === 1 ? "" : "s"}, but preset "${p.name}" uses ${missing.length === 1 ? "it" : "them"}.`, "These effects will play silently; ask for the missing files or accept it.");
    }
  });

  config.fonts.forEach((f, fi) => {
    if (!fontsUsed.has(f.id)) sink.info("font-unused", `fonts[${fi}]`, `Font "${f.name}" is not used by any preset.`, "Add a preset for it, or leave it off the SD card.");
  });

  controlRules(ctx, answered);
}

const STATES_OVERLAP = (a: string, b: string) => a === "any" || b === "any" || a === b;

function controlRules(ctx: RuleContext, answered: Map<BladeEvent, string>): void {
  const { config, sink } = ctx;
  const fired = new Set<string>();
  const byInput = new Map<string, { index: number; state: string; event: string }[]>();
  let ignition = "none" as "ok" | "lit-only" | "none";
  let retraction = "none" as "ok" | "unlit-only" | "none";

  config.controls.forEach((c, ci) => {
    const t = c.trigger;
    const usable = t.input === "motion" || ctx.buttons.has(t.buttonId);
    if (usable) fired.add(c.event);
    if (usable && c.event === "ignition") ignition = t.state === "lit" ? (ignition === "ok" ? "ok" : "lit-only") : "ok";
    if (usable && c.event === "retraction") retraction = t.state === "unlit" ? (retraction === "ok" ? "ok" : "unlit-only") : "ok";
    const key = t.input === "button" ? `button ${t.buttonId} ${t.gesture}` : `motion ${t.motion}`;
    const list = byInput.get(key) ?? [];
    const clash = list.find((o) => STATES_OVERLAP(o.state, t.state));
    if (clash) {
      const what = t.input === "button" ? `${t.gesture} on button "${t.buttonId}"` : `the ${t.motion} motion`;
      sink.error("duplicate-trigger", `controls[${ci}].trigger`, `${what} already fires ${clash.event} (controls[${clash.index}]) in an overlapping blade state, so it cannot also fire ${c.event}.`, "Use another gesture, or limit one of them to lit or unlit.");
    }
    list.push({ index: ci, state: t.state, event: c.event });
    byInput.set(key, list);

    const wantsEffect = c.event === "clash" || c.event === "blast" || c.event === "lockup" || c.event === "drag" || c.event === "auxiliary";
    if (wantsEffect && !answered.has(c.event as BladeEvent) && !fontsPlay(ctx, c.event as BladeEvent))
      sink.warning("control-without-effect", `controls[${ci}].event`, `The ${c.event} control fires an event that no look shows and no font plays.`, `Add a spark or hold for ${c.event} to a look, or remove the control.`);
  });

  if (ignition !== "ok")
    sink.error("no-ignition-control", "controls", ignition === "lit-only" ? "Ignition is bound only while the blade is already lit, so the blade can never be ignited." : "No control fires ignition, so the blade can never be lit.", "Bind ignition to a gesture of the activation button with state unlit or any.");
  if (retraction !== "ok")
    sink.error("no-retraction-control", "controls", retraction === "unlit-only" ? "Retraction is bound only while the blade is unlit, so a lit blade can never be put away." : "No control fires retraction, so a lit blade can never be put away.", "Bind retraction to a gesture with state lit or any.");

  const usedButtons = new Set(config.controls.flatMap((c) => (c.trigger.input === "button" ? [c.trigger.buttonId] : [])));
  config.rig.buttons.forEach((b, bi) => {
    if (!usedButtons.has(b.id)) sink.warning("button-unused", `rig.buttons[${bi}]`, `Button "${b.name}" has no control bound to it; pressing it does nothing.`, "Bind a gesture of this button to an event, or remove it from the rig.");
  });

  for (const [event, path] of answered) {
    if (event === "ignition" || event === "retraction" || fired.has(event)) continue;
    const count = countAnswering(ctx, event);
    sink.warning("effect-without-control", path, `${plural(count, "layer")} answer ${event}, but no control fires ${event}, so ${count === 1 ? "it" : "they"} can never show.`, `Bind ${event} to a button gesture or motion in the controls.`);
  }
}

function fontsPlay(ctx: RuleContext, event: BladeEvent): boolean {
  const cue = CUE_FOR_EVENT[event];
  if (!cue) return false;
  return ctx.config.presets.some((p) => ctx.fonts.get(p.fontId)?.cues.includes(cue));
}

function countAnswering(ctx: RuleContext, event: BladeEvent): number {
  let n = 0;
  for (const p of ctx.config.presets) for (const look of Object.values(p.looks)) for (const l of look.layers) if (answeredEvent(l) === event) n++;
  return n;
}
