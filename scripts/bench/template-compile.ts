// What the template editor pays per keystroke: compiling generic-header after an edit (a source
// never seen before), with and without the caches, and the bytes allocated per compile (V8's
// sampling heap profiler, counting objects collected by both GCs). Timings are best of
// interleaved rounds; on a loaded machine trust the allocation figure more than the times.
import { readFileSync } from "node:fs";
import { Session } from "node:inspector/promises";
import { fileURLToPath } from "node:url";
import { compileTemplate } from "../../app/lib/template/compile";
import { parseTemplate } from "../../app/lib/template/cache";
import { collect } from "./gc";

export async function run(): Promise<void> {
  const source = readFileSync(fileURLToPath(new URL("../../templates/generic-header.hbt", import.meta.url)), "utf8");
  let k = 0;
  // The cached variant runs last: the drafts it keeps (256 parses, 128 compiles) make the heap
  // bigger and every later measurement slower, which is the point of `cache: false`.
  const fns: Record<string, () => void> = {
    "edited, cache: false (editor)": () => compileTemplate(`${source}@# ${k++} #@`, { cache: false }),
    "tokenize + whitespace + parse": () => parseTemplate(`${source}@# ${k++} #@`),
  };
  const time = (fn: () => void) => {
    collect();
    for (let w = performance.now(), i = 0; i < 30 || performance.now() - w < 100; i++) fn();
    const start = performance.now();
    let n = 0;
    while (performance.now() - start < 150) {
      fn();
      n++;
    }
    return ((performance.now() - start) / n) * 1000;
  };
  const best: Record<string, number> = {};
  for (let round = 0; round < 5; round++) for (const [name, fn] of Object.entries(fns)) best[name] = Math.min(best[name] ?? Infinity, time(fn));
  const cached = () => compileTemplate(`${source}@# ${k++} #@`);
  for (let round = 0; round < 5; round++) best["edited, caches filling up"] = Math.min(best["edited, caches filling up"] ?? Infinity, time(cached));
  const session = new Session();
  session.connect();
  await session.post("HeapProfiler.enable");
  await session.post("HeapProfiler.startSampling", { samplingInterval: 256, includeObjectsCollectedByMajorGC: true, includeObjectsCollectedByMinorGC: true } as never);
  const N = 300;
  for (let i = 0; i < N; i++) fns["edited, cache: false (editor)"]();
  const { profile } = (await session.post("HeapProfiler.stopSampling")) as { profile: { head: { selfSize: number; children: unknown[] } } };
  let bytes = 0;
  const walk = (node: { selfSize: number; children: unknown[] }) => {
    bytes += node.selfSize;
    for (const c of node.children) walk(c as typeof node);
  };
  walk(profile.head);
  session.disconnect();
  for (const [name, us] of Object.entries(best)) console.log(`compile generic-header ${name}: ${us.toFixed(0)} µs`);
  console.log(`allocated per compile: ~${Math.round(bytes / N / 1024)} KB (target: compile < 100 µs)`);
}

if (import.meta.url === `file://${process.argv[1]}`) await run();
