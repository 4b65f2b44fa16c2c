import { describe, expect, it } from "vitest";
import { advance, bladeLit, createLiveSession, fire, horizonMs, isHeld, loadDemoSequence, MAX_STEP_MS, press, release, seek } from "./live";
import { summarizeFrame } from "./summary";
import { DEMO_SEQUENCE, DEMO_SEQUENCE_MS } from "./timeline";

describe("live session", () => {
  it("records button presses at the running clock", () => {
    const s = createLiveSession();
    expect(bladeLit(s)).toBe(false);
    advance(s, 100);
    fire(s, "ignition");
    expect(bladeLit(s)).toBe(true);
    advance(s, 50);
    press(s, "lockup");
    press(s, "lockup"); // a second press while held is the same hold
    advance(s, 200);
    expect(isHeld(s, "lockup")).toBe(true);
    release(s, "lockup");
    expect(isHeld(s, "lockup")).toBe(false);
    expect(s.events).toEqual([
      { event: "ignition", atMs: 100, untilMs: undefined },
      { event: "lockup", atMs: 150, untilMs: 350 },
    ]);
  });

  it("pauses, caps long steps and seeks; scrubbing back replays what was recorded", () => {
    const s = createLiveSession([], false);
    advance(s, 100);
    expect(s.timeMs).toBe(0);
    s.playing = true;
    advance(s, 10_000);
    expect(s.timeMs).toBe(MAX_STEP_MS);
    fire(s, "ignition");
    seek(s, 100);
    expect(bladeLit(s)).toBe(false);
    seek(s, 300);
    expect(bladeLit(s)).toBe(true);
    seek(s, NaN);
    expect(s.timeMs).toBe(0);
  });

  it("drops what was recorded after now when recording over it", () => {
    const s = createLiveSession(DEMO_SEQUENCE);
    seek(s, 2000);
    fire(s, "blast");
    expect(s.events.map((e) => [e.event, e.atMs])).toEqual([["ignition", 0], ["clash", 1500], ["blast", 2000]]);
  });

  it("loads the demonstration sequence and spans at least its length", () => {
    const s = createLiveSession();
    seek(s, 900);
    loadDemoSequence(s);
    expect(s.timeMs).toBe(0);
    expect(s.events).toEqual(DEMO_SEQUENCE.map((e) => ({ ...e })));
    expect(s.events).not.toBe(DEMO_SEQUENCE);
    expect(horizonMs(s)).toBe(DEMO_SEQUENCE_MS);
    seek(s, 9100);
    expect(horizonMs(s)).toBe(9500);
  });
});

describe("summarizeFrame", () => {
  it("lists each pixel of a short channel", () => {
    expect(summarizeFrame(new Uint8ClampedArray([255, 128, 0, 0, 0, 0]))).toEqual({
      litPixels: 1,
      pixels: 2,
      samples: [{ label: "pixel 1", hex: "#ff8000" }, { label: "pixel 2", hex: "#000000" }],
    });
  });

  it("samples a long channel and averages its light", () => {
    const f = new Uint8ClampedArray(20 * 3);
    for (let i = 0; i < 10; i++) f.set([255, 255, 255], i * 3); // lower half white
    const s = summarizeFrame(f);
    expect(s.litPixels).toBe(10);
    // Half the light of white, encoded: sRGB encode(0.5) = 0.735357 (IEC 61966-2-1, references.md) → 188.
    expect(s.samples).toEqual([
      { label: "base", hex: "#ffffff" },
      { label: "middle", hex: "#000000" },
      { label: "tip", hex: "#000000" },
      { label: "mean", hex: "#bcbcbc" },
    ]);
  });
});
