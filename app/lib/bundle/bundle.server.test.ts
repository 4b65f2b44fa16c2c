// The card bundle: FAT32 names (Microsoft FAT specification and "Naming Files, Paths, and
// Namespaces"), a plan with a manifest, and a zip that is byte-identical for the same inputs,
// with WAVs stored and text deflated; JSZip (an independent reader) reads it back.
import { createHash } from "node:crypto";
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import JSZip from "jszip";
import { afterAll, describe, expect, it } from "vitest";
import { synthFont } from "../audio/synth";
import { demoConfig } from "../config/demo";
import { readZipDirectory } from "../fonts/zip.server";
import { DiskStorage } from "../storage/disk.server";
import { cardNames, sanitizeLong, sanitizeShort } from "./names";
import { cardUsage, CLUSTER_BYTES, planBundle, type BundleInput } from "./plan";
import { zipBundle } from "./zip.server";

const work = mkdtempSync(path.join(tmpdir(), "hb-bundle-"));
afterAll(() => rmSync(work, { recursive: true, force: true }));

describe("card names (FAT32 long names, 8.3 short names)", () => {
  it("replaces characters FAT32 forbids and drops trailing dots and spaces", () => {
    expect(sanitizeLong('hum?:"*<>|.wav')).toBe("hum_______.wav");
    expect(sanitizeLong("notes. . ")).toBe("notes");
    expect(sanitizeLong("...")).toBe("_");
  });
  it("makes 8.3 names: upper case, base ≤ 8, extension ≤ 3, forbidden characters replaced", () => {
    expect(sanitizeShort("ignition-long.wave")).toBe("IGNITION.WAV");
    expect(sanitizeShort("a+b,c;d=e[f].wav")).toBe("A_B_C_D_.WAV");
    expect(sanitizeShort("hum 2.wav")).toBe("HUM2.WAV");
  });
  it("reports clashes after sanitising (never merged), reserved device names and long paths", () => {
    const r = cardNames(["ash/hum?.wav", "ash/hum*.wav", "ash/CON.wav", `ash/${"x".repeat(300)}.wav`], "long");
    const codes = r.findings.map((f) => f.code);
    expect(codes).toEqual(expect.arrayContaining(["name-clash", "reserved-name", "name-too-long", "path-too-long"]));
    expect(r.findings.find((f) => f.code === "name-clash")!.message).toContain('both become "ash/hum_.wav"');
    const short = cardNames(["ashfall/swing-1.wav", "ashfall/swing-10.wav"], "8.3");
    expect(short.names.get("ashfall/swing-10.wav")).toBe("ASHFALL/SWING-10.WAV");
    expect(cardNames(["ashfall/swinging-a.wav", "ashfall/swinging-b.wav"], "8.3").findings.map((f) => f.code)).toContain("name-clash");
  });
});

