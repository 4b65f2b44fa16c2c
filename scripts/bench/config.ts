// Validator speed, as a ratio against the bare schema parse measured in the same run (the
// validator's floor: it always parses once). Targets: ≤ 3× the parse; the demo under 2 ms.
import { demoConfig } from "../../app/lib/config/demo";
import { configSchema, type Config } from "../../app/lib/config/schema";
import { validateConfig } from "../../app/lib/checks/validate";

/** The demo's five presets repeated to 100, each with its own id and name. */
export function stressConfig(presets = 100): Config {
  const c = demoConfig();
  const base = c.presets;
  c.presets = Array.from({ length: presets }, (_, i) => {
    const p = structuredClone(base[i % base.length]);
    return { ...p, id: `${p.id}-${i}`, name: `${p.name} ${i}` };
  });
  return c;
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

/**
 * Median milliseconds per call over `rounds` batches. The two run back to back in each round and
 * the ratio is the median of the per-round ratios, so a busy machine slows both sides alike.
 */
function measure(input: unknown, rounds: number, batch: number): { parseMs: number; validateMs: number; ratio: number } {
  const parse: number[] = [];
  const full: number[] = [];
  const ratios: number[] = [];
  for (let i = 0; i < batch * 10; i++) {
    configSchema.safeParse(input);
    validateConfig(input);
  }
  for (let r = 0; r < rounds; r++) {
    let t = performance.now();
    for (let i = 0; i < batch; i++) configSchema.safeParse(input);
    const p = (performance.now() - t) / batch;
    t = performance.now();
    for (let i = 0; i < batch; i++) validateConfig(input);
    const v = (performance.now() - t) / batch;
    parse.push(p);
    full.push(v);
    ratios.push(v / p);
  }
  return { parseMs: median(parse), validateMs: median(full), ratio: median(ratios) };
}

export async function run(): Promise<void> {
  const cases: [string, Config, number][] = [
    ["demo (5 presets)", demoConfig(), 20],
    ["stress (100 presets)", stressConfig(100), 2],
  ];
  for (const [name, config, batch] of cases) {
    const errors = validateConfig(config).diagnostics.filter((d) => d.severity === "error").length;
    const { parseMs, validateMs, ratio } = measure(config, 101, batch);
    console.log(
      `${name.padEnd(22)} validate ${validateMs.toFixed(3)} ms  safeParse ${parseMs.toFixed(3)} ms  ratio ${ratio.toFixed(2)}× (target ≤ 3×)  errors ${errors}`,
    );
  }
}
