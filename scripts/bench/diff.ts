// Diffs, as ratios against references measured in the same run:
// - the text diff of two 2,000-line rendered outputs (about 5 % of lines changed) against
//   `git diff --no-index` on the same two files, git's process start included (ours runs in
//   the server's process, which is where it runs for the compare page and the API). Target ≤ 2×.
// - the model diff of two 100-preset configs against the validator on the same config.
//   Target: under 20 ms.
import { spawnSync } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { validateConfig } from "../../app/lib/checks/validate";
import { diffModels } from "../../app/lib/model-diff";
import { diffTexts } from "../../app/lib/text-diff/text-diff";
import { stressConfig } from "./config";
import { collect } from "./gc";

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

/** A header-like output: defines, comments and tables; every 20th line changed on the b side. */
function outputs(lines = 2000) {
  const a: string[] = [];
  const b: string[] = [];
  for (let i = 0; i < lines; i++) {
    const line = i % 7 === 0 ? ` * preset ${i >> 3}: layer ${i % 13} drift speed ${i % 50} px/s` : `#define HB_PRESET_${i >> 4}_LAYER_${i % 16}_VALUE ${(i * 7919) % 65536}`;
    a.push(line);
    b.push(i % 20 === 7 ? line.replace(/\d+$/, (d) => String(Number(d) + 1)) : line);
  }
  return { a: a.join("\n") + "\n", b: b.join("\n") + "\n" };
}

export async function run(): Promise<void> {
  const { a, b } = outputs();
  const dir = mkdtempSync(path.join(tmpdir(), "hb-bench-diff-"));
  const fa = path.join(dir, "a.h");
  const fb = path.join(dir, "b.h");
  writeFileSync(fa, a);
  writeFileSync(fb, b);
  try {
    const check = diffTexts("a.h", "b.h", a, b);
    if (check.kind !== "changed") throw new Error("the bench outputs should differ");
    for (let i = 0; i < 5; i++) {
      diffTexts("a.h", "b.h", a, b);
      spawnSync("git", ["diff", "--no-index", "--no-color", fa, fb]);
    }
    const ours: number[] = [];
    const git: number[] = [];
    const ratios: number[] = [];
    for (let r = 0; r < 15; r++) {
      collect();
      let t = performance.now();
      diffTexts("a.h", "b.h", a, b);
      const o = performance.now() - t;
      t = performance.now();
      const g = spawnSync("git", ["diff", "--no-index", "--no-color", fa, fb]);
      const gm = performance.now() - t;
      if (g.status !== 1) throw new Error(`git diff --no-index answered ${g.status}: ${g.stderr}`);
      ours.push(o);
      git.push(gm);
      ratios.push(o / gm);
    }
    console.log(
      `text diff, 2,000 lines, ${check.added} of them changed: ${median(ours).toFixed(2)} ms (with words and side-by-side rows); git diff --no-index (process included) ${median(git).toFixed(2)} ms; ratio ${median(ratios).toFixed(2)}× (target ≤ 2×)`,
    );
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }

  const c1 = stressConfig(100);
  const c2 = structuredClone(c1);
  // Edits of the usual kind: a few fields, a moved preset, a removed and an added layer.
  c2.rig.channels[0].pixels = 128;
  for (let i = 0; i < 100; i += 10) c2.presets[i].name += " (revised)";
  c2.presets.splice(3, 0, c2.presets.splice(40, 1)[0]);
  c2.presets[7].looks.blade.layers.pop();
  c2.presets[9].looks.chamber.layers.push({ ...structuredClone(c2.presets[9].looks.chamber.layers[0]), id: "l-bench1" }); // a copy, with its own id as the editor gives it
  for (let i = 0; i < 5; i++) {
    diffModels(c1, c2);
    validateConfig(c2);
  }
  const md: number[] = [];
  const vd: number[] = [];
  for (let r = 0; r < 15; r++) {
    collect();
    let t = performance.now();
    const d = diffModels(c1, c2);
    md.push(performance.now() - t);
    if (d.changes.length === 0) throw new Error("no changes found");
    t = performance.now();
    validateConfig(c2);
    vd.push(performance.now() - t);
  }
  console.log(
    `model diff, two 100-preset configs (${diffModels(c1, c2).changes.length} changes): ${median(md).toFixed(2)} ms (target < 20 ms); validator on the same config ${median(vd).toFixed(2)} ms; ratio ${(median(md) / median(vd)).toFixed(2)}×`,
  );
}
