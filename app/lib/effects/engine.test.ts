import { describe, expect, it } from "vitest";
import { newLayer } from "~/lib/config/layers";
import type { Channel, Layer, Look } from "~/lib/config/schema";
import { DECODE_BYTE, encodeToByteFloat, srgbEncode } from "./color";
import { createRenderer, renderFrame, type RenderContext } from "./engine";
import type { Timeline } from "./timeline";

function channel(id: string, pixels: number, role: Channel["role"] = "custom"): Channel {
  return { id, name: id, role, pixels, parallelStrips: 1, pin: 2, colorOrder: "RGB" };
}
const look = (...layers: Layer[]): Look => ({ layers });
const LIT: Timeline = [{ event: "ignition", atMs: 0 }];
const px = (f: Uint8ClampedArray, i: number) => [f[i * 3], f[i * 3 + 1], f[i * 3 + 2]];
const enc = (l: number) => Math.round(srgbEncode(l) * 255);

describe("layers and blending", () => {
  it("a fill renders its colour exactly", () => {
    const f = renderFrame(look(newLayer("fill", { color: "#ff4a1c" })), channel("a", 5), 0, [], 1);
    expect(f.length).toBe(15);
    for (let i = 0; i < 5; i++) expect(px(f, i)).toEqual([0xff, 0x4a, 0x1c]);
  });

  it("blends in linear light: red under blue at opacity 0.5 gives half the light of each", () => {
    const f = renderFrame(look(newLayer("fill", { color: "#ff0000" }), newLayer("fill", { color: "#0000ff", opacity: 0.5 })), channel("a", 1), 0, [], 1);
    expect(px(f, 0)).toEqual([enc(0.5), 0, enc(0.5)]); // 188, not the 128 an sRGB-value blend gives
  });

  it("add, multiply and screen follow their formulas on linear light", () => {
    const g = DECODE_BYTE[0x80];
    const base = newLayer("fill", { color: "#808080" });
    const run = (top: Layer) => renderFrame(look(base, top), channel("a", 1), 0, [], 1)[0];
    expect(run(newLayer("fill", { color: "#808080", blend: "add" }))).toBe(enc(2 * g));
    expect(run(newLayer("fill", { color: "#808080", blend: "multiply" }))).toBe(enc(g * g));
    expect(run(newLayer("fill", { color: "#808080", blend: "screen" }))).toBe(enc(g + g - g * g));
    expect(run(newLayer("fill", { color: "#ffffff", blend: "add" }))).toBe(255);
  });

  it("respects range (clipped), enabled and opacity 0", () => {
    const f = renderFrame(
      look(
        newLayer("fill", { color: "#ffffff", range: { start: 3, end: 99 } }),
        newLayer("fill", { color: "#ff0000", enabled: false }),
        newLayer("fill", { color: "#00ff00", opacity: 0 }),
      ),
      channel("a", 6),
      0,
      [],
      1,
    );
    expect([0, 1, 2].map((i) => px(f, i))).toEqual([[0, 0, 0], [0, 0, 0], [0, 0, 0]]);
    expect([3, 4, 5].map((i) => px(f, i))).toEqual([[255, 255, 255], [255, 255, 255], [255, 255, 255]]);
  });

  it("a gradient with three unsorted stops passes through each stop", () => {
    const g = newLayer("gradient", {
      stops: [
        { at: 1, color: "#0000ff" },
        { at: 0, color: "#ff0000" },
        { at: 0.5, color: "#00ff00" },
      ],
    });
    const f = renderFrame(look(g), channel("a", 5), 0, [], 1); // pixel centres at 0.1, 0.3, 0.5, 0.7, 0.9
    expect(px(f, 2)).toEqual([0, 255, 0]);
    expect(px(f, 0)).toEqual([enc(0.8), enc(0.2), 0]);
    expect(px(f, 4)).toEqual([0, enc(0.2), enc(0.8)]);
  });

  it("the brightness cap scales encoded values last", () => {
    const ctx: RenderContext = { channels: [], looks: {}, brightnessCap: 0.6 };
    const f = renderFrame(look(newLayer("fill", { color: "#ffffff" })), channel("a", 1), 0, [], 1, ctx);
    expect(px(f, 0)).toEqual([153, 153, 153]);
  });

  it("a drift moves its pattern by speed × time, in either direction", () => {
    const d = newLayer("drift", { colors: ["#ff0000", "#0000ff", "#00ff00"], bandPixels: 4, speedPixelsPerSecond: 60, direction: "to-tip" });
    const r = createRenderer({ channels: [channel("a", 40)], looks: { a: look(d) } });
    const first = Array.from(r.render("a", 0, [], 1));
    const later = r.render("a", 5000 / 60, [], 1); // five pixels on
    for (let i = 0; i < 30; i++) expect(px(later, i + 5)).toEqual(first.slice(i * 3, i * 3 + 3));
    const back = createRenderer({ channels: [channel("a", 40)], looks: { a: look({ ...d, direction: "to-base" }) } });
    const b0 = Array.from(back.render("a", 0, [], 1));
    const b1 = back.render("a", 5000 / 60, [], 1);
    for (let i = 5; i < 35; i++) expect(px(b1, i - 5)).toEqual(b0.slice(i * 3, i * 3 + 3));
  });

  it("a breathe with period P repeats every P and moves within it", () => {
    const b = newLayer("breathe", { color: "#3a7bff", periodMs: 1300, floor: 0.1, ceiling: 0.9 });
    const r = createRenderer({ channels: [channel("a", 3)], looks: { a: look(b) } });
    for (const t of [0, 217, 650, 1111]) {
      const a = Array.from(r.render("a", t, [], 1));
      expect(Array.from(r.render("a", t + 1300, [], 1))).toEqual(a);
      expect(Array.from(r.render("a", t + 5 * 1300, [], 1))).toEqual(a);
    }
    expect(r.render("a", 0, [], 1)[2]).toBe(Math.round(encodeToByteFloat(0.1 * DECODE_BYTE[0xff])));
    expect(r.render("a", 650, [], 1)[2]).toBe(Math.round(encodeToByteFloat(0.9 * DECODE_BYTE[0xff])));
  });

  it("the renderer returns the same array for a channel on every call", () => {
    const r = createRenderer({ channels: [channel("a", 3)], looks: { a: look(newLayer("fill")) } });
    expect(r.render("a", 0, [], 1)).toBe(r.render("a", 10, [], 1));
  });
});

