// Rules between a build's presets and the fonts' checked files: a control fires an event whose
// sound the preset's font does not have, and a wipe far off the length of the font's ignite or
// retract sound. The light should land with the sound; the accepted ratio is common practice.
import type { BladeEvent, Cue } from "../../config/schema";
import { lookPath, type RuleContext } from "./context";

const CUE_FOR_CONTROL: Partial<Record<string, Cue>> = { ignition: "ignite", retraction: "retract", clash: "clash", blast: "blast", lockup: "lockup", drag: "drag" };

/** A wipe between 30 % and 120 % of its sound's length lands with it (common practice). */
export const WIPE_TO_SOUND = { min: 0.3, max: 1.2 } as const;

export function fontRules(ctx: RuleContext): void {
  const { config, sink } = ctx;
  const fired = new Set<Cue>();
  for (const c of config.controls) {
    const cue = CUE_FOR_CONTROL[c.event];
    if (cue) fired.add(cue);
  }
  config.presets.forEach((p, pi) => {
    const font = ctx.fonts.get(p.fontId);
    if (!font || font.status !== "received") return;
    // Cues the looks already want are reported by font-missing-cue; these are the controls' own.
    const lookCues = new Set<Cue>(["hum"]);
    for (const look of Object.values(p.looks))
      for (const l of look.layers) if (l.enabled && (l.kind === "spark" || l.kind === "hold" || l.kind === "wipe")) lookCues.add(cueFor(l.event));
    const missing = [...fired].filter((c) => !font.cues.includes(c) && !lookCues.has(c));
    if (missing.length > 0)
      sink.warning("font-missing-control-cue", `presets[${pi}].fontId`, `The controls fire ${missing.join(", ")}, but font "${font.name}" of preset "${p.name}" has no sound for ${missing.length === 1 ? "it" : "them"}.`, "Ask the client for the missing files, or accept that these events play silently with this preset.");

    for (const channel of config.rig.channels) {
      if (channel.role !== "main-blade") continue;
      const look = p.looks[channel.id];
      if (!look) continue;
      look.layers.forEach((l, li) => {
        if (l.kind !== "wipe" || !l.enabled) return;
        const soundMs = l.event === "ignition" ? font.igniteMs : font.retractMs;
        if (!soundMs || soundMs <= 0) return;
        const ratio = l.durationMs / soundMs;
        if (ratio >= WIPE_TO_SOUND.min && ratio <= WIPE_TO_SOUND.max) return;
        const sound = l.event === "ignition" ? "ignite" : "retract";
        sink.warning(
          "wipe-off-font-sound",
          `${lookPath(pi, channel.id)}.layers[${li}].durationMs`,
          `The ${l.event} wipe of "${p.name}" takes ${Math.round(l.durationMs)} ms, but font "${font.name}"'s ${sound} sound lasts ${Math.round(soundMs)} ms; the light ${ratio < WIPE_TO_SOUND.min ? "finishes long before" : "is still moving after"} the sound.`,
          `Common practice: a wipe of ${Math.round(soundMs * WIPE_TO_SOUND.min)}–${Math.round(soundMs * WIPE_TO_SOUND.max)} ms lands with this sound.`,
        );
      });
    }
  });
}

function cueFor(event: BladeEvent | "auxiliary"): Cue {
  return (CUE_FOR_CONTROL[event] ?? "hum") as Cue;
}
