// The card zip against Debian's `zip -0 -r` on the same files: 500 MB of generated WAVs in five
// font folders, written to the content-addressed disk store as uploads are, then zipped by our
// yazl stream (in a child process, so its peak resident memory is measured alone) and by zip
// (stored, no compression, like our WAV entries). Best of 3 rounds each, alternating, page cache
// warm for both. Targets: at least 0.5× zip's speed; peak RSS under 200 MB. Files are removed.
import { execFileSync, spawnSync } from "node:child_process";
import { randomFillSync } from "node:crypto";
import { createReadStream, mkdirSync, mkdtempSync, rmSync, statSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { chunk, fmtBody, riff } from "../../app/lib/audio/wav-build";
import type { BundleInput } from "../../app/lib/bundle/plan";
import { demoConfig } from "../../app/lib/config/demo";
import { DiskStorage } from "../../app/lib/storage/disk.server";

const MB = 1024 * 1024;
const TOTAL = 500 * MB;
const FONTS = 5;
const PER_FONT = 10;

function hasZip() {
  return spawnSync("zip", ["-v"], { stdio: "ignore" }).status === 0;
}

export async function run(): Promise<void> {
  if (!hasZip()) {
    console.log("bundle: Debian's zip is not installed (apt-get install -y zip); skipped.");
    return;
  }
  const dir = mkdtempSync(path.join(tmpdir(), "hb-bench-bundle-"));
  try {
    const card = path.join(dir, "card");
    const store = new DiskStorage(path.join(dir, "store"));
    const perFile = Math.floor(TOTAL / (FONTS * PER_FONT));
    const data = new Uint8Array(perFile - 44);
    const fonts: BundleInput["fonts"] = [];
    for (let f = 0; f < FONTS; f++) {
      const folder = `benchfont${f + 1}`;
      mkdirSync(path.join(card, folder), { recursive: true });
      const files = [];
      for (let i = 0; i < PER_FONT; i++) {
        randomFillSync(data);
        const name = `hum-${i + 1}.wav`;
        const file = path.join(card, folder, name);
        writeFileSync(file, riff([chunk("fmt ", fmtBody({ channels: 1, rate: 44100, bits: 16 })), chunk("data", data)]));
        const s = await store.put(createReadStream(file));
        files.push({ path: name, size: s.size, sha256: s.sha256, key: s.key });
      }
      fonts.push({ id: folder, name: folder, folder, status: "received", files });
    }
    const input: BundleInput = {
      buildName: "Bench",
      clientName: "Client One",
      config: demoConfig(),
      label: "Bench, revision 1, template generic-header v1",
      rendered: { name: "bench-generic-header.h", text: "// bench\n" },
      readable: { name: "readable-config.txt", text: "bench\n" },
      wiring: null,
      fonts,
      mode: "long",
      cardBytes: 32e9,
    };
    const inputFile = path.join(dir, "input.json");
    writeFileSync(inputFile, JSON.stringify(input));
    const bytes = fonts.reduce((n, f) => n + f.files.reduce((m, x) => m + x.size, 0), 0);
    const child = fileURLToPath(new URL("./bundle-child.ts", import.meta.url));
    const oursOut = path.join(dir, "ours.zip");
    const zipOut = path.join(dir, "zip.zip");
    const zipMs: number[] = [];
    const oursMs: number[] = [];
    let peak = 0;
    for (let round = 0; round < 3; round++) {
      rmSync(zipOut, { force: true });
      let t = performance.now();
      execFileSync("zip", ["-0", "-r", "-q", zipOut, "."], { cwd: card });
      zipMs.push(performance.now() - t);
      rmSync(oursOut, { force: true });
      t = performance.now();
      const r = spawnSync(process.execPath, [...process.execArgv, child, inputFile, path.join(dir, "store"), oursOut], { encoding: "utf8" });
      if (r.status !== 0) throw new Error(`bundle child failed: ${r.stderr}`);
      const out = JSON.parse(r.stdout.trim().split("\n").pop()!) as { ms: number; maxRssMB: number };
      oursMs.push(out.ms);
      peak = Math.max(peak, out.maxRssMB);
      if (process.env.HB_BENCH_VERBOSE) console.log(`  round ${round}: zip ${zipMs[round].toFixed(0)} ms, ours ${out.ms.toFixed(0)} ms (child wall ${(performance.now() - t).toFixed(0)} ms), RSS ${out.maxRssMB.toFixed(0)} MB`);
    }
    const zipRate = bytes / MB / (Math.min(...zipMs) / 1000);
    const ourRate = bytes / MB / (Math.min(...oursMs) / 1000);
    console.log(
      `card zip     ${(bytes / MB).toFixed(0)} MB in ${FONTS * PER_FONT} WAVs  ours ${ourRate.toFixed(0)} MB/s (${statSync(oursOut).size.toLocaleString("en")} B)  zip -0 -r ${zipRate.toFixed(0)} MB/s  ${(ourRate / zipRate).toFixed(2)}× zip (target ≥ 0.5×)`,
    );
    console.log(`card zip     peak resident memory of the Node process ${peak.toFixed(0)} MB (target < 200 MB)`);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
