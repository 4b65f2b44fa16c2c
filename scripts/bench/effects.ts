// Effect engine throughput: frames per second of a six-layer look on the demo rig's three
// channels, as a multiple of the 60 fps display budget (target: at least 300× real time).
// The blade renders at 264 pixels — both parallel strips laid end to end — although the engine
// renders a channel's `pixels` once (parallel strips show the same data); the bench keeps the
// heavier figure so it is a bound on what the preview and the power sweep need.
import { newLayer } from "../../app/lib/config/layers";
import type { Channel, Look } from "../../app/lib/config/schema";
import { createRenderer } from "../../app/lib/effects/engine";
import { DEMO_SEQUENCE, DEMO_SEQUENCE_MS } from "../../app/lib/effects/timeline";

const DISPLAY_FPS = 60;
const TARGET_RATIO = 300;

function sixLayers(color: string): Look {
  return {
    layers: [
      newLayer("fill", { color }),
      newLayer("drift", { colors: [color, "#2a6cff", "#ffffff"], bandPixels: 16, speedPixelsPerSecond: 30, opacity: 0.5 }),
      newLayer("shimmer", { amount: 0.12, rateHz: 16 }),
      newLayer("spark", { event: "clash", color: "#ffffff", position: 0.5, widthPixels: 264, decayMs: 160 }),
      newLayer("hold", { event: "lockup", color: "#fff4b0", position: 0.55, widthPixels: 22, flicker: 0.7 }),
      newLayer("wipe", { event: "ignition", durationMs: 340, easing: "ease-out" }),
    ],
  };
}

const channels: Channel[] = [
  { id: "blade", name: "Blade", role: "main-blade", pixels: 264, parallelStrips: 1, pin: 2, colorOrder: "GRB" },
  { id: "chamber", name: "Chamber", role: "chamber-strip", pixels: 7, parallelStrips: 1, pin: 3, colorOrder: "GRB" },
  { id: "crystal", name: "Crystal", role: "accent-pixel", pixels: 1, parallelStrips: 1, pin: 4, colorOrder: "RGB" },
];

export async function run(): Promise<void> {
  const renderer = createRenderer({
    channels,
    looks: { blade: sixLayers("#7fd8ff"), chamber: sixLayers("#4fb0ff"), crystal: sixLayers("#bfeaff") },
    brightnessCap: 0.6,
  });
  let sink = 0;
  const frame = (i: number) => {
    // Walk the demonstration sequence so every layer takes its turn (clash, lockup, wipe).
    const t = ((i * 1000) / DISPLAY_FPS) % DEMO_SEQUENCE_MS;
    for (const c of channels) sink += renderer.render(c.id, t, DEMO_SEQUENCE, 1)[0];
  };
  for (let i = 0; i < 2000; i++) frame(i); // warm-up: let the JIT settle
  const frames = 20000;
  const start = process.hrtime.bigint();
  for (let i = 0; i < frames; i++) frame(i);
  const seconds = Number(process.hrtime.bigint() - start) / 1e9;
  const fps = frames / seconds;
  const ratio = fps / DISPLAY_FPS;
  console.log(`six-layer look, 264 + 7 + 1 pixels: ${Math.round(fps)} frames/s, ${((seconds / frames) * 1e6).toFixed(1)} µs/frame`);
  console.log(`  ${ratio.toFixed(0)}× the ${DISPLAY_FPS} fps display budget (target ≥ ${TARGET_RATIO}×): ${ratio >= TARGET_RATIO ? "ok" : "BELOW TARGET"}`);
  if (sink < 0) console.log(sink);
}
