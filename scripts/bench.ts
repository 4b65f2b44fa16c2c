// `npm run bench`: every figure is printed as a ratio against a reference measured in the same
// run. Each area keeps its own bench module in scripts/bench/; this file runs each in a Node
// process of its own, so one area's garbage (Handlebars' code generation, the power engine's
// frames) does not slow the next area's timings, and with `gc` exposed so a bench can start each
// timing window from a collected heap. `npm run bench -- template` runs one area.
import { spawnSync } from "node:child_process";
import { existsSync } from "node:fs";
import { fileURLToPath } from "node:url";

const areas = ["config", "power", "template", "template-browser", "effects", "preview", "load", "diff", "audio", "bundle", "library"];
const fileOf = (area: string) => fileURLToPath(new URL(`./bench/${area}.ts`, import.meta.url));
const only = process.argv[2];

if (process.env.HB_BENCH_CHILD === "1" && only) {
  const mod = (await import(fileOf(only))) as { run: () => Promise<void> };
  await mod.run();
} else {
  let failed = 0;
  for (const area of only ? [only] : areas) {
    if (!existsSync(fileOf(area))) {
      if (only) throw new Error(`no bench area '${area}' (areas: ${areas.join(", ")})`);
      continue;
    }
    console.log(`\n== ${area} ==`);
    const r = spawnSync(process.execPath, [...process.execArgv, "--expose-gc", fileURLToPath(import.meta.url), area], {
      stdio: "inherit",
      env: { ...process.env, HB_BENCH_CHILD: "1" },
    });
    if (r.status !== 0) {
      failed++;
      console.log(`(the ${area} bench stopped with exit code ${r.status})`);
    }
  }
  if (failed) process.exitCode = 1;
}
