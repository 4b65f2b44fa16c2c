// The wiring picture's content, before any geometry: which parts a rig has, which leads join
// them, and what each lead carries in the worst preset. The same list feeds the drawing and its
// text alternative, so the two cannot disagree.
import type { Config } from "../config/schema";
import type { Diagnostic } from "../checks/diagnostics";
import type { PowerSummary } from "../power/estimate";
import { PEAK_WARN_FRACTION, WIRE_DROP_WARN_FRACTION } from "../power/thresholds";
import { wireDropVolts } from "../power/wire";
import { chassisAmpacity, SAFE_SHARE } from "../power/ampacity";

export type PartKind = "cell" | "switch" | "board" | "strip" | "button" | "speaker";
export type LeadKind = "power" | "data" | "input" | "audio";

export interface Port {
  id: string;
  label: string;
  side: "WEST" | "EAST";
  /** Validator codes about this pin (a pin the board lacks, a pin used twice). */
  codes: string[];
}

export interface Part {
  id: string;
  kind: PartKind;
  lines: string[];
  ports: Port[];
  codes: string[];
}

export interface Lead {
  id: string;
  kind: LeadKind;
  from: string;
  fromPort?: string;
  to: string;
  toPort?: string;
  lines: string[];
  caution: string | null;
  codes: string[];
  /** One sentence for the text alternative. */
  says: string;
}

export interface WiringGraph {
  parts: Part[];
  leads: Lead[];
  notes: string[];
}

const amps = (a: number) => `${a.toFixed(2)} A`;
const volts = (v: number) => `${v.toFixed(2)} V`;

/** Diagnostic codes by model path, for the pins the picture draws. */
function codesByPath(diagnostics: Diagnostic[]): Map<string, string[]> {
  const m = new Map<string, string[]>();
  for (const d of diagnostics) {
    if (d.severity !== "error" && d.severity !== "warning") continue;
    const list = m.get(d.path) ?? [];
    if (!list.includes(d.code)) list.push(d.code);
    m.set(d.path, list);
  }
  return m;
}

