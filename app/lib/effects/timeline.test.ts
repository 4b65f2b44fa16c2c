import { describe, expect, it } from "vitest";
import { bladeStateAt, DEMO_SEQUENCE, DEMO_SEQUENCE_FRAMES, DEMO_SEQUENCE_MS, heldSince, latestEventAt, type BladeState, type Timeline } from "./timeline";

const at = (tl: Timeline, t: number) => ({ ...bladeStateAt(tl, t, { lit: false, sinceMs: NaN } as BladeState) });

describe("blade state", () => {
  it("is unlit before the first ignition and lit until the retraction", () => {
    const tl: Timeline = [{ event: "retraction", atMs: 900 }, { event: "ignition", atMs: 100 }, { event: "clash", atMs: 300 }];
    expect(at(tl, 50)).toEqual({ lit: false, sinceMs: NaN });
    expect(at(tl, 100)).toEqual({ lit: true, sinceMs: 100 });
    expect(at(tl, 899)).toEqual({ lit: true, sinceMs: 100 });
    expect(at(tl, 900)).toEqual({ lit: false, sinceMs: 900 });
  });

  it("ignores a second ignition while lit and a retraction while unlit", () => {
    const tl: Timeline = [
      { event: "retraction", atMs: 0 },
      { event: "ignition", atMs: 100 },
      { event: "ignition", atMs: 200 },
      { event: "retraction", atMs: 300 },
      { event: "retraction", atMs: 400 },
      { event: "ignition", atMs: 500 },
    ];
    expect(at(tl, 10)).toEqual({ lit: false, sinceMs: NaN });
    expect(at(tl, 250)).toEqual({ lit: true, sinceMs: 100 });
    expect(at(tl, 450)).toEqual({ lit: false, sinceMs: 300 });
    expect(at(tl, 600)).toEqual({ lit: true, sinceMs: 500 });
  });

  it("takes an ignition and a retraction at the same instant in that order", () => {
    expect(at([{ event: "retraction", atMs: 5 }, { event: "ignition", atMs: 5 }], 5)).toEqual({ lit: false, sinceMs: 5 });
  });
});

describe("event lookups", () => {
  const tl: Timeline = [
    { event: "clash", atMs: 100 },
    { event: "clash", atMs: 50 },
    { event: "lockup", atMs: 200, untilMs: 400 },
    { event: "lockup", atMs: 600 },
  ];
  it("finds the latest moment at or before t", () => {
    expect(latestEventAt(tl, "clash", 49)).toBeNaN();
    expect(latestEventAt(tl, "clash", 75)).toBe(50);
    expect(latestEventAt(tl, "clash", 1000)).toBe(100);
  });
  it("finds a lasting event only while held; an open end is still held", () => {
    expect(heldSince(tl, "lockup", 199)).toBeNaN();
    expect(heldSince(tl, "lockup", 399)).toBe(200);
    expect(heldSince(tl, "lockup", 400)).toBeNaN();
    expect(heldSince(tl, "lockup", 1e9)).toBe(600);
  });
});

describe("demonstration sequence", () => {
  it("ignites at 0, clashes, blasts, locks up for two seconds, retracts before its end", () => {
    expect(DEMO_SEQUENCE.map((e) => e.event)).toEqual(["ignition", "clash", "blast", "lockup", "retraction"]);
    expect(DEMO_SEQUENCE[0].atMs).toBe(0);
    const lockup = DEMO_SEQUENCE.find((e) => e.event === "lockup")!;
    expect(lockup.untilMs! - lockup.atMs).toBe(2000);
    const retraction = DEMO_SEQUENCE.find((e) => e.event === "retraction")!;
    expect(retraction.atMs).toBeLessThan(DEMO_SEQUENCE_MS);
    expect(DEMO_SEQUENCE_FRAMES).toBe(450);
    expect(Object.isFrozen(DEMO_SEQUENCE)).toBe(true);
  });
});
