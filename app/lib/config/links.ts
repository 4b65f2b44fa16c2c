// Where a diagnostic's path lives in the app: rig values on the rig form (each input's id is
// `f-` + its form name with dots as dashes), anything under a preset on the Looks page for that
// preset. Fonts and controls have no page yet, so they get no link.
import { boardSchema, buttonSchema, channelSchema, powerSchema, speakerSchema } from "./schema";

export type Segment = string | number;

/** Splits `a.b[2]["odd key"].c` into segments; null when the text is not a path. */
export function parsePath(path: string): Segment[] | null {
  const out: Segment[] = [];
  const re = /\.?([A-Za-z_$][A-Za-z0-9_$-]*)|\[(\d+)\]|\[("(?:[^"\\]|\\.)*")\]/y;
  let at = 0;
  while (at < path.length) {
    re.lastIndex = at;
    const m = re.exec(path);
    if (!m || (m[1] !== undefined && m[0].startsWith(".") && at === 0)) return null;
    if (m[1] !== undefined) out.push(m[1]);
    else if (m[2] !== undefined) out.push(Number(m[2]));
    else out.push(JSON.parse(m[3]) as string);
    at = re.lastIndex;
  }
  return out;
}

const RIG_FIELDS: Record<string, readonly string[]> = {
  board: Object.keys(boardSchema.shape),
  power: Object.keys(powerSchema.shape),
  speaker: Object.keys(speakerSchema.shape),
  channels: Object.keys(channelSchema.shape),
  buttons: Object.keys(buttonSchema.shape),
};

/** The rig form's input name for a path under `rig`, or null for the form as a whole. */
function rigFieldName(rest: Segment[]): string | null {
  const [section, a, b] = rest;
  if (typeof section !== "string" || !(section in RIG_FIELDS)) return null;
  const fields = RIG_FIELDS[section];
  if (section === "channels" || section === "buttons") {
    if (typeof a !== "number") return null;
    return `${section}.${a}.${typeof b === "string" && fields.includes(b) ? b : "id"}`;
  }
  return typeof a === "string" && fields.includes(a) ? `${section}.${a}` : null;
}

export function rigAnchor(fieldName: string): string {
  return `f-${fieldName.replace(/\./g, "-")}`;
}

/**
 * The page (and anchor) a diagnostic points at, or null. `config` is the config the path is
 * about, read defensively (it may not have passed the schema).
 */
export function diagnosticHref(buildId: string, path: string, config: unknown): string | null {
  const segs = parsePath(path);
  if (!segs || segs.length === 0) return null;
  const base = `/builds/${encodeURIComponent(buildId)}`;
  if (segs[0] === "rig") {
    const field = rigFieldName(segs.slice(1));
    return field ? `${base}/rig#${rigAnchor(field)}` : `${base}/rig`;
  }
  if (segs[0] === "presets") {
    const presets = (config as { presets?: unknown } | null)?.presets;
    const preset = typeof segs[1] === "number" && Array.isArray(presets) ? (presets[segs[1]] as { id?: unknown } | undefined) : undefined;
    const id = typeof preset?.id === "string" ? preset.id : null;
    return id ? `${base}/looks?preset=${encodeURIComponent(id)}` : `${base}/looks`;
  }
  return null;
}
