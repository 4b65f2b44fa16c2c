import { describe, expect, it } from "vitest";
import { simpleWav } from "../audio/wav-build";
import { readWav } from "../audio/riff";
import { compileLayout, DEFAULT_LAYOUT, parseLayoutText } from "./layout";
import { fontReport } from "./report";

describe("the default font layout", () => {
  const layout = compileLayout(DEFAULT_LAYOUT);
  it.each([
    ["hum.wav", "hum"],
    ["HUM.WAV", "hum"],
    ["hum-2.wav", "hum"],
    ["swing_04.wav", "swing"],
    ["swing/low.wav", "swing"],
    ["clash 3.wav", "clash"],
    ["impact7.wav", "clash"],
    ["ignition.wav", "ignite"],
    ["retract.wav", "retract"],
    ["startup.wav", "boot"],
    ["title.wav", "name"],
    ["lockup/loop-1.wav", "lockup"],
  ])("%s → %s", (path, cue) => expect(layout.match(path)).toBe(cue));
  it.each(["humming.wav", "hum.mp3", "notes/hum.wav", "swing/deep/low.wav", "readme.txt"])("%s matches no cue", (path) => expect(layout.match(path)).toBeNull());
});

describe("a workshop layout typed as lines", () => {
  it("parses cue: pattern lines and keeps order (first match wins)", () => {
    const r = parseLayoutText("Bench", "# ours\nclash: sfx/hit{n}.wav\nhum: sfx/*.wav\n");
    expect(r.ok).toBe(true);
    const l = compileLayout(r.ok ? r.layout : DEFAULT_LAYOUT);
    expect(l.match("sfx/hit12.wav")).toBe("clash");
    expect(l.match("sfx/loop.wav")).toBe("hum");
  });
  it("names the line and the cue that are wrong", () => {
    const r = parseLayoutText("Bench", "zap: a.wav\nnonsense\nhum: ../x.wav");
    expect(r.ok).toBe(false);
    expect(r.ok ? [] : r.errors).toEqual([
      'Line 2: write "cue: pattern", e.g. "hum: sfx/hum{n}.wav".',
      expect.stringContaining('Rule 1: "zap" is not a cue'),
      expect.stringContaining("Rule 2: a pattern is a path inside the font"),
    ]);
  });
});

describe("the font report", () => {
  const wav = (frames: number, o: Parameters<typeof simpleWav>[1] = {}) => readWav(simpleWav(new Array(frames).fill(0.25), o));
  it("lists cues present and missing, variants, totals and common-practice format warnings", () => {
    const files = [
      { path: "hum.wav", size: 100, wav: wav(44100) },
      { path: "swing-1.wav", size: 10, wav: wav(4410) },
      { path: "swing-2.wav", size: 10, wav: wav(4410, { rate: 48000 }) },
      { path: "ignite.wav", size: 10, wav: wav(22050) },
      { path: "extra.wav", size: 5, wav: wav(10) },
    ];
    const r = fontReport(files, compileLayout(DEFAULT_LAYOUT));
    expect(r.present).toEqual(["hum", "swing", "ignite"]);
    expect(r.missing).toContain("clash");
    expect(r.cues.swing.variants).toBe(2);
    expect(r.totalBytes).toBe(135);
    expect(r.igniteMs).toBe(500);
    expect(r.status).toBe("received");
    const codes = r.findings.map((f) => f.code);
    expect(codes).toEqual(expect.arrayContaining(["unusual-sample-rate", "mixed-formats", "unmatched-file", "missing-cue"]));
    expect(r.findings.find((f) => f.code === "unusual-sample-rate")?.message).toContain("common practice");
  });
  it("a font without a hum is invalid", () => {
    const r = fontReport([{ path: "clash.wav", size: 1, wav: wav(10) }], compileLayout(DEFAULT_LAYOUT));
    expect(r.status).toBe("invalid");
    expect(r.findings[0]).toMatchObject({ code: "no-hum", severity: "error" });
  });
});
