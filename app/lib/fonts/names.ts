// Names of files inside an upload, checked before anything is written: a zip entry or a
// browser's file name is untrusted text that will become a path in storage and on an SD card.

export type NameCheck = { ok: true; path: string } | { ok: false; message: string };

/** Files that operating systems leave in archives; skipped without a word of complaint. */
export function isJunk(path: string): boolean {
  const base = path.slice(path.lastIndexOf("/") + 1);
  return path.startsWith("__MACOSX/") || base === ".DS_Store" || base.startsWith("._") || /^(thumbs\.db|desktop\.ini)$/i.test(base);
}

/** Check one raw name (as the archive or browser gave it) and answer a clean relative path. */
export function checkEntryName(raw: string): NameCheck {
  const shown = JSON.stringify(raw.length > 80 ? `${raw.slice(0, 80)}…` : raw);
  if (raw.length === 0) return { ok: false, message: "An entry has an empty name." };
  if (raw.length > 400) return { ok: false, message: `The name ${shown} is longer than 400 characters.` };
  if (/[\u0000-\u001f\u007f]/.test(raw)) return { ok: false, message: `The name ${shown} contains control characters.` };
  if (raw.includes("\uFFFD")) return { ok: false, message: `The name ${shown} is not valid UTF-8 text.` };
  if (raw.includes("\\")) return { ok: false, message: `The name ${shown} contains a backslash; zip names use "/" and a "\\" can climb out of a folder on Windows.` };
  if (/^[a-zA-Z]:/.test(raw)) return { ok: false, message: `The name ${shown} starts with a drive letter.` };
  if (raw.startsWith("/")) return { ok: false, message: `The name ${shown} is an absolute path.` };
  const parts = raw.replace(/\/$/, "").split("/");
  if (parts.some((p) => p === "..")) return { ok: false, message: `The name ${shown} climbs out of its folder with "..".` };
  if (parts.some((p) => p === "" || p === ".")) return { ok: false, message: `The name ${shown} has an empty or "." folder.` };
  return { ok: true, path: parts.join("/").normalize("NFC") };
}

/** Names the same on a case-insensitive file system (an SD card's FAT32) are refused, never merged. */
export function findCaseClash(paths: string[]): [string, string] | null {
  const seen = new Map<string, string>();
  for (const p of paths) {
    const k = p.toLowerCase();
    const before = seen.get(k);
    if (before !== undefined) return [before, p];
    seen.set(k, p);
  }
  return null;
}

/** When every file sits in one top folder (the usual "Ashfall/…" zip), drop that folder. */
export function stripCommonFolder(paths: string[]): { folder: string | null; strip: (p: string) => string } {
  const first = paths[0]?.split("/")[0];
  if (!first || paths.some((p) => !p.includes("/") || p.split("/")[0] !== first)) return { folder: null, strip: (p) => p };
  return { folder: first, strip: (p) => p.slice(first.length + 1) };
}

/** Decode a name's bytes: UTF-8 when it is valid UTF-8, refused otherwise (old code pages are ambiguous). */
export function decodeName(bytes: Uint8Array): string | null {
  try {
    return new TextDecoder("utf-8", { fatal: true }).decode(bytes);
  } catch {
    return null;
  }
}