describe("events", () => {
  const blade = channel("blade", 100, "main-blade");

  it("a linear wipe of duration D lights pixel k of N at time D·k/N", () => {
    const D = 1000;
    const r = createRenderer({ channels: [blade], looks: { blade: look(newLayer("fill", { color: "#ffffff" }), newLayer("wipe", { durationMs: D, easing: "linear" })) } });
    for (const k of [0, 1, 17, 50, 99]) {
      expect(r.render("blade", (D * k) / 100, LIT, 1)[k * 3]).toBe(0);
      expect(r.render("blade", (D * (k + 0.5)) / 100, LIT, 1)[k * 3]).toBe(enc(0.5));
      const f = r.render("blade", (D * (k + 1)) / 100, LIT, 1);
      expect(f[k * 3]).toBe(255);
      if (k < 99) expect(f[(k + 1) * 3]).toBe(0);
    }
  });

  it("a retraction wipe withdraws tip → base, then the main blade stays dark", () => {
    const r = createRenderer({
      channels: [blade],
      looks: { blade: look(newLayer("fill", { color: "#ffffff" }), newLayer("wipe", { event: "retraction", durationMs: 400, easing: "linear" })) },
    });
    const tl: Timeline = [{ event: "ignition", atMs: 0 }, { event: "retraction", atMs: 1000 }];
    expect(r.render("blade", 999, tl, 1).every((v) => v === 255)).toBe(true);
    const half = r.render("blade", 1200, tl, 1);
    expect(half[49 * 3]).toBe(255);
    expect(half[50 * 3]).toBe(0);
    expect(r.render("blade", 1400, tl, 1).every((v) => v === 0)).toBe(true);
  });

  it("a main blade without wipes is dark before ignition, full at ignition, dark at retraction", () => {
    const r = createRenderer({ channels: [blade], looks: { blade: look(newLayer("fill", { color: "#ffffff" })) } });
    const tl: Timeline = [{ event: "ignition", atMs: 100 }, { event: "retraction", atMs: 500 }];
    expect(r.render("blade", 99, tl, 1).every((v) => v === 0)).toBe(true);
    expect(r.render("blade", 100, tl, 1).every((v) => v === 255)).toBe(true);
    expect(r.render("blade", 500, tl, 1).every((v) => v === 0)).toBe(true);
  });

  it("`when` switches layers with the blade state on other channels", () => {
    const chamber = channel("chamber", 2, "chamber-strip");
    const r = createRenderer({
      channels: [chamber],
      looks: { chamber: look(newLayer("fill", { color: "#ff0000", when: "unlit" }), newLayer("fill", { color: "#00ff00", when: "lit" })) },
    });
    expect(px(r.render("chamber", 0, [], 1), 0)).toEqual([255, 0, 0]);
    expect(px(r.render("chamber", 0, LIT, 1), 0)).toEqual([0, 255, 0]);
  });

  it("a spark flashes over its width at its event and fades over decayMs", () => {
    const s = newLayer("spark", { event: "clash", color: "#ffffff", position: 0.5, widthPixels: 10, decayMs: 200 });
    const r = createRenderer({ channels: [blade], looks: { blade: look(s) } });
    const tl: Timeline = [...LIT, { event: "clash", atMs: 1000 }];
    expect(r.render("blade", 999, tl, 1).every((v) => v === 0)).toBe(true);
    const at = r.render("blade", 1000, tl, 1);
    expect(at[45 * 3]).toBe(255);
    expect(at[54 * 3]).toBe(255);
    expect(at[44 * 3]).toBe(0);
    expect(at[55 * 3]).toBe(0);
    expect(r.render("blade", 1100, tl, 1)[50 * 3]).toBe(enc(0.25));
    expect(r.render("blade", 1200, tl, 1).every((v) => v === 0)).toBe(true);
  });

  it("a hold shows only while its event is held, brightest at its position", () => {
    const h = newLayer("hold", { event: "lockup", color: "#ffffff", position: 0.5, widthPixels: 20, flicker: 0 });
    const r = createRenderer({ channels: [blade], looks: { blade: look(h) } });
    const tl: Timeline = [...LIT, { event: "lockup", atMs: 100, untilMs: 300 }];
    expect(r.render("blade", 99, tl, 1).every((v) => v === 0)).toBe(true);
    const f = Array.from(r.render("blade", 200, tl, 1));
    expect(f[49 * 3]).toBe(f[50 * 3]);
    expect(f[50 * 3]).toBeGreaterThan(f[55 * 3]);
    expect(f[55 * 3]).toBeGreaterThan(f[59 * 3]);
    expect(f[70 * 3]).toBe(0);
    expect(r.render("blade", 300, tl, 1).every((v) => v === 0)).toBe(true);
    // No untilMs: still held (a button being pressed in the live preview).
    expect(r.render("blade", 9000, [...LIT, { event: "lockup", atMs: 100 }], 1)[50 * 3]).toBe(255);
  });
});

