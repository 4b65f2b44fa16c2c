// Reads a file in generic-header form back into the config model. Entries are found by their
// indices (version 2's `/* #3 */ { .field = value }`, or version 1's C designators
// `[3] = { .field = value }`), not by line order, so reordered lines and added
// comments are fine; derived fields (counts, indices) are ignored; the result is checked with
// the model's own schema, and every problem points at a line of the file.
import { fillLayerIds } from "../config/layer-ids";
import { CONFIG_FORMAT, configSchema, type Config } from "../config/schema";
import { CReadError, readInitializers, type CItem, type CVal, type Pos } from "./cread";
import { BOARD, BUTTON, CHANNEL, CONTROL, FONT, KIND_FIELDS, LAYER, LOOK, POWER, PRESET, snake, snakeUpper, SPEAKER, STOP, type Kind, type Spec } from "./spec";

export interface ReadError {
  line: number;
  column: number;
  message: string;
}

/** Far above any real header (the demo is about 27 KB), low enough to read quickly. */
const MAX_HEADER = 8 * 1024 * 1024;

type Row = Record<string, unknown> & { $pos: Pos; $fields: Map<string, Pos>; $names: Map<string, string> };

class Reader {
  errors: ReadError[] = [];
  err(pos: Pos, message: string) {
    this.errors.push({ line: pos.line, column: pos.column, message });
  }
  struct(v: CVal, spec: Spec, what: string): Row {
    const row = { $pos: v.pos, $fields: new Map(), $names: new Map() } as Row;
    if (v.k !== "list") {
      this.err(v.pos, `${what} should be a { … } initializer`);
      return row;
    }
    for (const item of v.items) {
      if (!item.field) {
        this.err(item.pos, `write each field of ${what} as '.name = value'`);
        continue;
      }
      if (!(item.field in spec)) {
        this.err(item.pos, `unknown field '.${item.field}' in ${what}`);
        continue;
      }
      const s = spec[item.field];
      if (!s) continue;
      if (row.$fields.has(s.key)) this.err(item.pos, `'.${item.field}' is given twice in ${what}`);
      row.$fields.set(s.key, item.pos);
      row.$names.set(s.key, item.field);
      row[s.key] = this.value(item.value, s.kind, `'.${item.field}'`);
    }
    return row;
  }
  value(v: CVal, kind: Kind, what: string): unknown {
    if (kind === "num") {
      if (v.k === "num") return v.v;
      this.err(v.pos, `${what} should be a number`);
    } else if (kind === "str") {
      if (v.k === "str") return v.v;
      if (isNullPointer(v)) return undefined;
      this.err(v.pos, `${what} should be a string literal`);
    } else if (kind === "bool") {
      if (v.k === "ident" && (v.v === "true" || v.v === "false")) return v.v === "true";
      if (v.k === "num" && (v.v === 0 || v.v === 1)) return v.v === 1;
      this.err(v.pos, `${what} should be true or false`);
    } else if (kind === "color") {
      if (v.k === "num" && Number.isInteger(v.v) && v.v >= 0 && v.v <= 0xffffff)
        return "#" + (/^0[xX][0-9a-fA-F]{6}$/.test(v.raw) ? v.raw.slice(2) : v.v.toString(16).padStart(6, "0"));
      this.err(v.pos, `${what} should be a colour 0xRRGGBB`);
    } else if (kind === "numlist") {
      if (isEmptyList(v)) return [];
      if (v.k === "list" && v.items.every((i) => !i.field && i.index === undefined)) return v.items.map((i) => this.value(i.value, "num", what));
      this.err(v.pos, `${what} should be a list of numbers { 1, 2 }`);
    } else if ("listOf" in kind) {
      if (isEmptyList(v)) return [];
      if (v.k === "list") return v.items.map((i) => this.value(i.value, kind.listOf, what));
      this.err(v.pos, `${what} should be a list { … }`);
    } else {
      if (v.k === "ident") {
        const prefix = `HB_${kind.group}_`;
        const found = kind.values.find((x) => prefix + snakeUpper(x) === v.v);
        if (found !== undefined) return found;
        this.err(v.pos, `${what}: '${v.v}' is not one of ${kind.values.map((x) => prefix + snakeUpper(x)).join(", ")}`);
      } else this.err(v.pos, `${what} should be one of the HB_${kind.group}_… names`);
    }
    return undefined;
  }
  table(tables: Map<string, CVal & { k: "list" }>, name: string, spec: Spec, what: string, required = true): Row[] {
    const t = tables.get(name);
    if (!t) {
      if (required) this.err({ line: 1, column: 1 }, `the table '${name}' is missing`);
      return [];
    }
    const rows: { index: number; row: Row }[] = [];
    const seen = new Map<number, Pos>();
    let next = 0;
    for (const item of t.items) {
      if (item.field) {
        this.err(item.pos, `'${name}' is a table; write entries as '/* #n */ { … }' (or, in C only, '[n] = { … }')`);
        continue;
      }
      if (item.index === undefined && isZeroSentinel(item)) continue;
      const index = item.index ?? next;
      next = index + 1;
      if (!Number.isInteger(index) || index < 0) {
        this.err(item.pos, `an index must be a whole number`);
        continue;
      }
      if (seen.has(index)) {
        this.err(item.pos, `entry [${index}] of '${name}' is given twice (first on line ${seen.get(index)!.line})`);
        continue;
      }
      seen.set(index, item.pos);
      rows.push({ index, row: this.struct(item.value, spec, `${what} [${index}]`) });
    }
    rows.sort((a, b) => a.index - b.index);
    rows.forEach((r, i) => {
      if (r.index !== i) this.err(r.row.$pos, `entry [${r.index}] of '${name}' leaves a gap: expected [${i}]`);
    });
    return rows.map((r) => r.row);
  }
}

