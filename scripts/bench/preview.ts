// The live preview's frame rate in a real browser, as a ratio against the 60 fps display rate.
// The figure is measured by the Playwright test "the preview keeps drawing at display rate"
// (tests/e2e/looks.spec.ts), which writes it to PREVIEW_FPS_FILE or .data/preview-fps.json;
// this prints the latest one. A browser is needed to measure it, so the bench does not run one.
import { existsSync, readFileSync, statSync } from "node:fs";
import path from "node:path";

const DISPLAY_FPS = 60;

type Measured = { fps: number; frames: number; seconds: number; layersOnBlade: number };

export async function run(): Promise<void> {
  const file = process.env.PREVIEW_FPS_FILE ?? path.join(".data", "preview-fps.json");
  if (!existsSync(file)) {
    console.log(`no preview measurement at ${file}. Produce one with:`);
    console.log("  HB_BUILD_DIR=build-looks node scripts/test.mjs e2e tests/e2e/looks.spec.ts -g \"display rate\"");
    console.log("(npm test writes it; PREVIEW_FPS_FILE points elsewhere)");
    return;
  }
  const data = JSON.parse(readFileSync(file, "utf8")) as { measuredAt: string; displayFps?: number; referenceFps?: number; demo: Measured; heavy: Measured };
  const display = data.displayFps ?? DISPLAY_FPS;
  const ageMin = (Date.now() - statSync(file).mtimeMs) / 60000;
  console.log(`measured ${data.measuredAt} (${ageMin.toFixed(0)} min ago) in headless Chromium, ${file}`);
  const ref = data.referenceFps;
  if (ref) console.log(`an empty page in the same browser: ${ref.toFixed(1)} fps = ${(ref / display).toFixed(2)}× the display rate (the ceiling here)`);
  for (const [name, m] of [
    ["demo looks", data.demo],
    ["200-layer blade look", data.heavy],
  ] as const) {
    console.log(
      `preview, ${`${name} (${m.layersOnBlade} layers on the blade)`.padEnd(42)} ${m.fps.toFixed(1)} fps over ${m.seconds.toFixed(1)} s = ${(m.fps / display).toFixed(2)}× the ${display} fps display rate${ref ? `, ${(m.fps / ref).toFixed(2)}× the empty page` : ""}`,
    );
  }
}
