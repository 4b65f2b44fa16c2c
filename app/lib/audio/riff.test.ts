import { describe, expect, it } from "vitest";
import wavefile from "wavefile";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { analyzeWavFile, analyzeWavStream } from "./analyze";
import { readWav, WavReader, type WavReport } from "./riff";
import { chunk, fmtBody, pcmBytes, riff, simpleWav } from "./wav-build";

const codes = (r: WavReport) => r.findings.map((f) => f.code);

function tone(frames: number, channels: number, amp = 0.5): number[] {
  const out: number[] = [];
  for (let i = 0; i < frames; i++) for (let c = 0; c < channels; c++) out.push(amp * Math.sin((2 * Math.PI * (220 + 110 * c) * i) / 8000));
  return out;
}

/** Feeds the bytes in pieces of `size` bytes, so samples and headers split across pieces. */
function readInPieces(bytes: Uint8Array, size: number): WavReport {
  const r = new WavReader();
  for (let i = 0; i < bytes.length; i += size) r.push(bytes.subarray(i, i + size));
  return r.finish();
}

describe("WAV reader against wavefile 11 (npm reference library)", () => {
  const depths = ["8", "16", "24", "32", "32f"] as const;
  const rates = [8000, 22050, 44100, 48000, 96000];
  for (const depth of depths)
    for (const rate of rates)
      for (const channels of [1, 2]) {
        it(`${depth}-bit ${rate} Hz ${channels === 1 ? "mono" : "stereo"}`, () => {
          const frames = 1001;
          const inter = tone(frames, channels, 0.7);
          // wavefile wants integer samples for integer depths and de-interleaved channels.
          const full = depth === "8" ? 127 : depth === "16" ? 32767 : depth === "24" ? 8388607 : depth === "32" ? 2147483647 : 1;
          const toCode = (x: number) => (depth === "32f" ? x : Math.round(x * full) + (depth === "8" ? 128 : 0));
          const perChannel = Array.from({ length: channels }, (_, c) => inter.filter((_, i) => i % channels === c).map(toCode));
          const ref = new wavefile.WaveFile();
          ref.fromScratch(channels, rate, depth, channels === 1 ? perChannel[0] : perChannel);
          const bytes = ref.toBuffer();
          const back = new wavefile.WaveFile(bytes);
          const fmt = back.fmt as { numChannels: number; sampleRate: number; bitsPerSample: number; audioFormat: number };
          const samples = back.getSamples(true, Float64Array) as unknown as Float64Array;

          const ours = readInPieces(bytes, 777);
          // wavefile writes no pad byte after an odd-sized data chunk (8- and 24-bit mono here).
          const odd = (bytes.length - 44) % 2 === 1;
          expect(codes(ours)).toEqual(odd ? ["missing-pad-byte"] : []);
          expect(ours.format?.channels).toBe(fmt.numChannels);
          expect(ours.format?.sampleRate).toBe(fmt.sampleRate);
          expect(ours.format?.bitsPerSample).toBe(fmt.bitsPerSample);
          expect(ours.format?.formatTag).toBe(fmt.audioFormat);
          expect(ours.frames).toBe(samples.length / channels);
          expect(ours.durationMs).toBeCloseTo((1000 * samples.length) / channels / rate, 6);
          // Peak from wavefile's decoded samples, scaled to full scale the same way.
          let refPeak = 0;
          if (depth === "32f") for (const s of samples) refPeak = Math.max(refPeak, Math.abs(s));
          else if (depth === "8") for (const s of samples) refPeak = Math.max(refPeak, Math.abs(s - 128) / 128);
          else for (const s of samples) refPeak = Math.max(refPeak, Math.abs(s) / (full + 1));
          expect(ours.peak).toBeCloseTo(refPeak, 9);
          expect(ours.clippedSamples).toBe(0);
        });
      }
});