export function wiringGraph(config: Config, power: PowerSummary, diagnostics: Diagnostic[]): WiringGraph {
  const { board, channels, buttons, power: p, speaker } = config.rig;
  const codes = codesByPath(diagnostics);
  const oneWayMetres = p.wireLengthMm / 1000;
  const worst = power.presets.find((x) => x.presetId === power.overall.worstPresetId) ?? null;
  const worstName = worst ? (config.presets.find((x) => x.id === worst.presetId)?.name ?? worst.presetId) : null;
  const rating = chassisAmpacity(p.wireGaugeAwg);
  const gaugeLine = `${p.wireGaugeAwg} AWG · ${p.wireLengthMm} mm`;

  /** Caution text for a lead of the rig's gauge and length carrying `a` amps, or null. */
  const leadCaution = (a: number): string | null => {
    const drop = wireDropVolts(p.wireGaugeAwg, oneWayMetres, a);
    const over: string[] = [];
    if (rating !== null && a > rating * SAFE_SHARE)
      over.push(`over ${Math.round(SAFE_SHARE * 100)} % of ${p.wireGaugeAwg} AWG's ~${rating} A chassis rating (common practice; take the wire maker's data)`);
    if (drop > p.cellNominalVolts * WIRE_DROP_WARN_FRACTION) over.push(`drop over ${Math.round(WIRE_DROP_WARN_FRACTION * 100)} % of the cell's ${p.cellNominalVolts} V`);
    return over.length ? `Caution: ${over.join("; ")}.` : null;
  };

  const parts: Part[] = [];
  const leads: Lead[] = [];
  const notes: string[] = [];

  parts.push({
    id: "cell",
    kind: "cell",
    lines: ["Cell", `${p.cellCapacityMah} mAh · ${p.cellNominalVolts} V`, `${p.cellMaxContinuousAmps} A continuous`],
    ports: [],
    codes: [],
  });
  parts.push({ id: "switch", kind: "switch", lines: ["Switch", "(rating not in the rig)"], ports: [], codes: [] });

  // The board's pins as ports: power in on the left, outputs on the right. A channel or button
  // on a pin the board lacks still gets a port, marked, so the picture shows the conflict.
  const boardPorts: Port[] = [{ id: "board.bat", label: "BAT+", side: "WEST", codes: [] }];
  const dataPort = new Map<number, Port>();
  const inputPort = new Map<number, Port>();
  const addCodes = (port: Port, list: string[] | undefined) => {
    for (const c of list ?? []) if (!port.codes.includes(c)) port.codes.push(c);
  };
  channels.forEach((c, i) => {
    let port = dataPort.get(c.pin);
    if (!port) {
      port = { id: `board.data.${c.pin}`, label: board.dataPins.includes(c.pin) ? `data ${c.pin}` : `data ${c.pin}?`, side: "EAST", codes: [] };
      dataPort.set(c.pin, port);
    }
    addCodes(port, codes.get(`rig.channels[${i}].pin`));
  });
  buttons.forEach((b, i) => {
    let port = inputPort.get(b.pin);
    if (!port) {
      port = { id: `board.in.${b.pin}`, label: board.inputPins.includes(b.pin) ? `in ${b.pin}` : `in ${b.pin}?`, side: "EAST", codes: [] };
      inputPort.set(b.pin, port);
    }
    addCodes(port, codes.get(`rig.buttons[${i}].pin`));
  });
  const sortedPorts = (m: Map<number, Port>) => [...m.entries()].sort((a, b) => a[0] - b[0]).map(([, v]) => v);
  boardPorts.push(...sortedPorts(dataPort), ...sortedPorts(inputPort), { id: "board.spk", label: "SPK", side: "EAST", codes: [] });
  parts.push({ id: "board", kind: "board", lines: [`Board · ${board.profile}`, `idle ${board.idleMilliamps} mA`], ports: boardPorts, codes: [] });

  // The cell lead carries everything at the worst preset's peak.
  const total = power.overall.peakAmps;
  const cellCaution = [leadCaution(total), total > p.cellMaxContinuousAmps * PEAK_WARN_FRACTION ? `Caution: peak over ${Math.round(PEAK_WARN_FRACTION * 100)} % of the cell's ${p.cellMaxContinuousAmps} A continuous rating.` : null]
    .filter(Boolean)
    .join(" ");
  const cellDrop = wireDropVolts(p.wireGaugeAwg, oneWayMetres, total);
  leads.push({
    id: "lead.cell",
    kind: "power",
    from: "cell",
    to: "switch",
    lines: [gaugeLine, `peak ${amps(total)}${worstName ? ` (${worstName})` : ""}`, `drop ${volts(cellDrop)}`],
    caution: cellCaution || null,
    codes: [],
    says: `Cell positive to the switch: ${gaugeLine}, ${amps(total)} at peak${worstName ? ` in preset ${worstName}` : ""}, ${volts(cellDrop)} drop.`,
  });

  const boardMa = power.overall.peakAmps * 1000 - (worst ? worst.channels.reduce((s, c) => s + c.peakMa, 0) : 0);
  const boardAmps = Math.max(0, boardMa) / 1000;
  leads.push({
    id: "lead.board",
    kind: "power",
    from: "switch",
    to: "board",
    toPort: "board.bat",
    lines: [`board + audio`, `peak ${amps(boardAmps)}`],
    caution: null,
    codes: [],
    says: `Switch to the board's BAT+: board and audio, ${amps(boardAmps)} at peak.`,
  });

  channels.forEach((c, i) => {
    const peakMa = worst?.channels.find((x) => x.channelId === c.id)?.peakMa ?? 0;
    const stripAmps = peakMa / 1000 / c.parallelStrips;
    const port = dataPort.get(c.pin)!;
    const pinCodes = codes.get(`rig.channels[${i}].pin`) ?? [];
    for (let s = 1; s <= c.parallelStrips; s++) {
      const id = `strip.${i}.${s}`;
      const of = c.parallelStrips > 1 ? ` · strip ${s}/${c.parallelStrips}` : "";
      parts.push({ id, kind: "strip", lines: [`${c.name}${of}`, `${c.pixels} px · ${c.colorOrder}`], ports: [], codes: [] });
      const drop = wireDropVolts(p.wireGaugeAwg, oneWayMetres, stripAmps);
      leads.push({
        id: `lead.power.${i}.${s}`,
        kind: "power",
        from: "switch",
        to: id,
        lines: [gaugeLine, `peak ${amps(stripAmps)}`, `drop ${volts(drop)}`],
        caution: leadCaution(stripAmps),
        codes: [],
        says: `Switch to ${c.name}${of} positive: ${gaugeLine}, ${amps(stripAmps)} at peak, ${volts(drop)} drop.`,
      });
      leads.push({
        id: `lead.data.${i}.${s}`,
        kind: "data",
        from: "board",
        fromPort: port.id,
        to: id,
        lines: [`data · pin ${c.pin}`],
        caution: pinCodes.length ? `Caution: ${pinCodes.join(", ")}` : null,
        codes: pinCodes,
        says: `Board pin ${c.pin} to ${c.name}${of} data in${pinCodes.length ? ` (problem: ${pinCodes.join(", ")})` : ""}.`,
      });
    }
  });

  buttons.forEach((b, i) => {
    const id = `button.${i}`;
    const pinCodes = codes.get(`rig.buttons[${i}].pin`) ?? [];
    parts.push({ id, kind: "button", lines: [b.name, `${b.kind} button`], ports: [], codes: [] });
    leads.push({
      id: `lead.button.${i}`,
      kind: "input",
      from: "board",
      fromPort: inputPort.get(b.pin)!.id,
      to: id,
      lines: [`input · pin ${b.pin}`],
      caution: pinCodes.length ? `Caution: ${pinCodes.join(", ")}` : null,
      codes: pinCodes,
      says: `Board pin ${b.pin} to ${b.name} (${b.kind} button), other side to ground${pinCodes.length ? ` (problem: ${pinCodes.join(", ")})` : ""}.`,
    });
  });

  parts.push({ id: "speaker", kind: "speaker", lines: ["Speaker", `${speaker.impedanceOhms} Ω · ${speaker.ratedPowerWatts} W`], ports: [], codes: [] });
  leads.push({ id: "lead.speaker", kind: "audio", from: "board", fromPort: "board.spk", to: "speaker", lines: ["audio"], caution: null, codes: [], says: "Board SPK to the speaker." });

  notes.push(
    "Negative returns follow the same routes as the positive leads and are not drawn.",
    `Strip leads are drawn with the rig's one gauge and cell-to-blade length; peaks are for the worst preset${worstName ? ` (${worstName})` : ""}.`,
  );
  return { parts, leads, notes };
}

/** The text alternative: every connection, one sentence each. */
export function describeWiring(g: WiringGraph): string[] {
  return [...g.leads.map((l) => (l.caution ? `${l.says} ${l.caution}` : l.says)), ...g.notes];
}