describe("the card zip", () => {
  const store = new DiskStorage(path.join(work, "files"));
  async function input(): Promise<BundleInput> {
    const files: { path: string; size: number; sha256: string; key: string }[] = [];
    for (const f of synthFont(["hum", "clash"], 110)) {
      const s = await store.put((async function* () { yield f.bytes; })());
      files.push({ path: f.name, size: s.size, sha256: s.sha256, key: s.key });
    }
    const config = demoConfig();
    return {
      buildName: "Kestrel",
      clientName: "Client One",
      config,
      label: "Kestrel, revision 1, template generic-header v3",
      wiring: { svg: "<svg xmlns=\"http://www.w3.org/2000/svg\"/>\n", ok: true },
      rendered: { name: "kestrel-generic-header.h", text: "// config\n#define PRESETS 5\n" },
      readable: { name: "readable-config.txt", text: "Presets: Ashfall, Glasswind\n" },
      fonts: config.fonts.map((f) => ({ id: f.id, name: f.name, folder: f.folder, status: f.status, files: f.id === "ashfall" ? files : [] })),
      mode: "long",
      cardBytes: 32e9,
    };
  }
  async function zipBytes(i: BundleInput) {
    const parts: Buffer[] = [];
    for await (const p of zipBundle(planBundle(i), store)) parts.push(p as Buffer);
    return Buffer.concat(parts);
  }

  it("is byte-identical for the same inputs, stores WAVs, deflates text, and lists every file in the manifest", async () => {
    const i = await input();
    const a = await zipBytes(i);
    const b = await zipBytes(await input());
    expect(createHash("sha256").update(a).digest("hex")).toBe(createHash("sha256").update(b).digest("hex"));
    const file = path.join(work, "card.zip");
    (await import("node:fs")).writeFileSync(file, a);
    const entries = await readZipDirectory(file, { maxEntries: 100, maxEntryBytes: 1e9, maxTotalBytes: 1e9 });
    expect(entries.map((e) => [e.path, e.method])).toEqual([
      ["kestrel-generic-header.h", 8],
      ["readable-config.txt", 8],
      ["handoff.html", 8],
      ["wiring.svg", 8],
      ["ashfall/clash-1.wav", 0],
      ["ashfall/clash-2.wav", 0],
      ["ashfall/hum.wav", 0],
      ["MANIFEST.txt", 8],
    ]);
    // An independent reader (JSZip) agrees with the manifest's sizes and SHA-256.
    const zip = await JSZip.loadAsync(a);
    const manifest = await zip.file("MANIFEST.txt")!.async("string");
    const lines = manifest.trim().split("\n").slice(1);
    expect(lines).toHaveLength(7);
    expect(manifest.split("\n")[0]).toBe("# Kestrel, revision 1, template generic-header v3: every file of this card with its size in bytes and SHA-256.");
    for (const line of lines) {
      const [hash, size, name] = line.split("  ");
      const bytes = await zip.file(name)!.async("nodebuffer");
      expect([name, bytes.length, createHash("sha256").update(bytes).digest("hex")]).toEqual([name, Number(size), hash]);
    }
    expect(await zip.file("handoff.html")!.async("string")).toContain("Charge only between 0 °C and 40 °C");
  });

  it("reports a promised font, and a card too small for the files (decimal bytes)", async () => {
    const i = await input();
    const plan = planBundle({ ...i, cardBytes: 1e5 });
    const codes = plan.findings.map((f) => f.code);
    expect(codes).toContain("font-not-arrived");
    expect(plan.findings.find((f) => f.code === "card-too-small")!.message).toContain("holds 100,000");
  });

  it("counts whole 32 KiB clusters per file and folder, and card sizes in decimal bytes (1 GB = 10⁹, not 2³⁰)", async () => {
    expect(CLUSTER_BYTES).toBe(32768);
    expect(cardUsage([{ path: "a.h", size: 1 }, { path: "ash/hum.wav", size: 32769 }, { path: "ash/clash.wav", size: 0 }])).toBe(32768 + 65536 + 0 + 32768);
    const i = await input();
    // 1.05 × 10⁹ bytes fits in 2³⁰ = 1,073,741,824 but not in a 1 GB card as sold.
    const big = { path: "huge.wav", size: 1_050_000_000, sha256: "0".repeat(64), key: "sha256/00/x" };
    const plan = planBundle({ ...i, cardBytes: 1e9, fonts: [{ id: "ashfall", name: "Ashfall", folder: "ashfall", status: "received", files: [big] }] });
    expect(plan.findings.find((f) => f.code === "card-too-small")!.message).toContain("a 1 GB card holds 1,000,000,000 bytes (decimal, as cards are sold)");
    const near = planBundle({ ...i, cardBytes: 1.08e9, fonts: [{ id: "ashfall", name: "Ashfall", folder: "ashfall", status: "received", files: [big] }] });
    expect(near.findings.map((f) => f.code)).toContain("card-nearly-full");
    expect(near.findings.map((f) => f.code)).not.toContain("card-too-small");
  });
});
