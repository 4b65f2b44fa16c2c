// WAV analysis throughput (sniff → chunk walk → peak and clipping, the same WavAnalysis an
// upload runs) against reading the same bytes with `cat > /dev/null`, in the same run on the same
// files (page cache warm for both), best of 7 rounds each. Target: at least 0.5× cat's rate.
// The headline reads the file as cat does, into reused buffers (analyzeWavFile); the second
// figure feeds the same analysis from fs.createReadStream, whose fresh buffer per piece costs
// more than the analysis itself, to show what a stream source adds.
import { execFileSync, spawn } from "node:child_process";
import { once } from "node:events";
import { createReadStream, mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { analyzeWavFile, analyzeWavStream } from "../../app/lib/audio/analyze";
import { chunk, fmtBody, riff } from "../../app/lib/audio/wav-build";

const MB = 1024 * 1024;

/** Best of the rounds: on a shared, loaded machine the fastest round is the least disturbed one. */
const best = (xs: number[]) => Math.min(...xs);

async function catAll(files: string[]) {
  const child = spawn("sh", ["-c", `cat ${files.map((f) => `'${f}'`).join(" ")} > /dev/null`], { stdio: "ignore" });
  await once(child, "exit");
}

/** A WAV of `bytes` bytes of pseudo-random samples (random data defeats nothing here, but keeps branches honest). */
function makeWav(bytes: number, bits: number, float: boolean) {
  const data = new Uint8Array(bytes);
  let s = 12345;
  const v = new DataView(data.buffer);
  if (float) for (let i = 0; i + 4 <= bytes; i += 4) v.setFloat32(i, (((s = (s * 1103515245 + 12345) >>> 0) / 0xffffffff) * 2 - 1) * 0.9, true);
  else for (let i = 0; i < bytes; i++) data[i] = (s = (s * 1103515245 + 12345) >>> 0) >>> 24;
  return riff([chunk("LIST", new Uint8Array(26)), chunk("fmt ", fmtBody({ tag: float ? 3 : 1, channels: 2, rate: 44100, bits })), chunk("data", data)]);
}

export async function run(): Promise<void> {
  const dir = mkdtempSync(path.join(tmpdir(), "hb-bench-audio-"));
  try {
    const kinds = [
      { label: "16-bit PCM", bits: 16, float: false },
      { label: "24-bit PCM", bits: 24, float: false },
      { label: "32-bit float", bits: 32, float: true },
    ];
    const perFile = 40 * MB;
    const filesPerKind = 3;
    for (const k of kinds) {
      const files: string[] = [];
      for (let i = 0; i < filesPerKind; i++) {
        const f = path.join(dir, `${k.bits}${k.float ? "f" : ""}-${i}.wav`);
        writeFileSync(f, makeWav(perFile, k.bits, k.float));
        files.push(f);
      }
      const total = perFile * filesPerKind;
      execFileSync("sh", ["-c", `cat ${files.map((f) => `'${f}'`).join(" ")} > /dev/null`]);
      const catMs: number[] = [];
      const oursMs: number[] = [];
      const streamMs: number[] = [];
      for (let round = 0; round < 7; round++) {
        let t = performance.now();
        await catAll(files);
        catMs.push(performance.now() - t);
        t = performance.now();
        for (const f of files) {
          const r = await analyzeWavFile(f, MB);
          if (!r.ok) throw new Error(`bench file did not read cleanly: ${JSON.stringify(r.findings)}`);
        }
        oursMs.push(performance.now() - t);
        t = performance.now();
        for (const f of files) {
          const r = await analyzeWavStream(createReadStream(f, { highWaterMark: MB }));
          if (!r.ok) throw new Error(`bench file did not read cleanly: ${JSON.stringify(r.findings)}`);
        }
        streamMs.push(performance.now() - t);
        if (process.env.HB_BENCH_VERBOSE) console.log(`  round ${round}: cat ${catMs[round].toFixed(0)} ms, ours ${oursMs[round].toFixed(0)} ms, from a stream ${streamMs[round].toFixed(0)} ms`);
      }
      const cat = total / MB / (best(catMs) / 1000);
      const ours = total / MB / (best(oursMs) / 1000);
      const stream = total / MB / (best(streamMs) / 1000);
      console.log(`${k.label.padEnd(13)} ${(total / MB).toFixed(0)} MB  ours ${ours.toFixed(0)} MB/s  cat ${cat.toFixed(0)} MB/s  ${(ours / cat).toFixed(2)}× cat (target ≥ 0.5×)  · from a read stream ${stream.toFixed(0)} MB/s, ${(stream / cat).toFixed(2)}×`);
      for (const f of files) rmSync(f);
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
