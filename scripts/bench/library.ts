// The preset library, as ratios against references measured in the same run:
// - the three-way merge of a 20-layer look with changes on both sides, against the validator on
//   the same preset (on its stand-in rig). Target: the merge under 1 ms.
// - the dry run of an update across 200 builds through the database (read, merge each, report),
//   against reading the same 200 builds' configs alone. Target: under 2 s, shown per build.
import { chmodSync, mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { sql } from "kysely";
import { validateConfig } from "../../app/lib/checks/validate";
import { demoConfig } from "../../app/lib/config/demo";
import { newLayer } from "../../app/lib/config/layers";
import type { Layer, Preset } from "../../app/lib/config/schema";
import { connect } from "../../app/lib/db/connect";
import { addToConfig } from "../../app/lib/library/adapt";
import type { PresetBody } from "../../app/lib/library/format";
import { rollOut } from "../../app/lib/library/service.server";
import { standInConfig } from "../../app/lib/library/standin";
import { merge3 } from "../../app/lib/model-diff/merge";
import { freePort, removeDir, runTsx, startCluster } from "../lib/services.mjs";
import { collect } from "./gc";

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
};

function twentyLayers(): Layer[] {
  const kinds = ["fill", "gradient", "drift", "breathe", "shimmer", "spark", "hold", "wipe"] as const;
  return Array.from({ length: 20 }, (_, i) => newLayer(kinds[i % kinds.length], { id: `l-b${String(i).padStart(5, "0")}`, opacity: 0.5 + (i % 5) / 10 }));
}

function mergeBench() {
  const base: Preset = { id: "ember", name: "Ember", fontId: "ashfall", looks: { blade: { layers: twentyLayers() } } };
  const mine = structuredClone(base);
  const theirs = structuredClone(base);
  // Both sides change things: fields on different layers, one insert each side, a removal, a move.
  mine.looks.blade.layers[2].opacity = 0.3;
  mine.looks.blade.layers[5].enabled = false;
  mine.looks.blade.layers.splice(8, 0, newLayer("fill", { id: "l-mine01", color: "#ff0000" }));
  theirs.looks.blade.layers[11].opacity = 0.2;
  theirs.looks.blade.layers[14].blend = "screen";
  theirs.looks.blade.layers.splice(17, 1);
  theirs.looks.blade.layers.push(theirs.looks.blade.layers.shift()!);
  const once = merge3(base, mine, theirs);
  if (once.conflicts.length !== 0 || once.merged.looks.blade.layers.length !== 20) throw new Error("the bench merge should be clean with 20 layers");
  const body: PresetBody = { name: "Ember", tags: [], notes: "", looks: { "main-blade": { pixels: 132, layers: once.merged.looks.blade.layers } } };
  const cfg = standInConfig(body);
  for (let i = 0; i < 200; i++) {
    merge3(base, mine, theirs);
    validateConfig(cfg);
  }
  const m: number[] = [];
  const v: number[] = [];
  for (let r = 0; r < 15; r++) {
    collect();
    let t = performance.now();
    for (let i = 0; i < 100; i++) merge3(base, mine, theirs);
    m.push((performance.now() - t) / 100);
    t = performance.now();
    for (let i = 0; i < 100; i++) validateConfig(cfg);
    v.push((performance.now() - t) / 100);
  }
  const mm = median(m);
  const vm = median(v);
  console.log(`three-way merge, 20-layer look, changes on both sides: ${(mm * 1000).toFixed(0)} µs; validator on the same preset ${(vm * 1000).toFixed(0)} µs; ratio ${(mm / vm).toFixed(2)}× (target: merge < 1 ms)`);
}

async function dryRunBench() {
  const work = mkdtempSync(path.join(tmpdir(), "hiltbench-bench-lib-"));
  chmodSync(work, 0o755);
  const cluster = startCluster(path.join(work, "pg"), await freePort());
  const url = `${cluster.baseUrl}/hb_bench_library`;
  try {
    runTsx("db/setup.ts", ["--seed"], { DATABASE_URL: url });
    const db = connect(url, 4);
    try {
      const ws = (await db.selectFrom("workshops").select("id").where("slug", "=", "ember-anvil").executeTakeFirstOrThrow()).id;
      const lib = (await db.selectFrom("library_presets").select("id").where("name", "=", "Ashfall embers").executeTakeFirstOrThrow()).id;
      const v1 = (await db.selectFrom("library_versions").select("body").where("preset_id", "=", lib).where("version", "=", 1).executeTakeFirstOrThrow()).body as PresetBody;
      const added = addToConfig(demoConfig(), v1, { fontId: "ashfall", name: "Bench embers" });
      // 200 builds using v1; every tenth has a local edit that collides with v2, every twentieth is released.
      for (let i = 0; i < 200; i++) {
        const c = structuredClone(added.config);
        if (i % 10 === 3) (c.presets.at(-1)!.looks.blade.layers.find((l) => l.kind === "spark" && l.event === "clash") as { decayMs: number }).decayMs = 90;
        const json = JSON.stringify(c);
        const b = await sql<{ id: string }>`INSERT INTO builds (workshop_id, name, status, config) VALUES (${ws}, ${`Bench ${i}`}, ${i % 20 === 7 ? "released" : "configuring"}, ${json}::jsonb) RETURNING id`.execute(db);
        await sql`INSERT INTO build_preset_origins (build_id, preset_id, workshop_id, library_preset_id, library_version) VALUES (${b.rows[0].id}, ${added.presetId}, ${ws}, ${lib}, 1)`.execute(db);
      }
      const a = { workshopId: ws, userId: null };
      await rollOut(db, a, lib, false);
      const runs: number[] = [];
      const reads: number[] = [];
      let rows = 0;
      let clean = 0;
      for (let r = 0; r < 5; r++) {
        collect();
        let t = performance.now();
        const out = await rollOut(db, a, lib, false);
        runs.push(performance.now() - t);
        const report = out.body as { rows: { outcome: string }[] };
        rows = report.rows.length;
        clean = report.rows.filter((x) => x.outcome === "clean").length;
        t = performance.now();
        await sql`SELECT b.config FROM build_preset_origins o JOIN builds b ON b.id = o.build_id WHERE o.library_preset_id = ${lib}`.execute(db);
        reads.push(performance.now() - t);
      }
      const d = median(runs);
      const rd = median(reads);
      console.log(
        `dry run of an update across ${rows} builds (${clean} clean): ${d.toFixed(0)} ms end to end, ${(d / rows).toFixed(2)} ms per build; reading their configs alone ${rd.toFixed(0)} ms; ratio ${(d / rd).toFixed(1)}× (target: < 2 s)`,
      );
    } finally {
      await db.destroy();
    }
  } finally {
    cluster.stop();
    removeDir(work);
  }
}

export async function run(): Promise<void> {
  mergeBench();
  await dryRunBench();
}
