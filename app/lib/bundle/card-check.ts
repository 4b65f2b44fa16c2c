// Checking a card against its bundle's manifest, in the browser: which files are missing, which
// are extra, which changed (size first, then SHA-256). Pure: the page hashes with Web Crypto and
// hands the results here. Paths match without case, as FAT32 matches names.

export type ExpectedFile = { path: string; size: number; sha256: string };
/** A file found on the card; `sha256` is null when it was not hashed (its size already differs, or nothing expects it). */
export type FoundFile = { path: string; size: number; sha256: string | null };
export type Changed = { path: string; expected: ExpectedFile; found: FoundFile; why: "size" | "content" };
export type CardCheck = { missing: ExpectedFile[]; extra: FoundFile[]; changed: Changed[]; same: string[]; ignored: string[] };

/** What computers add to a card by themselves; never reported as extra. */
const SYSTEM = [/^System Volume Information(\/|$)/i, /(^|\/)\.(Trashes|Spotlight-V100|fseventsd|TemporaryItems)(\/|$)/, /(^|\/)\._[^/]*$/, /(^|\/)\.DS_Store$/, /(^|\/)Thumbs\.db$/i, /(^|\/)desktop\.ini$/i];
export const isSystemFile = (p: string) => SYSTEM.some((r) => r.test(p));

const key = (p: string) => p.normalize("NFC").toLowerCase();

/**
 * A folder chosen in the browser arrives as "CARD/ashfall/hum.wav": when every found path shares
 * one top folder and the manifest has no such folder, that folder is the card itself.
 */
export function cardRelative(found: string[], expected: string[]): (p: string) => string {
  const tops = new Set(found.map((p) => (p.includes("/") ? p.slice(0, p.indexOf("/")) : "")));
  if (tops.size !== 1) return (p) => p;
  const [top] = [...tops];
  if (!top || expected.some((e) => key(e).startsWith(`${key(top)}/`))) return (p) => p;
  return (p) => p.slice(top.length + 1);
}

/** Whether a found file needs hashing: something expects it and the size agrees. */
export function needsHash(expected: ExpectedFile[], path: string, size: number): boolean {
  const e = expected.find((x) => key(x.path) === key(path));
  return e !== undefined && e.size === size;
}

export function compareCard(expected: ExpectedFile[], found: FoundFile[]): CardCheck {
  const byKey = new Map(expected.map((e) => [key(e.path), e]));
  const seen = new Set<string>();
  const out: CardCheck = { missing: [], extra: [], changed: [], same: [], ignored: [] };
  for (const f of found) {
    const e = byKey.get(key(f.path));
    if (!e) {
      if (isSystemFile(f.path)) out.ignored.push(f.path);
      else out.extra.push(f);
      continue;
    }
    seen.add(key(e.path));
    if (e.size !== f.size) out.changed.push({ path: e.path, expected: e, found: f, why: "size" });
    else if (f.sha256 !== null && f.sha256.toLowerCase() !== e.sha256.toLowerCase()) out.changed.push({ path: e.path, expected: e, found: f, why: "content" });
    else if (f.sha256 === null) out.changed.push({ path: e.path, expected: e, found: f, why: "content" });
    else out.same.push(e.path);
  }
  for (const e of expected) if (!seen.has(key(e.path))) out.missing.push(e);
  return out;
}

/** The lines of a card's MANIFEST.txt (`sha256  size  path`), for checking a card against its own manifest. */
export function parseManifest(text: string): ExpectedFile[] {
  const out: ExpectedFile[] = [];
  for (const line of text.split(/\r?\n/)) {
    const m = /^([0-9a-f]{64}) {2}(\d+) {2}(.+)$/i.exec(line);
    if (m) out.push({ sha256: m[1].toLowerCase(), size: Number(m[2]), path: m[3] });
  }
  return out;
}

/** Bytes in decimal units, as cards are sold (1 MB = 10⁶ bytes). */
export function formatBytes(n: number): string {
  if (n < 1000) return `${n} B`;
  const units = ["kB", "MB", "GB", "TB"];
  let v = n;
  let i = -1;
  while (v >= 1000 && i < units.length - 1) {
    v /= 1000;
    i++;
  }
  return `${v.toLocaleString("en", { maximumFractionDigits: v < 10 ? 2 : 1 })} ${units[i]}`;
}
