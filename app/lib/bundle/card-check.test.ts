// Comparing a card with its manifest: missing, extra and changed files, names matched without
// case (as FAT32 does), the card's own top folder recognised, system files left out.
import { describe, expect, it } from "vitest";
import { cardRelative, compareCard, formatBytes, needsHash, parseManifest } from "./card-check";

const h = (c: string) => c.repeat(64);
const expected = [
  { path: "kestrel-generic-header.h", size: 10, sha256: h("a") },
  { path: "ashfall/hum.wav", size: 100, sha256: h("b") },
  { path: "ashfall/clash-1.wav", size: 50, sha256: h("c") },
  { path: "MANIFEST.txt", size: 5, sha256: h("d") },
];

describe("checking a card against the manifest", () => {
  it("lists missing, extra and changed (by size, then by content) files", () => {
    const r = compareCard(expected, [
      { path: "KESTREL-GENERIC-HEADER.H", size: 10, sha256: h("a") },
      { path: "ashfall/hum.wav", size: 100, sha256: h("e") },
      { path: "ashfall/clash-1.wav", size: 49, sha256: null },
      { path: "ashfall/notes.txt", size: 3, sha256: null },
      { path: ".Trashes/501/x", size: 3, sha256: null },
      { path: "System Volume Information/IndexerVolumeGuid", size: 76, sha256: null },
    ]);
    expect(r.same).toEqual(["kestrel-generic-header.h"]);
    expect(r.missing.map((m) => m.path)).toEqual(["MANIFEST.txt"]);
    expect(r.extra.map((m) => m.path)).toEqual(["ashfall/notes.txt"]);
    expect(r.changed.map((c) => [c.path, c.why])).toEqual([["ashfall/hum.wav", "content"], ["ashfall/clash-1.wav", "size"]]);
    expect(r.ignored).toHaveLength(2);
  });
  it("hashes only files whose size agrees with what the manifest expects", () => {
    expect(needsHash(expected, "Ashfall/Hum.wav", 100)).toBe(true);
    expect(needsHash(expected, "ashfall/hum.wav", 99)).toBe(false);
    expect(needsHash(expected, "other.wav", 100)).toBe(false);
  });
  it("takes a chosen folder's own name off the paths, unless the manifest has that folder", () => {
    expect(cardRelative(["SDCARD/ashfall/hum.wav", "SDCARD/MANIFEST.txt"], expected.map((e) => e.path))("SDCARD/ashfall/hum.wav")).toBe("ashfall/hum.wav");
    expect(cardRelative(["ashfall/hum.wav", "ashfall/clash-1.wav"], expected.map((e) => e.path))("ashfall/hum.wav")).toBe("ashfall/hum.wav");
    expect(cardRelative(["MANIFEST.txt", "ashfall/hum.wav"], expected.map((e) => e.path))("ashfall/hum.wav")).toBe("ashfall/hum.wav");
  });
  it("reads a card's MANIFEST.txt and writes sizes in decimal units", () => {
    const text = `# Kestrel, revision 3: every file\n${h("a")}  10  kestrel-generic-header.h\n${h("b")}  100  ashfall/hum 2.wav\n`;
    expect(parseManifest(text)).toEqual([
      { sha256: h("a"), size: 10, path: "kestrel-generic-header.h" },
      { sha256: h("b"), size: 100, path: "ashfall/hum 2.wav" },
    ]);
    expect([formatBytes(999), formatBytes(1500), formatBytes(32e9), formatBytes(123_456_789)]).toEqual(["999 B", "1.5 kB", "32 GB", "123.5 MB"]);
  });
});
