import { describe, expect, it } from "vitest";
import { CUES } from "../config/schema";
import { readWav } from "./riff";
import { synthFont } from "./synth";

describe("demo font synthesis", () => {
  it("makes a clean 44.1 kHz 16-bit mono WAV per cue, never clipped or silent, and the same bytes every time", () => {
    const files = synthFont(CUES, 110);
    expect(files.map((f) => f.name)).toContain("swing-2.wav");
    for (const f of files) {
      const r = readWav(f.bytes);
      expect(r.findings).toEqual([]);
      expect(r.format).toMatchObject({ sampleRate: 44100, bitsPerSample: 16, channels: 1 });
      expect(r.clippedSamples).toBe(0);
      expect(r.peak).toBeGreaterThan(0.05);
      expect(r.durationMs).toBeLessThanOrEqual(1000);
    }
    expect(synthFont(["clash"], 110)[0].bytes).toEqual(files.find((f) => f.name === "clash-1.wav")!.bytes);
  });
});