/** The zeroed entry an empty table holds: `{ 0 }` (version 1) or `{ HB_EMPTY }` (version 2). */
function isZeroSentinel(item: CItem): boolean {
  const v = item.value;
  return (v.k === "list" && v.items.length === 1 && !v.items[0].field && v.items[0].value.k === "num" && v.items[0].value.v === 0) || isEmptyList(v);
}

/** `{ HB_EMPTY }`: the header's empty list (`{ 0 }` in C, `{ }` in C++), and `{ }` itself. */
function isEmptyList(v: CVal): boolean {
  if (v.k !== "list") return false;
  if (v.items.length === 0) return true;
  const only = v.items[0].value;
  return v.items.length === 1 && !v.items[0].field && v.items[0].index === undefined && only.k === "ident" && only.v === "HB_EMPTY";
}

/** A string field left without a string: `0`, `NULL` or `nullptr`. */
function isNullPointer(v: CVal): boolean {
  return (v.k === "num" && v.v === 0 && v.raw === "0") || (v.k === "ident" && (v.v === "NULL" || v.v === "nullptr"));
}

function plain(row: Row, keys: string[]): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const k of keys) if (row[k] !== undefined) out[k] = row[k];
  return out;
}

export function readHeader(text: string): { config: Config | null; errors: ReadError[] } {
  if (typeof text !== "string") return { config: null, errors: [{ line: 1, column: 1, message: "the header must be text" }] };
  if (text.length > MAX_HEADER) return { config: null, errors: [{ line: 1, column: 1, message: `the file is ${text.length} characters, over the limit of ${MAX_HEADER}` }] };
  let tables;
  try {
    tables = readInitializers(text);
  } catch (e) {
    if (e instanceof CReadError) return { config: null, errors: [{ ...e.pos, message: e.message }] };
    throw e;
  }
  const r = new Reader();
  const one = (name: string, spec: Spec, what: string): Row => {
    const t = tables.get(name);
    if (!t) {
      r.err({ line: 1, column: 1 }, `'${name}' is missing`);
      return { $pos: { line: 1, column: 1 }, $fields: new Map(), $names: new Map() } as Row;
    }
    return r.struct(t, spec, what);
  };
  const board = one("hb_board", BOARD, "the board");
  const power = one("hb_power", POWER, "the power sheet");
  const speaker = one("hb_speaker", SPEAKER, "the speaker");
  const channels = r.table(tables, "hb_channels", CHANNEL, "channel");
  const buttons = r.table(tables, "hb_buttons", BUTTON, "button");
  const fonts = r.table(tables, "hb_fonts", FONT, "font");
  const presets = r.table(tables, "hb_presets", PRESET, "preset");
  const looks = r.table(tables, "hb_looks", LOOK, "look");
  const layers = r.table(tables, "hb_layers", LAYER, "layer");
  const stops = r.table(tables, "hb_stops", STOP, "stop");
  const controls = r.table(tables, "hb_controls", CONTROL, "control");
  // Where each part of the model came from, so schema errors can point at a line.
  const where = new Map<string, Pos>();
  const mark = (path: (string | number)[], row: Row) => {
    where.set(path.join("."), row.$pos);
    for (const [k, p] of row.$fields) where.set([...path, k].join("."), p);
  };

  const layerModels = layers.map((row, i) => {
    const kind = row.kind as string;
    const model: Record<string, unknown> = { kind, ...plain(row, ["enabled", "opacity", "blend"]) };
    if (row.hasRange) model.range = { start: row.rangeStart, end: row.rangeEnd };
    model.when = row.when;
    const own = stops.filter((s) => s.layer === i);
    if (kind === "gradient") model.stops = own.map((s) => ({ at: s.at, color: s.color }));
    if (kind === "drift") model.colors = own.map((s) => s.color);
    for (const k of KIND_FIELDS[kind] ?? []) {
      if (row[k] === undefined) r.err(row.$pos, `a ${kind} layer needs '.${snake(k)}'`);
      model[k] = row[k];
    }
    return model;
  });
  stops.forEach((s) => {
    const l = layers[s.layer as number];
    if (!l || (l.kind !== "gradient" && l.kind !== "drift")) r.err(s.$pos, `stop points at layer ${String(s.layer)}, which is not a gradient or drift layer`);
  });
  const presetModels = presets.map((row, pi) => {
    const lookRecord: Record<string, { layers: unknown[] }> = {};
    looks.forEach((look, li) => {
      if (look.preset !== pi) return;
      const key = look.channelId as string;
      if (key in lookRecord) r.err(look.$pos, `preset [${pi}] has two looks for channel "${key}"`);
      const ls = layerModels.filter((_, i) => layers[i].look === li);
      lookRecord[key] = { layers: ls };
      mark(["presets", pi, "looks", key], look);
      layers.forEach((lr, i) => {
        if (lr.look === li) mark(["presets", pi, "looks", key, "layers", ls.indexOf(layerModels[i])], lr);
      });
    });
    mark(["presets", pi], row);
    return { ...plain(row, ["id", "name", "fontId"]), looks: lookRecord };
  });
  looks.forEach((l) => {
    if (typeof l.preset !== "number" || !presets[l.preset]) r.err(l.$pos, `look points at preset ${String(l.preset)}, which does not exist`);
  });
  layers.forEach((l) => {
    if (typeof l.look !== "number" || !looks[l.look]) r.err(l.$pos, `layer points at look ${String(l.look)}, which does not exist`);
  });

  const controlModels = controls.map((row, i) => {
    mark(["controls", i], row);
    const trigger =
      row.input === "motion" ? { input: "motion", motion: row.motion, state: row.state } : { input: row.input, buttonId: row.buttonId, gesture: row.gesture, state: row.state };
    return { event: row.event, trigger };
  });
  channels.forEach((row, i) => mark(["rig", "channels", i], row));
  buttons.forEach((row, i) => mark(["rig", "buttons", i], row));
  fonts.forEach((row, i) => mark(["fonts", i], row));
  mark(["rig", "board"], board);
  mark(["rig", "power"], power);
  mark(["rig", "speaker"], speaker);

  const candidate = {
    format: CONFIG_FORMAT,
    rig: {
      board: { ...plain(board, ["profile", "dataPins"]), inputPins: board.inputPins ?? [], ...plain(board, ["maxPixelsPerPin", "idleMilliamps"]) },
      channels: channels.map((c) => plain(c, ["id", "name", "role", "pixels", "parallelStrips", "pin", "colorOrder"])),
      buttons: buttons.map((b) => plain(b, ["id", "name", "kind", "pin"])),
      power: plain(power, Object.values(POWER).map((s) => s!.key)),
      speaker: plain(speaker, Object.values(SPEAKER).map((s) => s!.key)),
    },
    fonts: fonts.map((row) => ({ ...plain(row, ["id", "name", "folder", "status"]), cues: row.cues ?? [] })),
    presets: presetModels,
    controls: controlModels,
  };
  // Derived fields are what a firmware reads; a hand edit that forgets one is an error here.
  const same = (row: Row, key: string, actual: number, what: string) => {
    if (row[key] !== undefined && row[key] !== actual) r.err(row.$fields.get(key) ?? row.$pos, `'.${row.$names.get(key)}' is ${String(row[key])} but ${what} is ${actual}`);
  };
  const span = (row: Row, members: number[], child: string) => {
    if (row.$first === undefined && row.$count === undefined) return;
    same(row, "$count", members.length, `the number of ${child} entries pointing here`);
    if (members.length && members.some((m, i) => m !== members[0] + i)) r.err(row.$pos, `the ${child} entries of this one are not consecutive`);
    else if (members.length) same(row, "$first", members[0], `the index of its first ${child}`);
  };
  // Only on an otherwise sound file, so one broken entry does not cascade into many.
  if (r.errors.length === 0) checkDerived();
  function checkDerived() {
  same(board, "$dataPinCount", (board.dataPins as unknown[] | undefined)?.length ?? 0, "the number of data pins");
  same(board, "$inputPinCount", (board.inputPins as unknown[] | undefined)?.length ?? 0, "the number of input pins");
  fonts.forEach((row) => same(row, "$cueCount", (row.cues as unknown[] | undefined)?.length ?? 0, "the number of cues"));
  const indexIn = (rows: Row[], id: unknown) => rows.findIndex((x) => x.id === id);
  const pointing = (rows: Row[], key: string, target: number) => rows.flatMap((x, i) => (x[key] === target ? [i] : []));
  presets.forEach((row, i) => {
    same(row, "$font", indexIn(fonts, row.fontId), "the index of its font");
    span(row, pointing(looks, "preset", i), "look");
  });
  looks.forEach((row, i) => {
    same(row, "$channel", indexIn(channels, row.channelId), "the index of its channel");
    span(row, pointing(layers, "look", i), "layer");
  });
  layers.forEach((row, i) => span(row, pointing(stops, "layer", i), "stop"));
  controls.forEach((row) => row.input === "button" && same(row, "$button", indexIn(buttons, row.buttonId), "the index of its button"));
  }
  if (r.errors.length) return { config: null, errors: sortErrors(r.errors) };
  // A header carries no layer ids: each layer gets the id derived from its preset, channel and
  // position (the same rule that upgrades a "hiltbench.config/1" document), so reading the same
  // header twice gives the same config, and render → read back → render the same bytes.
  const parsed = configSchema.safeParse(fillLayerIds(candidate));
  if (parsed.success) return { config: parsed.data, errors: [] };
  for (const issue of parsed.error.issues) {
    const path = issue.path.map(String);
    let pos: Pos = { line: 1, column: 1 };
    for (let n = path.length; n >= 0; n--) {
      const p = where.get(path.slice(0, n).join("."));
      if (p) {
        pos = p;
        break;
      }
    }
    r.err(pos, `${path.join(".") || "config"}: ${issue.message}`);
  }
  return { config: null, errors: sortErrors(r.errors) };
}

function sortErrors(errors: ReadError[]): ReadError[] {
  return [...errors].sort((a, b) => a.line - b.line || a.column - b.column);
}
