// The wiring picture as SVG text: white ground and dark ink so it prints on one page, leads
// coloured by what they carry and in the caution colour when over their share, every number
// rounded the same way so the same rig always gives the same bytes.
import type { Lead, Part, WiringGraph } from "./graph";
import { FONT_SIZE, LINE_H, type PlacedLabel, type WiringLayout } from "./layout";

export const WIRING_COLOURS = {
  ink: "#1c1f24",
  ground: "#ffffff",
  power: "#8c2f10",
  data: "#1f4f8a",
  input: "#3f5f2a",
  audio: "#5b3f86",
  caution: "#b3261e",
  partFill: { cell: "#f4ead9", switch: "#efefef", board: "#e3ecf4", strip: "#f7f0e1", button: "#eaf1e4", speaker: "#efe8f6" } as Record<Part["kind"], string>,
};
const FONT = "'JetBrains Mono', ui-monospace, monospace";

const n = (v: number) => {
  const r = Math.round(v * 10) / 10;
  return Number.isInteger(r) ? String(r) : r.toFixed(1);
};
export const escapeXml = (s: string) => s.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;");

function textLines(lines: string[], x: number, y: number, colour: string, anchor: "start" | "middle" = "start"): string {
  return lines
    .map((l, i) => `<text x="${n(x)}" y="${n(y + (i + 1) * LINE_H - 3)}" fill="${colour}" text-anchor="${anchor}">${escapeXml(l)}</text>`)
    .join("");
}

function label(l: PlacedLabel, colour: string): string {
  return `<rect x="${n(l.x)}" y="${n(l.y)}" width="${n(l.width)}" height="${n(l.height)}" fill="${WIRING_COLOURS.ground}" fill-opacity="0.92"/>` + textLines(l.lines, l.x + 4, l.y + 1, colour);
}

function leadColour(l: Lead): string {
  return l.caution ? WIRING_COLOURS.caution : WIRING_COLOURS[l.kind];
}

export function wiringSvg(g: WiringGraph, layout: WiringLayout, title: string, description: string): string {
  const out: string[] = [];
  const w = Math.ceil(layout.width);
  const h = Math.ceil(layout.height);
  out.push(
    `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 ${w} ${h}" width="${w}" height="${h}" role="img" aria-labelledby="wiring-title wiring-desc" font-family="${FONT}" font-size="${FONT_SIZE}">`,
    `<title id="wiring-title">${escapeXml(title)}</title>`,
    `<desc id="wiring-desc">${escapeXml(description)}</desc>`,
    `<rect x="0" y="0" width="${w}" height="${h}" fill="${WIRING_COLOURS.ground}"/>`,
  );
  out.push(`<g fill="none" stroke-width="2" stroke-linejoin="round">`);
  for (const lead of g.leads) {
    const placed = layout.leads.get(lead.id);
    if (!placed || placed.points.length < 2) continue;
    const dash = lead.kind === "data" || lead.kind === "input" ? ` stroke-dasharray="6 3"` : "";
    out.push(`<polyline data-lead="${escapeXml(lead.id)}" points="${placed.points.map((p) => `${n(p.x)},${n(p.y)}`).join(" ")}" stroke="${leadColour(lead)}"${dash}/>`);
  }
  out.push(`</g>`);
  for (const part of g.parts) {
    const p = layout.parts.get(part.id);
    if (!p) continue;
    out.push(
      `<g data-part="${escapeXml(part.id)}"><rect x="${n(p.x)}" y="${n(p.y)}" width="${n(p.width)}" height="${n(p.height)}" rx="6" fill="${WIRING_COLOURS.partFill[part.kind]}" stroke="${WIRING_COLOURS.ink}"/>`,
      textLines(p.label.lines, p.label.x + 4, p.label.y + 1, WIRING_COLOURS.ink),
    );
    for (const port of p.ports) {
      const model = part.ports.find((x) => x.id === port.id);
      const colour = model?.codes.length ? WIRING_COLOURS.caution : WIRING_COLOURS.ink;
      out.push(`<rect x="${n(port.x)}" y="${n(port.y)}" width="${n(port.width)}" height="${n(port.height)}" fill="${colour}"/>`, textLines(port.label.lines, port.label.x + 4, port.label.y + 1, colour));
    }
    out.push(`</g>`);
  }
  for (const lead of g.leads) {
    const placed = layout.leads.get(lead.id);
    if (placed?.label) out.push(label(placed.label, leadColour(lead)));
  }
  out.push(`</svg>`);
  return out.join("\n");
}

/** A picture that says why it cannot draw, in place of the drawing. */
export function refusalSvg(title: string, reasons: string[]): string {
  const lines = ["This rig cannot be drawn:", ...reasons.slice(0, 8).map((r) => `• ${r}`)];
  const w = Math.max(360, Math.ceil(Math.max(...lines.map((l) => l.length)) * FONT_SIZE * 0.6 + 32));
  const h = lines.length * LINE_H + 32;
  return [
    `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 ${w} ${h}" width="${w}" height="${h}" role="img" aria-labelledby="wiring-title wiring-desc" font-family="${FONT}" font-size="${FONT_SIZE}">`,
    `<title id="wiring-title">${escapeXml(title)}</title>`,
    `<desc id="wiring-desc">${escapeXml(lines.join(" "))}</desc>`,
    `<rect x="0" y="0" width="${w}" height="${h}" fill="${WIRING_COLOURS.ground}" stroke="${WIRING_COLOURS.caution}"/>`,
    textLines(lines, 16, 14, WIRING_COLOURS.caution),
    `</svg>`,
  ].join("\n");
}