describe("RIFF/WAVE layout (IBM/Microsoft Multimedia Programming Interface and Data Specifications 1.0)", () => {
  it("1 s of 44.1 kHz 16-bit mono: data 88,200 B, RIFF size 88,236, file 88,244 B (worked example, agrees with wavefile)", () => {
    const bytes = simpleWav(new Array(44100).fill(0));
    expect(bytes.length).toBe(88244);
    const r = readWav(bytes);
    expect(r.dataBytes).toBe(88200);
    expect(r.format?.byteRate).toBe(88200);
    expect(r.format?.blockAlign).toBe(2);
    expect(r.durationMs).toBe(1000);
    expect(new DataView(bytes.buffer).getUint32(4, true)).toBe(88236);
    const ref = new wavefile.WaveFile(bytes);
    expect((ref.data as { chunkSize: number }).chunkSize).toBe(88200);
  });

  it("walks LIST and fact chunks before fmt and data; never assumes data at offset 44", () => {
    const list = new TextEncoder().encode("INFOINAM\x05\0\0\0Hum!\0\0");
    const bytes = riff([chunk("LIST", list), chunk("fact", new Uint8Array([10, 0, 0, 0])), chunk("fmt ", fmtBody({ channels: 1, rate: 44100, bits: 16 })), chunk("data", pcmBytes(tone(10, 1), 16))]);
    const r = readWav(bytes);
    expect(r.findings).toEqual([]);
    expect(r.chunks.map((c) => c.id)).toEqual(["LIST", "fact", "fmt ", "data"]);
    expect(r.chunks[3].offset).toBeGreaterThan(44);
    expect(r.frames).toBe(10);
    expect(new wavefile.WaveFile(bytes).getSamples().length).toBe(10);
  });

  it("skips the pad byte after an odd-sized chunk (sizes exclude the pad)", () => {
    const bytes = riff([chunk("fmt ", fmtBody({ channels: 1, rate: 8000, bits: 8 })), chunk("junk", new Uint8Array(3)), chunk("data", pcmBytes(tone(5, 1), 8)), chunk("LIST", new Uint8Array(5))]);
    // data of 5 one-byte frames is odd too, so it is padded before the trailing LIST.
    const r = readInPieces(bytes, 1);
    expect(r.findings).toEqual([]);
    expect(r.chunks.map((c) => [c.id, c.size])).toEqual([["fmt ", 16], ["junk", 3], ["data", 5], ["LIST", 5]]);
    expect(r.frames).toBe(5);
  });

  it("reads a hand-built 6-channel extensible file (cbSize 22, channel mask, PCM SubFormat GUID)", () => {
    const frames = 200;
    const bytes = riff([chunk("fmt ", fmtBody({ channels: 6, rate: 48000, bits: 24, extensible: { validBits: 24, mask: 0x3f } })), chunk("data", pcmBytes(tone(frames, 6, 0.25), 24))]);
    const r = readWav(bytes);
    expect(r.findings).toEqual([]);
    expect(r.format).toMatchObject({ extensible: true, encoding: "pcm", channels: 6, validBits: 24, channelMask: 0x3f, subFormat: "00000001-0000-0010-8000-00AA00389B71" });
    expect(r.frames).toBe(frames);
    // wavefile parses the same layout (it only writes a wrong tag for 6 channels, so we build it).
    const ref = new wavefile.WaveFile(bytes);
    expect((ref.fmt as { numChannels: number }).numChannels).toBe(6);
    expect(ref.getSamples(true).length).toBe(frames * 6);
  });

  it("reads extensible float and reports an unknown SubFormat", () => {
    const flt = readWav(riff([chunk("fmt ", fmtBody({ channels: 2, rate: 44100, bits: 32, extensible: { subTag: 3, mask: 3 } })), chunk("data", pcmBytes(tone(8, 2), 32, true))]));
    expect(flt.format?.encoding).toBe("float");
    expect(flt.ok).toBe(true);
    const odd = readWav(riff([chunk("fmt ", fmtBody({ channels: 1, rate: 44100, bits: 16, extensible: { subTag: 0x55 } })), chunk("data", new Uint8Array(4))]));
    expect(codes(odd)).toContain("unknown-subformat");
  });

  it("counts clipped samples and gives the peak in dBFS", () => {
    const r = readWav(simpleWav([0, 1, -1, 0.5, 1, 0.25]));
    expect(r.clippedSamples).toBe(3);
    expect(r.peak).toBe(1);
    expect(r.peakDbfs).toBe(0);
    const half = readWav(simpleWav([0.5, -0.25]));
    expect(half.peakDbfs!).toBeCloseTo(-6.02, 1);
  });

  it("reads Node Buffers that are views at odd offsets of a shared pool (as file streams hand them)", () => {
    const samples = tone(3001, 1).map((x, i) => (i === 1500 ? 1 : i === 2000 ? -1 : x));
    for (const [bits, float] of [[16, false], [24, false], [32, false], [32, true], [64, true]] as const) {
      const bytes = simpleWav(samples, { bits, float });
      const pool = Buffer.alloc(bytes.length + 4096);
      const r = new WavReader();
      // Each piece is a Buffer view into the pool at an odd offset, of an odd length.
      for (let i = 0, at = 1; i < bytes.length; i += 1001, at += 1003) {
        const piece = bytes.subarray(i, i + 1001);
        const view = pool.subarray(at % 3001, (at % 3001) + piece.length);
        view.set(piece);
        r.push(view);
      }
      const ours = r.finish();
      expect([bits, float, ours.findings]).toEqual([bits, float, []]);
      expect(ours.peak).toBe(1);
      expect(ours.clippedSamples).toBe(2);
      expect(ours).toEqual(readWav(bytes));
    }
  });

  it("counts NaN and infinite float samples and keeps the finite peak", () => {
    const r = readWav(simpleWav([0.5, NaN, Infinity, -0.25], { bits: 32, float: true }));
    expect(r.findings.map((f) => f.code)).toEqual(["non-finite-samples"]);
    expect(r.peak).toBe(0.5);
    expect(r.clippedSamples).toBe(1);
  });

  it("warns when block align and byte rate disagree with the channels and depth", () => {
    const fmt = fmtBody({ channels: 2, rate: 44100, bits: 16 });
    new DataView(fmt.buffer).setUint16(12, 3, true);
    new DataView(fmt.buffer).setUint32(8, 1, true);
    expect(codes(readWav(riff([chunk("fmt ", fmt), chunk("data", new Uint8Array(8))])))).toEqual(["block-align-mismatch", "byte-rate-mismatch"]);
  });
});

