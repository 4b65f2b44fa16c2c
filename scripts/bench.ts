// `npm run bench`: every figure is printed as a ratio against a reference measured in the same
// run. Each area keeps its own bench module in scripts/bench/; this file only runs them in turn.
import { existsSync } from "node:fs";
import { fileURLToPath } from "node:url";

const areas = ["config", "power", "template", "effects", "preview"];

for (const area of areas) {
  const file = fileURLToPath(new URL(`./bench/${area}.ts`, import.meta.url));
  if (!existsSync(file)) continue;
  console.log(`\n== ${area} ==`);
  const mod = (await import(file)) as { run: () => Promise<void> };
  await mod.run();
}
