// What goes on the card, in a fixed order, with sizes, SHA-256 and findings: the rendered
// config, a readable copy, the handoff sheet, the wiring picture, each font in its own folder,
// and a manifest of every file. The same inputs give the same plan, so the zip built from it is
// byte-identical. The card check counts whole clusters, as a FAT32 card stores files.
import { createHash } from "node:crypto";
import type { Config } from "../config/schema";
import { handoffSheet } from "./handoff";
import { cardNames, MAX_FILE_BYTES, type NameFinding, type NameMode } from "./names";

export type BundleFont = { id: string; name: string; folder: string; status: string; files: { path: string; size: number; sha256: string; key: string }[] };
export type BundleInput = {
  buildName: string;
  clientName: string;
  config: Config;
  /** What the manifest's first line names: build, revision and template (a checksum then names a bundle). */
  label: string;
  rendered: { name: string; text: string };
  readable: { name: string; text: string } | null;
  /** The rig's wiring picture as SVG; `ok: false` is the picture that says why the rig cannot be drawn. */
  wiring: { svg: string; ok: boolean } | null;
  fonts: BundleFont[];
  mode: NameMode;
  /** Card capacity in bytes, decimal as cards are sold (32 GB = 32 × 10⁹). */
  cardBytes: number;
};
export type BundleEntry = { path: string; size: number; sha256: string } & ({ kind: "text"; bytes: Buffer } | { kind: "stored"; key: string });
export type BundlePlan = {
  entries: BundleEntry[];
  findings: NameFinding[];
  /** The files' bytes added up. */
  totalBytes: number;
  /** What they take on the card: each file and folder in whole clusters. */
  cardUsedBytes: number;
  cardBytes: number;
};

export const MANIFEST_NAME = "MANIFEST.txt";
export const WIRING_NAME = "wiring.svg";
/**
 * FAT32 allocation unit of SDHC cards (4–32 GB) as the SD Association's formatter lays them out:
 * 32 KiB (common practice; value from memory of the SD "File System Specification"). Larger
 * units only make a file take more room, so this errs on the side of a card that fits.
 */
export const CLUSTER_BYTES = 32 * 1024;
/** Past this share of the label, the file system's own tables may not leave room (common practice margin). */
export const CARD_NEAR_FULL = 0.97;

/** Bytes the entries take on a FAT32 card: every file rounded up to whole clusters, one cluster per folder. */
export function cardUsage(paths: { path: string; size: number }[], cluster = CLUSTER_BYTES): number {
  const folders = new Set<string>();
  let used = 0;
  for (const e of paths) {
    used += Math.ceil(e.size / cluster) * cluster;
    const parts = e.path.split("/");
    for (let i = 1; i < parts.length; i++) folders.add(parts.slice(0, i).join("/").toLowerCase());
  }
  return used + folders.size * cluster;
}
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
  if (input.wiring) {
    wanted.push(text(WIRING_NAME, input.wiring.svg));
    if (!input.wiring.ok) findings.push({ severity: "warning", code: "wiring-refused", path: WIRING_NAME, message: "The rig cannot be drawn as it is; the wiring picture on the card says why." });
  }
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
    `# ${input.label.replace(/[\r\n]+/g, " ")}: every file of this card with its size in bytes and SHA-256.\n${entries.map((e) => `${e.sha256}  ${e.size}  ${e.path}`).join("\n")}\n`,
  );
  entries.push(manifest);
  const totalBytes = entries.reduce((n, e) => n + e.size, 0);
  const cardUsedBytes = cardUsage(entries);
  const gb = `${(input.cardBytes / 1e9).toLocaleString("en", { maximumFractionDigits: 6 })} GB card`;
  const used = `The card's files take ${cardUsedBytes.toLocaleString("en")} bytes in ${CLUSTER_BYTES / 1024} KiB clusters (${totalBytes.toLocaleString("en")} bytes of data)`;
  if (cardUsedBytes > input.cardBytes) findings.push({ severity: "error", code: "card-too-small", path: "", message: `${used}; a ${gb} holds ${input.cardBytes.toLocaleString("en")} bytes (decimal, as cards are sold).` });
  else if (cardUsedBytes > input.cardBytes * CARD_NEAR_FULL)
    findings.push({ severity: "warning", code: "card-nearly-full", path: "", message: `${used}: more than ${Math.round(CARD_NEAR_FULL * 100)} % of a ${gb}, and the file system's own tables take some of it. Choose a larger card.` });
  return { entries, findings, totalBytes, cardUsedBytes, cardBytes: input.cardBytes };
}