describe("mirror", () => {
  const src = channel("src", 7);
  const one = channel("one", 1);
  const grad = look(newLayer("gradient", { stops: [{ at: 0, color: "#000000" }, { at: 1, color: "#ffffff" }] }));

  it("stretching 7 pixels onto 1 gives the mean light of the 7; crop gives the base pixel", () => {
    const ctx: RenderContext = { channels: [src, one], looks: { src: grad } };
    const seven = renderFrame(grad, src, 0, [], 1, ctx);
    let mean = 0;
    for (let i = 0; i < 7; i++) mean += DECODE_BYTE[seven[i * 3]] / 7;
    const stretched = renderFrame(look(newLayer("mirror", { channelId: "src", fit: "stretch" })), one, 0, [], 1, ctx);
    expect(Math.abs(stretched[0] - encodeToByteFloat(mean))).toBeLessThanOrEqual(1);
    expect(stretched[0]).toBe(Math.round(encodeToByteFloat((0.5 / 7 + 1.5 / 7 + 2.5 / 7 + 3.5 / 7 + 4.5 / 7 + 5.5 / 7 + 6.5 / 7) / 7)));
    const cropped = renderFrame(look(newLayer("mirror", { channelId: "src", fit: "crop" })), one, 0, [], 1, ctx);
    expect(cropped[0]).toBe(seven[0]);
  });

  it("stretching 1 pixel onto 7 repeats it; crop leaves pixels past the source untouched", () => {
    const ctx: RenderContext = { channels: [one, src], looks: { one: look(newLayer("fill", { color: "#ff8000" })) } };
    const s = renderFrame(look(newLayer("mirror", { channelId: "one", fit: "stretch" })), src, 0, [], 1, ctx);
    for (let i = 0; i < 7; i++) expect(px(s, i)).toEqual([255, 128, 0]);
    const c = renderFrame(look(newLayer("fill", { color: "#0000ff" }), newLayer("mirror", { channelId: "one", fit: "crop" })), src, 0, [], 1, ctx);
    expect(px(c, 0)).toEqual([255, 128, 0]);
    expect(px(c, 6)).toEqual([0, 0, 255]);
  });

  it("a mirror cycle or an unknown channel contributes black, without recursing", () => {
    const a = channel("a", 3), b = channel("b", 3);
    const ctx: RenderContext = {
      channels: [a, b],
      looks: {
        a: look(newLayer("fill", { color: "#ffffff" }), newLayer("mirror", { channelId: "b", fit: "stretch", opacity: 0.5 })),
        b: look(newLayer("mirror", { channelId: "a", fit: "stretch" })),
      },
    };
    const r = createRenderer(ctx);
    // Rendering b: b → a → b is the cycle, so a's mirror is black at half opacity over white.
    expect(r.render("b", 0, [], 1)[0]).toBe(enc(0.5));
    // Rendering a: a → b → a is the cycle, so b is black, and a again shows half its white.
    expect(r.render("a", 0, [], 1)[0]).toBe(enc(0.5));
    const self = renderFrame(look(newLayer("fill", { color: "#ffffff" }), newLayer("mirror", { channelId: "a", fit: "crop" })), a, 0, [], 1);
    expect(px(self, 0)).toEqual([0, 0, 0]);
    const unknown = renderFrame(look(newLayer("fill", { color: "#ffffff" }), newLayer("mirror", { channelId: "nope", fit: "crop" })), a, 0, [], 1);
    expect(px(unknown, 0)).toEqual([0, 0, 0]);
  });
});

