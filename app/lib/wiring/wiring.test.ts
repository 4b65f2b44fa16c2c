import { describe, expect, it } from "vitest";
import { demoConfig } from "../config/demo";
import type { Config } from "../config/schema";
import { powerModeFor } from "../checks/power-mode";
import { validateConfig } from "../checks/validate";
import { chassisAmpacity } from "../power/ampacity";
import { drawWiring, wiringGraph } from "./index";
import { layoutWiring, type Box } from "./layout";

/** The demo build with `channels` channels (each on its own data pin) and `buttons` buttons. */
function rigOf(channels: number, buttons: number): Config {
  const c = demoConfig();
  const base = c.rig.channels;
  c.rig.board.dataPins = Array.from({ length: 16 }, (_, i) => 10 + i);
  c.rig.board.inputPins = Array.from({ length: 8 }, (_, i) => 40 + i);
  c.rig.channels = Array.from({ length: channels }, (_, i) => ({
    ...base[i % base.length],
    id: i < base.length ? base[i].id : `extra-${i}`,
    name: i < base.length ? base[i].name : `Accent ${i}`,
    pin: 10 + i,
    parallelStrips: i === 0 ? 2 : 1,
  }));
  const kinds = ["activation", "auxiliary"] as const;
  c.rig.buttons = Array.from({ length: buttons }, (_, i) => ({
    id: i < c.rig.buttons.length ? c.rig.buttons[i].id : `button-${i}`,
    name: i < c.rig.buttons.length ? c.rig.buttons[i].name : `Extra ${i}`,
    kind: kinds[i % 2],
    pin: 40 + i,
  }));
  return c;
}

const overlap = (a: Box, b: Box) => a.x < b.x + b.width && b.x < a.x + a.width && a.y < b.y + b.height && b.y < a.y + a.height;
const inside = (a: Box, b: Box) => a.x >= b.x - 0.5 && a.y >= b.y - 0.5 && a.x + a.width <= b.x + b.width + 0.5 && a.y + a.height <= b.y + b.height + 0.5;

describe("wiring picture", () => {
  it("draws rigs of 1 to 8 channels and 0 to 4 buttons with no label touching another or a part it does not belong to", async () => {
    for (let ch = 1; ch <= 8; ch++) {
      for (let bt = 0; bt <= 4; bt++) {
        const config = rigOf(ch, bt);
        const { config: parsed, power, diagnostics } = validateConfig(config);
        expect(parsed, `${ch} channels, ${bt} buttons parse`).not.toBeNull();
        const g = wiringGraph(parsed!, power!, diagnostics);
        const layout = await layoutWiring(g);
        const labels: { owner: string; box: Box }[] = [];
        for (const p of layout.parts.values()) {
          expect(inside(p.label, p), `${p.id}'s words sit inside its box`).toBe(true);
          labels.push({ owner: p.id, box: p.label });
          for (const port of p.ports) labels.push({ owner: p.id, box: port.label });
        }
        for (const l of layout.leads.values()) if (l.label) labels.push({ owner: l.id, box: l.label });
        for (let i = 0; i < labels.length; i++)
          for (let j = i + 1; j < labels.length; j++)
            expect(overlap(labels[i].box, labels[j].box), `${ch}ch/${bt}bt: label of ${labels[i].owner} overlaps label of ${labels[j].owner}`).toBe(false);
        // A lead's label never sits on a part.
        for (const l of layout.leads.values())
          for (const p of layout.parts.values()) if (l.label) expect(overlap(l.label, p), `${ch}ch/${bt}bt: label of ${l.id} lies on ${p.id}`).toBe(false);
        // Every strip and button is connected: one data lead per strip, one input lead per button.
        expect(g.leads.filter((x) => x.kind === "data")).toHaveLength(ch + 1);
        expect(g.leads.filter((x) => x.kind === "input")).toHaveLength(bt);
      }
    }
  }, 120_000);

  it("gives the same bytes for the same rig, and a text alternative with every connection", async () => {
    const a = await drawWiring(demoConfig(), "Kestrel");
    const b = await drawWiring(demoConfig(), "Kestrel");
    expect(a.ok).toBe(true);
    expect(a.svg).toBe(b.svg);
    if (!a.ok) return;
    expect(a.svg).toContain("<title id=\"wiring-title\">Kestrel</title>");
    const config = demoConfig();
    for (const c of config.rig.channels) expect(a.connections.some((s) => s.includes(`pin ${c.pin} to ${c.name}`))).toBe(true);
    for (const btn of config.rig.buttons) expect(a.connections.some((s) => s.includes(`pin ${btn.pin} to ${btn.name}`))).toBe(true);
  });

  it("labels the cell lead with gauge, length, the worst preset's peak and its drop", async () => {
    const config = demoConfig();
    const { power } = validateConfig(config, { power: powerModeFor(config) });
    const r = await drawWiring(config);
    if (!r.ok) throw new Error("expected a drawing");
    const cell = r.graph.leads.find((l) => l.id === "lead.cell")!;
    expect(cell.lines[0]).toBe(`${config.rig.power.wireGaugeAwg} AWG · ${config.rig.power.wireLengthMm} mm`);
    expect(cell.lines[1]).toContain(power!.overall.peakAmps.toFixed(2));
  });

  it("shows a pin used twice and a channel on no data pin in the caution colour with the validator's code, without crashing", async () => {
    const c = demoConfig();
    c.rig.channels[1].pin = c.rig.channels[0].pin; // shared
    c.rig.channels[2].pin = 99; // not a data pin of the board
    const r = await drawWiring(c);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.svg).toContain("shared-data-pin");
    expect(r.svg).toContain("unknown-data-pin");
    expect(r.svg).toContain("#b3261e");
    expect(r.connections.join(" ")).toMatch(/problem: unknown-data-pin/);
  });

  it("says why instead of drawing a rig the validator refuses (64 channels)", async () => {
    const c = demoConfig();
    c.rig.channels = Array.from({ length: 64 }, (_, i) => ({ ...c.rig.channels[0], id: `ch-${i}`, pin: i }));
    const r = await drawWiring(c);
    expect(r.ok).toBe(false);
    expect(r.svg).toContain("This rig cannot be drawn");
    if (!r.ok) expect(r.reasons.join(" ")).toMatch(/rig\.channels/);
  });

  it("rates leads from the common-practice chassis-wiring table (values from memory, labelled so)", () => {
    // Common practice, from memory: the widely quoted chassis-wiring figures, 22 AWG ≈ 7 A, 18 AWG ≈ 16 A.
    expect(chassisAmpacity(22)).toBe(7);
    expect(chassisAmpacity(18)).toBe(16);
    // Odd gauges sit geometrically between their neighbours.
    expect(chassisAmpacity(21)).toBeCloseTo(Math.sqrt(11 * 7), 2);
    expect(chassisAmpacity(40)).toBeNull();
  });
});
