// The render pool (decision 007) with a real worker: vitest runs TypeScript from app/, where no
// built worker exists, so the worker entry is bundled with esbuild into a temporary folder
// first (with the same `?raw` imports Vite inlines in the server build).
import { build } from "esbuild";
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { demoConfig } from "../config/demo";
import { BUILTIN_TEMPLATES } from "../template";
import { checkOn, PoolBusyError, poolSizeFrom, renderOn, TemplatePool } from "./pool.server";
import { checkTemplateSource } from "./check";
import { compileAndRender } from "./render";

const here = path.dirname(fileURLToPath(import.meta.url));
let dir = "";
let workerFile = "";
/** A stand-in worker that announces itself and then never answers: JavaScript that never checks a clock. */
let stuckFile = "";
/** A stand-in worker that never finishes loading. */
let neverReadyFile = "";
const pools: TemplatePool[] = [];
const pool = (o: Partial<ConstructorParameters<typeof TemplatePool>[0]> = {}) => {
  const p = new TemplatePool({ workerFile, size: 1, ...o });
  pools.push(p);
  return p;
};

beforeAll(async () => {
  dir = mkdtempSync(path.join(tmpdir(), "hiltbench-pool-"));
  workerFile = path.join(dir, "template-worker.mjs");
  await build({
    entryPoints: [path.join(here, "worker.server.ts")],
    outfile: workerFile,
    bundle: true,
    platform: "node",
    format: "esm",
    logLevel: "error",
    plugins: [
      {
        name: "raw",
        setup(b) {
          b.onResolve({ filter: /\?raw$/ }, (a) => ({ path: path.resolve(a.resolveDir, a.path.slice(0, -"?raw".length)), namespace: "raw" }));
          b.onLoad({ filter: /.*/, namespace: "raw" }, (a) => ({ contents: readFileSync(a.path, "utf8"), loader: "text" }));
        },
      },
    ],
  });
  stuckFile = path.join(dir, "stuck-worker.mjs");
  neverReadyFile = path.join(dir, "never-ready-worker.mjs");
  writeFileSync(neverReadyFile, "for (;;) {}\n");
  writeFileSync(stuckFile, `import { parentPort } from "node:worker_threads";\nparentPort.on("message", () => { for (;;) {} });\nparentPort.postMessage({ kind: "ready" });\n`);
});

afterAll(async () => {
  await Promise.all(pools.map((p) => p.close()));
  if (dir) rmSync(dir, { recursive: true, force: true });
});

const config = demoConfig();
const meta = { buildName: "Pool test", savedAt: "2026-01-02T03:04:05.000Z", revision: 7, templateName: "generic-header", templateVersion: 1 };
/** Nested loops with plenty of work per pass: the library's clock stops it, not its step budget. */
const loop = "@[ let x = 0 ]@" + "@[ over config.presets as a ]@".repeat(8) + "@[ let x = x + 1 ]@".repeat(400) + "@[ /over ]@".repeat(8) + "@( x )@";

