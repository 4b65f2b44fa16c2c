// One card zip written to a file, in a process of its own so its peak resident memory is the
// bundle's alone (plus Node's own). Run by scripts/bench/bundle.ts; prints one JSON line.
import { createWriteStream, readFileSync } from "node:fs";
import { pipeline } from "node:stream/promises";
import { planBundle, type BundleInput } from "../../app/lib/bundle/plan";
import { zipBundle } from "../../app/lib/bundle/zip.server";
import { DiskStorage } from "../../app/lib/storage/disk.server";

const [inputFile, storeDir, outFile] = process.argv.slice(2);
const input = JSON.parse(readFileSync(inputFile, "utf8")) as BundleInput;
const started = performance.now();
const plan = planBundle(input);
await pipeline(zipBundle(plan, new DiskStorage(storeDir)), createWriteStream(outFile));
const ms = performance.now() - started;
console.log(JSON.stringify({ ms, maxRssMB: process.resourceUsage().maxRSS / 1024, entries: plan.entries.length }));
