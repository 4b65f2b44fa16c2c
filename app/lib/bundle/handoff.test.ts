// The card's handoff.html and the client's handoff page read one source of words.
import { describe, expect, it } from "vitest";
import { demoConfig } from "../config/demo";
import { controlsInWords, handoffSheet, presetsInWords } from "./handoff";

describe("handoff words", () => {
  const config = demoConfig();
  const html = handoffSheet("Kestrel", "Client One", config);
  const esc = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

  it("puts every control of the page's table in the file, in the same words", () => {
    const controls = controlsInWords(config);
    expect(controls.length).toBe(config.controls.length);
    for (const c of controls) expect(html).toContain(`<tr><td>${esc(c.what)}</td><td>${esc(c.how)}</td></tr>`);
    expect(controls.every((c) => c.what.length > 0 && c.how.length > 0)).toBe(true);
  });

  it("lists the presets in order with their fonts' names, as the page does", () => {
    const presets = presetsInWords(config);
    expect(presets.map((p) => p.position)).toEqual(config.presets.map((_, i) => i + 1));
    for (const p of presets) {
      expect(config.fonts.some((f) => f.name === p.font)).toBe(true);
      expect(html).toContain(`<li>${p.position}. ${esc(p.name)} — sound font ${esc(p.font)}</li>`);
    }
  });
});