describe("the template render pool", () => {
  it("renders byte for byte what compileAndRender renders on this thread", async () => {
    const p = pool({ size: 2 });
    const partials = { "my-part": "@[ over config.rig.channels as ch ]@@( ch.name )@;@[ /over ]@" };
    for (const source of [BUILTIN_TEMPLATES["generic-header"], BUILTIN_TEMPLATES["readable-copy"], 'x @[ use "my-part" ]@ y']) {
      const inline = compileAndRender(source, config, meta, { partials });
      const off = await p.render(source, config, meta, { partials });
      expect(off.ok).toBe(true);
      expect(off).toEqual(inline);
    }
    // Errors come back in the same shape, positions included.
    const broken = "line one\n  @( config.rig.chanels )@";
    expect(await p.render(broken, config, meta)).toEqual(compileAndRender(broken, config, meta));
  });

  it("answers a template the library stops at its own time limit, and keeps serving", async () => {
    const p = pool();
    const r = await p.render(loop, config, meta, { limits: { maxMillis: 30 } });
    expect(r.ok).toBe(false);
    expect(!r.ok && r.errors[0]).toMatchObject({ stage: "render", message: expect.stringContaining("time limit") });
    expect(p.kills).toBe(0);
    const ok = await p.render(BUILTIN_TEMPLATES["generic-header"], config, meta);
    expect(ok).toEqual(compileAndRender(BUILTIN_TEMPLATES["generic-header"], config, meta));
  });

  it("terminates a worker that never reaches a clock check, answers with the limit and replaces it", async () => {
    const p = pool({ workerFile: stuckFile, killMarginMs: 100 });
    const t0 = Date.now();
    const r = await p.render("anything", config, meta, { limits: { maxMillis: 50 } });
    const took = Date.now() - t0;
    expect(r).toEqual({
      ok: false,
      errors: [{ stage: "render", severity: "error", message: "rendering took longer than the time limit of 50 ms", line: 1, column: 1, from: 0, to: 0 }],
      warnings: [],
    });
    expect(p.kills).toBe(1);
    expect(took).toBeGreaterThanOrEqual(145);
    expect(took).toBeLessThan(2000);
    // The replacement is stuck as well, but answers: the pool did not die with the first worker.
    const again = await p.render("anything", config, meta, { limits: { maxMillis: 10 } });
    expect(!again.ok && again.errors[0].message).toBe("rendering took longer than the time limit of 10 ms");
    expect(p.kills).toBe(2);
  });

  it("gives a cold worker a loading allowance, then stops it too", async () => {
    const p = pool({ workerFile: neverReadyFile, killMarginMs: 10, startupAllowanceMs: 200 });
    const t0 = Date.now();
    const r = await p.render("anything", config, meta, { limits: { maxMillis: 10 } });
    expect(Date.now() - t0).toBeGreaterThanOrEqual(215);
    expect(!r.ok && r.errors[0].message).toBe("rendering took longer than the time limit of 10 ms");
    expect(p.kills).toBe(1);
  });

  it("stops a real template whose time goes to compiling (no clock there) and keeps serving", async () => {
    // The library's clock runs during the render only; a large source spends its time in the
    // compile, so with a 1 ms limit and a small margin the kill is what stops it.
    const p = pool({ killMarginMs: 20 });
    const heavy = "@[ piece a ]@" + "@[ let y = 1 + 2 * 3 ]@".repeat(9000) + "@[ /piece ]@@[ use a ]@";
    const r = await p.render(heavy, config, meta, { limits: { maxMillis: 1 } });
    expect(r.ok).toBe(false);
    expect(!r.ok && r.errors[0].message).toBe("rendering took longer than the time limit of 1 ms");
    expect(p.kills).toBe(1);
    const ok = await p.render("@( config.rig.channels |> count )@", config, meta);
    expect(ok).toMatchObject({ ok: true, output: String(config.rig.channels.length) });
  });

  it("queues in order up to its bound and refuses the next with a 503", async () => {
    const p = pool({ workerFile: stuckFile, killMarginMs: 0, queueLimit: 2 });
    const order: number[] = [];
    const limits = { maxMillis: 30 };
    const first = p.render("1", config, meta, { limits }).then(() => order.push(1));
    const second = p.render("2", config, meta, { limits }).then(() => order.push(2));
    const third = p.render("3", config, meta, { limits }).then(() => order.push(3));
    expect(p.waiting).toBe(2);
    const refused = await p.render("4", config, meta, { limits }).catch((e) => e);
    expect(refused).toBeInstanceOf(PoolBusyError);
    expect(refused.status).toBe(503);
    expect(refused.message).toMatch(/rendering as many templates as it can \(2 waiting\); try again/);
    await Promise.all([first, second, third]);
    expect(order).toEqual([1, 2, 3]);
  });

  it("turns a full queue into a 503 answer with Retry-After, and renders inline without a pool", async () => {
    const p = pool({ workerFile: stuckFile, queueLimit: 0 });
    const running = p.render("1", config, meta, { limits: { maxMillis: 20 } });
    const thrown = await renderOn(p, "2", config, meta).catch((e) => e);
    expect(thrown).toMatchObject({ type: "DataWithResponseInit", init: { status: 503, headers: { "Retry-After": "1" } } });
    expect(thrown.data.message).toContain("try again in a moment");
    await running;
    // No built worker (vite dev, vitest): the same outcome on this thread.
    expect(await renderOn(null, BUILTIN_TEMPLATES["generic-header"], config, meta)).toEqual(compileAndRender(BUILTIN_TEMPLATES["generic-header"], config, meta));
  });

  it("checks a save's source in a worker with capped error lists, the same as on this thread", async () => {
    const p = pool();
    // Thousands of errors of three kinds: only the first 50 cross back, with the total and the kinds.
    const hostile = "@( config.nope )@ @( x |> nofilter )@ @[ use \"missing\" ]@\n".repeat(400);
    const off = await checkOn(p, hostile, {});
    expect(off).toEqual(checkTemplateSource(hostile, {}));
    expect(off.ok).toBe(false);
    if (off.ok) return;
    expect(off.errors.errors).toHaveLength(50);
    expect(off.errors.total).toBeGreaterThan(1000);
    expect(off.errors.kinds.length).toBeLessThanOrEqual(4);
    expect(off.errors.kinds.reduce((n, k) => n + k.count, 0)).toBe(off.errors.total);
    expect(await checkOn(p, BUILTIN_TEMPLATES["generic-header"], {})).toMatchObject({ ok: true });
  });

  it("stops a check that runs past its limit with a check error, and keeps serving", async () => {
    const p = pool({ workerFile: stuckFile, killMarginMs: 50 });
    const r = await checkOn(p, "x", {}, { maxMillis: 100 });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors.errors[0]).toMatchObject({ stage: "check", message: "checking took longer than the time limit of 100 ms" });
    expect(p.kills).toBe(1);
  });

  it("takes its size from HB_TEMPLATE_WORKERS, by default min(2, cores)", () => {
    expect(poolSizeFrom(undefined, 1)).toBe(1);
    expect(poolSizeFrom(undefined, 8)).toBe(2);
    expect(poolSizeFrom("3", 2)).toBe(3);
    expect(() => poolSizeFrom("0")).toThrow(/HB_TEMPLATE_WORKERS must be a whole number from 1 to 16/);
    expect(() => poolSizeFrom("two")).toThrow(/not 'two'/);
  });
});