describe("broken files get a finding, never a throw", () => {
  it("a data chunk claiming 4 GB in a small file: the header lies", () => {
    const bytes = riff([chunk("fmt ", fmtBody({ channels: 1, rate: 44100, bits: 16 })), chunk("data", pcmBytes(tone(100, 1), 16), { claim: 0xfffffff0 })]);
    const r = readWav(bytes);
    expect(r.ok).toBe(false);
    expect(codes(r)).toEqual(expect.arrayContaining(["data-size-lies", "truncated"]));
    expect(r.frames).toBe(100);
  });

  it("a file cut off halfway", () => {
    const whole = simpleWav(tone(1000, 1));
    const r = readInPieces(whole.subarray(0, 1000), 64);
    expect(codes(r)).toContain("truncated");
    expect(r.frames).toBe((1000 - 44) / 2);
    expect(codes(readWav(whole.subarray(0, 30)))).toContain("truncated");
    expect(codes(readWav(whole.subarray(0, 7)))).toEqual(["too-short"]);
    expect(codes(readWav(new Uint8Array(0)))).toEqual(["empty"]);
  });

  it("compressed, big-endian and RF64 files, a missing fmt or data, and garbage", () => {
    expect(codes(readWav(riff([chunk("fmt ", fmtBody({ tag: 0x55, channels: 1, rate: 44100, bits: 16 })), chunk("data", new Uint8Array(4))])))).toContain("unsupported-encoding");
    const rifx = simpleWav([0]);
    rifx.set([0x52, 0x49, 0x46, 0x58], 0);
    expect(codes(readWav(rifx))).toEqual(["big-endian"]);
    expect(codes(readWav(riff([chunk("data", new Uint8Array(4))])))).toEqual(["data-before-fmt", "no-fmt"]);
    expect(codes(readWav(riff([chunk("fmt ", fmtBody({ channels: 1, rate: 44100, bits: 16 }))])))).toEqual(["no-data"]);
    const garbage = riff([chunk("fmt ", fmtBody({ channels: 1, rate: 44100, bits: 16 }))]);
    const bad = new Uint8Array(garbage.length + 8);
    bad.set(garbage);
    new DataView(bad.buffer).setUint32(4, bad.length - 8, true);
    expect(codes(readWav(bad))).toContain("garbled-chunk");
  });

  it("random bytes never throw", () => {
    let seed = 7;
    const rnd = () => ((seed = (seed * 1103515245 + 12345) >>> 0) >>> 16) & 0xff;
    const base = simpleWav(tone(50, 1));
    for (let t = 0; t < 500; t++) {
      const b = base.slice();
      for (let k = 0; k < 6; k++) b[rnd() % 60] = rnd();
      expect(() => readInPieces(b.subarray(0, 20 + (rnd() % (b.length - 20))), 1 + (rnd() % 40))).not.toThrow();
    }
  });

  it("a file named .wav that is a PNG is sniffed by its content", async () => {
    const png = Uint8Array.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13, 0x49, 0x48, 0x44, 0x52, 0, 0, 0, 1, 0, 0, 0, 1, 8, 6, 0, 0, 0, 0x1f, 0x15, 0xc4, 0x89]);
    const r = await analyzeWavStream((async function* () { yield png; })());
    expect(r.ok).toBe(false);
    expect(r.findings[0]).toMatchObject({ code: "not-wav" });
    expect(r.findings[0].message).toContain("PNG");
  });

  it("streams a file in pieces with the same answer as a whole read", async () => {
    const bytes = simpleWav(tone(5000, 2), { channels: 2, bits: 24 });
    const r = await analyzeWavStream((async function* () { for (let i = 0; i < bytes.length; i += 333) yield bytes.subarray(i, i + 333); })());
    expect(r).toEqual(readWav(bytes));
  });

  it("reads a file on disk through two reused buffers with the same answer as a whole read", async () => {
    const dir = mkdtempSync(path.join(tmpdir(), "hb-wav-"));
    try {
      for (const [bits, float] of [[16, false], [24, false], [32, true]] as const) {
        const bytes = simpleWav(tone(9001, 2, 0.8), { channels: 2, bits, float });
        const file = path.join(dir, `t${bits}.wav`);
        writeFileSync(file, bytes);
        // Odd piece sizes put samples, chunk headers and the sniffed head across reads.
        for (const piece of [4099, 333, 1 << 20]) expect(await analyzeWavFile(file, piece)).toEqual(readWav(bytes));
      }
      const png = path.join(dir, "hum.wav");
      writeFileSync(png, Uint8Array.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13, 0x49, 0x48, 0x44, 0x52, ...new Array(5000).fill(0)]));
      expect((await analyzeWavFile(png, 1000)).findings[0]).toMatchObject({ code: "not-wav" });
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
