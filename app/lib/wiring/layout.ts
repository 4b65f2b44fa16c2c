// Geometry for the wiring picture from ELK (the Eclipse Layout Kernel, elkjs): a layered layout,
// left to right from the cell, with orthogonal leads and their labels placed by the engine so
// they do not overlap. Text sizes are computed for a monospaced face, so boxes fit their words.
import ELK, { type ElkExtendedEdge, type ElkNode } from "elkjs/lib/elk.bundled.js";
import type { WiringGraph } from "./graph";

export const FONT_SIZE = 11;
/** Advance of one character of a monospaced face at FONT_SIZE (0.6 em). */
export const CHAR_W = FONT_SIZE * 0.6;
export const LINE_H = 14;
const PAD = 8;

export const textBox = (lines: string[]) => ({
  width: Math.ceil(Math.max(...lines.map((l) => [...l].length)) * CHAR_W + PAD),
  height: lines.length * LINE_H + 4,
});

export interface Box {
  x: number;
  y: number;
  width: number;
  height: number;
}
export interface PlacedLabel extends Box {
  lines: string[];
}
export interface PlacedPart extends Box {
  id: string;
  label: PlacedLabel;
  ports: (Box & { id: string; label: PlacedLabel })[];
}
export interface PlacedLead {
  id: string;
  points: { x: number; y: number }[];
  label: PlacedLabel | null;
}
export interface WiringLayout {
  width: number;
  height: number;
  parts: Map<string, PlacedPart>;
  leads: Map<string, PlacedLead>;
}

const PORT = 8;

export async function layoutWiring(g: WiringGraph): Promise<WiringLayout> {
  const elk = new ELK();
  const children: ElkNode[] = g.parts.map((p) => {
    const inner = textBox(p.lines);
    const ports = p.ports.map((port) => {
      const lbl = textBox([port.label]);
      return {
        id: port.id,
        width: PORT,
        height: PORT,
        layoutOptions: { "elk.port.side": port.side },
        labels: [{ text: port.label, width: lbl.width, height: lbl.height }],
      };
    });
    return {
      id: p.id,
      width: 0,
      height: 0,
      ports,
      labels: [{ id: `${p.id}.label`, text: p.lines.join("\n"), width: inner.width, height: inner.height }],
      layoutOptions: {
        "elk.portConstraints": "FIXED_SIDE",
        // ELK sizes each box to hold its own words and its pins' names without them touching.
        "elk.nodeSize.constraints": "PORTS PORT_LABELS NODE_LABELS",
        "elk.nodeLabels.placement": "[H_LEFT, V_TOP, INSIDE]",
        "elk.nodeSize.options": "ASYMMETRICAL",
        "elk.nodeLabels.padding": "[top=6,left=8,bottom=6,right=8]",
        "elk.portLabels.placement": "[INSIDE]",
        "elk.spacing.portPort": "18",
        "elk.spacing.labelPortVertical": "6",
        "elk.spacing.labelPortHorizontal": "6",
      },
    };
  });
  const edges: ElkExtendedEdge[] = g.leads.map((l) => {
    const lines = l.caution ? [...l.lines, ...wrap(l.caution, 44)] : l.lines;
    const box = textBox(lines);
    return {
      id: l.id,
      sources: [l.fromPort ?? l.from],
      targets: [l.toPort ?? l.to],
      labels: [{ id: `${l.id}.label`, text: lines.join("\n"), width: box.width, height: box.height }],
    };
  });
  const graph: ElkNode = {
    id: "root",
    layoutOptions: {
      "elk.algorithm": "layered",
      "elk.direction": "RIGHT",
      "elk.edgeRouting": "ORTHOGONAL",
      "elk.layered.spacing.nodeNodeBetweenLayers": "60",
      "elk.spacing.nodeNode": "28",
      "elk.spacing.edgeLabel": "6",
      "elk.spacing.edgeEdge": "14",
      "elk.spacing.labelNode": "8",
      "elk.edgeLabels.placement": "CENTER",
      "elk.padding": "[top=24,left=24,bottom=24,right=24]",
      "elk.layered.thoroughness": "2",
      "elk.randomSeed": "1",
    },
    children,
    edges,
  };
  const root: ElkNode = await elk.layout(graph);
  const parts = new Map<string, PlacedPart>();
  for (const n of root.children ?? []) {
    const nl = n.labels?.[0];
    parts.set(n.id, {
      id: n.id,
      label: { x: (n.x ?? 0) + (nl?.x ?? 8), y: (n.y ?? 0) + (nl?.y ?? 6), width: nl?.width ?? 0, height: nl?.height ?? 0, lines: (nl?.text ?? "").split("\n") },
      x: n.x ?? 0,
      y: n.y ?? 0,
      width: n.width ?? 0,
      height: n.height ?? 0,
      ports: (n.ports ?? []).map((port) => {
        const lb = port.labels?.[0];
        const px = (n.x ?? 0) + (port.x ?? 0);
        const py = (n.y ?? 0) + (port.y ?? 0);
        return {
          id: port.id,
          x: px,
          y: py,
          width: port.width ?? PORT,
          height: port.height ?? PORT,
          label: { x: px + (lb?.x ?? 0), y: py + (lb?.y ?? 0), width: lb?.width ?? 0, height: lb?.height ?? 0, lines: [lb?.text ?? ""] },
        };
      }),
    });
  }
  const leads = new Map<string, PlacedLead>();
  for (const e of (root.edges ?? []) as ElkExtendedEdge[]) {
    const s = e.sections?.[0];
    const points = s ? [s.startPoint, ...(s.bendPoints ?? []), s.endPoint] : [];
    const lb = e.labels?.[0];
    leads.set(e.id, {
      id: e.id,
      points,
      label: lb ? { x: lb.x ?? 0, y: lb.y ?? 0, width: lb.width ?? 0, height: lb.height ?? 0, lines: (lb.text ?? "").split("\n") } : null,
    });
  }
  return { width: root.width ?? 0, height: root.height ?? 0, parts, leads };
}

/** Break a sentence into lines of at most `max` characters, at spaces. */
export function wrap(text: string, max: number): string[] {
  const out: string[] = [];
  let line = "";
  for (const word of text.split(" ")) {
    if (line && line.length + 1 + word.length > max) {
      out.push(line);
      line = word;
    } else line = line ? `${line} ${word}` : word;
  }
  if (line) out.push(line);
  return out;
}
