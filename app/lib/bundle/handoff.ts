// The client's handoff sheet as one HTML file that opens offline from the card: controls in
// plain words, presets with their fonts, and the cell cautions (the same wording as the app's
// SafetyCautions block). The client's handoff page (/handoff/:buildId) shows the same words:
// `controlsInWords` and `presetsInWords` are the one source of both.
import { CELL_CAUTIONS, DEFER_NOTE } from "../../components/SafetyCautions";
import type { Config, Control } from "../config/schema";

const esc = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

const EVENT_WORDS: Record<string, string> = {
  ignition: "Light the blade",
  retraction: "Put the blade away",
  clash: "Clash flash",
  blast: "Blaster deflect",
  lockup: "Blade lock",
  drag: "Tip drag",
  auxiliary: "Accent flash",
  "next-preset": "Next preset",
  "previous-preset": "Previous preset",
};

function how(c: Control, config: Config): string {
  const t = c.trigger;
  const when = t.state === "lit" ? " while lit" : t.state === "unlit" ? " while off" : "";
  if (t.input === "motion") return `${t.motion === "impact" ? "Hit something" : t.motion === "stab" ? "Stab forward" : t.motion === "twist" ? "Twist the hilt" : "Swing"}${when}`;
  const button = config.rig.buttons.find((b) => b.id === t.buttonId)?.name ?? t.buttonId;
  const g = { press: "Press", "double-press": "Press twice", "triple-press": "Press three times", hold: "Hold", "long-hold": "Hold for a long moment" }[t.gesture];
  return `${g} ${button}${when}`;
}

export type ControlInWords = { what: string; how: string };
export type PresetInWords = { id: string; position: number; name: string; font: string };

/** Each control as a client reads it: what happens, and what to do for it. */
export function controlsInWords(config: Config): ControlInWords[] {
  return config.controls.map((c) => ({ what: EVENT_WORDS[c.event] ?? c.event, how: how(c, config) }));
}

/** The presets in the order the saber steps through them, each with its sound font's name. */
export function presetsInWords(config: Config): PresetInWords[] {
  const fontName = (id: string) => config.fonts.find((f) => f.id === id)?.name ?? id;
  return config.presets.map((p, i) => ({ id: p.id, position: i + 1, name: p.name, font: fontName(p.fontId) }));
}

export function handoffSheet(buildName: string, clientName: string, config: Config): string {
  const rows = controlsInWords(config).map((c) => `<tr><td>${esc(c.what)}</td><td>${esc(c.how)}</td></tr>`).join("\n");
  const presets = presetsInWords(config).map((p) => `<li>${p.position}. ${esc(p.name)} — sound font ${esc(p.font)}</li>`).join("\n");
  const cautions = CELL_CAUTIONS.map((c) => `<li>${esc(c)}</li>`).join("\n");
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${esc(buildName)} — your saber</title>
<style>body{font:16px/1.5 system-ui,sans-serif;max-width:40rem;margin:2rem auto;padding:0 1rem;color:#222}table{border-collapse:collapse}td{border-bottom:1px solid #ddd;padding:.3rem .8rem .3rem 0}.caution{border-left:4px solid #e0a020;padding-left:1rem}</style>
</head>
<body>
<h1>${esc(buildName)}</h1>
<p>Made for ${esc(clientName || "you")}.</p>
<h2>Controls</h2>
<table>
${rows}
</table>
<h2>Presets</h2>
<ul>
${presets}
</ul>
<section class="caution">
<h2>Charging and the battery</h2>
<p><strong>${esc(DEFER_NOTE)}</strong></p>
<ul>
${cautions}
</ul>
</section>
</body>
</html>
`;
}