describe("robustness", () => {
  const ch = channel("a", 12);
  const shimmerLook = look(newLayer("fill", { color: "#ffffff" }), newLayer("shimmer", { amount: 0.8, rateHz: 20, color: "#000000" }));

  it("is deterministic for a seed and varies with it", () => {
    const frames = (seed: number) => [0, 33, 517].map((t) => Array.from(renderFrame(shimmerLook, ch, t, [], seed)));
    expect(frames(42)).toEqual(frames(42));
    expect(frames(42)).not.toEqual(frames(43));
    const f = frames(42)[1];
    expect(new Set(f).size).toBeGreaterThan(3); // it does flicker, pixel by pixel
  });

  it("renders a 200-layer look", () => {
    const layers: Layer[] = [];
    const kinds = ["fill", "gradient", "drift", "breathe", "shimmer", "spark", "hold", "wipe", "mirror"] as const;
    for (let i = 0; i < 200; i++) layers.push(newLayer(kinds[i % kinds.length], { opacity: 0.3, channelId: "b" } as never));
    const ctx: RenderContext = { channels: [channel("blade", 132, "main-blade"), channel("b", 7)], looks: { b: look(newLayer("fill")) } };
    const r = createRenderer({ ...ctx, looks: { ...ctx.looks, blade: look(...layers) } });
    const tl: Timeline = [...LIT, { event: "clash", atMs: 100 }, { event: "lockup", atMs: 50 }];
    const f = r.render("blade", 120, tl, 7);
    expect(f.length).toBe(396);
    expect(f.some((v) => v > 0)).toBe(true);
  });

  it("survives NaN, zero and infinite numbers with meaningful output", () => {
    const bad = look(
      newLayer("fill", { color: "#ffffff" }),
      newLayer("breathe", { color: "#ff0000", periodMs: 0, floor: 0.2, ceiling: 1 }),
      newLayer("breathe", { color: "#00ff00", periodMs: NaN, floor: NaN, ceiling: 1, blend: "add" }),
      newLayer("shimmer", { rateHz: NaN, amount: NaN }),
      newLayer("drift", { speedPixelsPerSecond: NaN, opacity: NaN }),
      newLayer("spark", { event: "clash", decayMs: 0 }),
      newLayer("wipe", { durationMs: NaN }),
      newLayer("wipe", { event: "retraction", durationMs: Infinity }),
    );
    const tl: Timeline = [...LIT, { event: "clash", atMs: -100 }];
    for (const t of [NaN, 0, 1e12, Infinity]) {
      for (const seed of [NaN, 0, -1.5, 1e300]) {
        let f!: Uint8ClampedArray;
        expect(() => (f = renderFrame(bad, ch, t, tl, seed))).not.toThrow();
        // periodMs 0 holds the ceiling (red), NaN period adds green at its ceiling, the spark's
        // 0 ms decay counts as 1 ms and is over, the ignition wipe completes at once.
        expect(px(f, 5)).toEqual([255, 255, 0]);
      }
    }
    // Before the ignition the retraction wipe has nothing lit to show.
    expect(px(renderFrame(bad, ch, -5, tl, 1), 5)).toEqual([0, 0, 0]);
    expect(() => renderFrame(look(newLayer("fill")), channel("z", NaN), 0, [], 1)).not.toThrow();
  });
});
