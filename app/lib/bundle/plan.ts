// What goes on the card, in a fixed order, with sizes, SHA-256 and findings: the rendered
// config, a readable copy, the handoff sheet, each font in its own folder, and a manifest of
// every file. The same inputs give the same plan, so the zip built from it is byte-identical.
import { createHash } from "node:crypto";
import type { Config } from "../config/schema";
import { handoffSheet } from "./handoff";
import { cardNames, MAX_FILE_BYTES, type NameFinding, type NameMode } from "./names";

export type BundleFont = { id: string; name: string; folder: string; status: string; files: { path: string; size: number; sha256: string; key: string }[] };
export type BundleInput = {
  buildName: string;
  clientName: string;
  config: Config;
  rendered: { name: string; text: string };
  readable: { name: string; text: string } | null;
  fonts: BundleFont[];
  mode: NameMode;
  /** Card capacity in bytes, decimal as cards are sold (32 GB = 32 × 10⁹). */
  cardBytes: number;
};
export type BundleEntry = { path: string; size: number; sha256: string } & ({ kind: "text"; bytes: Buffer } | { kind: "stored"; key: string });
export type BundlePlan = { entries: BundleEntry[]; findings: NameFinding[]; totalBytes: number };

export const MANIFEST_NAME = "MANIFEST.txt";
const sha = (b: Buffer) => createHash("sha256").update(b).digest("hex");
const text = (path: string, s: string): BundleEntry => {
  const bytes = Buffer.from(s, "utf8");
  return { kind: "text", path, bytes, size: bytes.length, sha256: sha(bytes) };
};

export function planBundle(input: BundleInput): BundlePlan {
  const wanted: BundleEntry[] = [text(input.rendered.name, input.rendered.text)];
  if (input.readable) wanted.push(text(input.readable.name, input.readable.text));
  wanted.push(text("handoff.html", handoffSheet(input.buildName, input.clientName, input.config)));
  const findings: NameFinding[] = [];
  for (const f of input.fonts) {
    if (f.status === "promised") findings.push({ severity: "warning", code: "font-not-arrived", path: f.folder, message: `Font "${f.name}" has not arrived; its folder is not on the card.` });
    if (f.status === "invalid") findings.push({ severity: "warning", code: "font-broken", path: f.folder, message: `Font "${f.name}" failed its checks; its files are on the card as they arrived.` });
    const files = [...f.files].sort((a, b) => (a.path < b.path ? -1 : a.path > b.path ? 1 : 0));
    for (const file of files) wanted.push({ kind: "stored", path: `${f.folder}/${file.path}`, size: file.size, sha256: file.sha256, key: file.key });
  }
  const { names, findings: nameFindings } = cardNames([...wanted.map((e) => e.path), MANIFEST_NAME], input.mode);
  findings.push(...nameFindings);
  const entries = wanted.map((e) => ({ ...e, path: names.get(e.path)! }));
  for (const e of entries) if (e.size > MAX_FILE_BYTES) findings.push({ severity: "error", code: "file-too-large", path: e.path, message: `"${e.path}" is larger than FAT32's 4 GB file limit.` });
  const manifest = text(
    names.get(MANIFEST_NAME)!,
    `# Every file of this card with its size in bytes and SHA-256.\n${entries.map((e) => `${e.sha256}  ${e.size}  ${e.path}`).join("\n")}\n`,
  );
  entries.push(manifest);
  const totalBytes = entries.reduce((n, e) => n + e.size, 0);
  if (totalBytes > input.cardBytes)
    findings.push({ severity: "error", code: "card-too-small", path: "", message: `The card's files take ${totalBytes.toLocaleString("en")} bytes; a ${(input.cardBytes / 1e9).toLocaleString("en")} GB card holds ${input.cardBytes.toLocaleString("en")}.` });
  return { entries, findings, totalBytes };
}
