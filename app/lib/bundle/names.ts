// Names on the SD card. FAT32 long names (Microsoft, "FAT: General Overview of On-Disk Format"
// and "Naming Files, Paths, and Namespaces"): at most 255 UTF-16 units per name and 260 per
// path, none of `" * / : < > ? \ |` or control characters, trailing dots and spaces dropped,
// case kept but matched without case. Windows reserves CON, PRN, AUX, NUL, COM1–9 and LPT1–9.
// An optional 8.3 mode for boards that read short names only. Names that become the same
// after sanitising are reported, never merged.

export type NameMode = "long" | "8.3";
export type NameFinding = { severity: "error" | "warning" | "info"; code: string; path: string; message: string };

const LONG_INVALID = /["*:<>?\\|\u0000-\u001f]/g;
/** Not allowed inside a part of an 8.3 name; anything else outside letters and digits becomes "_". */
const SHORT_ALLOWED = /[A-Z0-9$%'\-_@~`!(){}^#&\u0080-\uffff]/;
const RESERVED = /^(CON|PRN|AUX|NUL|COM[1-9]|LPT[1-9])(\.[^.]*)?$/i;
export const MAX_NAME = 255;
export const MAX_PATH = 260;
export const MAX_FILE_BYTES = 4_294_967_295;

/** One path component as FAT32 long names keep it. */
export function sanitizeLong(name: string): string {
  const cleaned = name.replace(LONG_INVALID, "_").replace(/[. ]+$/, "");
  return cleaned.length ? cleaned : "_";
}

/** One path component as an 8.3 short name: upper case, base ≤ 8, extension ≤ 3 (no numeric tails). */
export function sanitizeShort(name: string): string {
  const upper = name.toUpperCase().replace(/[. ]+$/, "");
  const dot = upper.lastIndexOf(".");
  const clean = (s: string) => [...s.replace(/ /g, "")].map((c) => (SHORT_ALLOWED.test(c) ? c : "_")).join("");
  const base = clean(dot > 0 ? upper.slice(0, dot) : upper).slice(0, 8) || "_";
  const ext = dot > 0 ? clean(upper.slice(dot + 1)).slice(0, 3) : "";
  return ext ? `${base}.${ext}` : base;
}

export type CardNames = { names: Map<string, string>; findings: NameFinding[] };

/** The card path for every given path (components joined with "/"), with what changed and what clashes. */
export function cardNames(paths: string[], mode: NameMode): CardNames {
  const names = new Map<string, string>();
  const findings: NameFinding[] = [];
  const byKey = new Map<string, string>();
  for (const p of paths) {
    const parts = p.split("/");
    const card = parts.map((c) => (mode === "8.3" ? sanitizeShort(c) : sanitizeLong(c))).join("/");
    names.set(p, card);
    if (card !== p && !(mode === "8.3" && card === p.toUpperCase()))
      findings.push({ severity: "info", code: "name-changed", path: p, message: `Written to the card as "${card}"${mode === "8.3" ? " (8.3 short names)" : " (characters FAT32 does not allow, or trailing dots and spaces, replaced)"}.` });
    for (const c of parts) {
      if (c.length > MAX_NAME) findings.push({ severity: "error", code: "name-too-long", path: p, message: `A name in "${p}" has ${c.length} characters; FAT32 allows ${MAX_NAME}.` });
      if (RESERVED.test(c.replace(/[. ]+$/, ""))) findings.push({ severity: "warning", code: "reserved-name", path: p, message: `"${c}" is a device name Windows reserves; the card may not open it on a Windows computer.` });
    }
    if (card.length + 3 > MAX_PATH) findings.push({ severity: "error", code: "path-too-long", path: p, message: `"${card}" is ${card.length + 3} characters with the drive; FAT32 paths may have ${MAX_PATH}.` });
    const key = card.toLowerCase();
    const other = byKey.get(key);
    if (other !== undefined && other !== p)
      findings.push({ severity: "error", code: "name-clash", path: p, message: `"${p}" and "${other}" both become "${card}" on the card (names there ignore case); rename one of them.` });
    else byKey.set(key, p);
  }
  return { names, findings };
}
