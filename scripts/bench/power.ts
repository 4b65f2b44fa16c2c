// The validator's two power sources side by side, as ratios against the bare schema parse in the
// same run: the colour bound ("estimate", the default, held to the ≤ 3× target) and the engine's
// rendered frames ("engine", what the API and the look editor use), which costs far more.
import { demoConfig } from "../../app/lib/config/demo";
import { configSchema } from "../../app/lib/config/schema";
import { validateConfig } from "../../app/lib/checks/validate";

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

function perCall(f: () => void, rounds: number, batch: number): number {
  const ms: number[] = [];
  for (let r = 0; r < rounds; r++) {
    const t = performance.now();
    for (let i = 0; i < batch; i++) f();
    ms.push((performance.now() - t) / batch);
  }
  return median(ms);
}

export async function run(): Promise<void> {
  const config = demoConfig();
  for (let i = 0; i < 3; i++) validateConfig(config, { power: "engine" });
  for (let i = 0; i < 100; i++) validateConfig(config);
  const parse = perCall(() => configSchema.safeParse(config), 31, 20);
  const estimate = perCall(() => validateConfig(config), 31, 20);
  const engine = perCall(() => validateConfig(config, { power: "engine" }), 9, 1);
  const e = validateConfig(config).power!.overall;
  const g = validateConfig(config, { power: "engine" }).power!.overall;
  console.log(`demo, safeParse          ${parse.toFixed(3)} ms`);
  console.log(`demo, power "estimate"   ${estimate.toFixed(3)} ms  ${(estimate / parse).toFixed(2)}× the parse (target ≤ 3×, < 2 ms)  peak ${e.peakAmps.toFixed(2)} A, cap ${e.suggestedBrightnessCap}`);
  console.log(`demo, power "engine"     ${engine.toFixed(3)} ms  ${(engine / parse).toFixed(0)}× the parse (no target: every 60 fps frame rendered)  peak ${g.peakAmps.toFixed(2)} A, cap ${g.suggestedBrightnessCap}`);
}
