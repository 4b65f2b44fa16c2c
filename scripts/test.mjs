// `npm test`: the same set-up as `npm start`, on a throwaway PostgreSQL cluster, then every
// test: type-check, Vitest (unit and Postgres-backed), and Playwright in Debian's Chromium
// against the built app, then the system tests (tests/system: the built app on clusters of their
// own, restarted and shared by two servers). The cluster is removed afterwards.
import { spawnSync } from "node:child_process";
import { chmodSync, mkdtempSync, readFileSync, existsSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { randomBytes } from "node:crypto";
import { buildApp, ensureChromium, ensureNodeModules, freePort, log, removeDir, root, runTsx, startApp, startCluster, startFakes } from "./lib/services.mjs";

const bin = (name) => path.join(root, "node_modules", ".bin", name);
const only = process.argv[2]; // optional: "unit", "e2e" or "system", then files or filters for that runner
const extra = process.argv.slice(3);
const cleanups = [];
const cleanup = async () => {
  for (const f of cleanups.reverse()) {
    try {
      await f();
    } catch {}
  }
  cleanups.length = 0;
};
const stopChild = (child) => () =>
  new Promise((resolve) => {
    if (child.exitCode !== null) return resolve();
    child.once("exit", resolve);
    child.kill();
    // Keep-alive connections can hold a graceful stop open; the database is going away anyway.
    setTimeout(() => child.kill("SIGKILL"), 2000);
  });
process.on("SIGINT", () => cleanup().then(() => process.exit(130)));
process.on("SIGTERM", () => cleanup().then(() => process.exit(143)));

function step(name, cmd, args, env = {}) {
  log(name);
  const r = spawnSync(cmd, args, { cwd: root, stdio: "inherit", env: { ...process.env, ...env } });
  return r.status === 0;
}

function counts(file, kind) {
  if (!existsSync(file)) return { passed: 0, failed: 0, skipped: 0 };
  const j = JSON.parse(readFileSync(file, "utf8"));
  if (kind === "vitest") return { passed: j.numPassedTests ?? 0, failed: j.numFailedTests ?? 0, skipped: (j.numPendingTests ?? 0) + (j.numTodoTests ?? 0) };
  const s = j.stats ?? {};
  return { passed: s.expected ?? 0, failed: (s.unexpected ?? 0) + (s.flaky ?? 0), skipped: s.skipped ?? 0 };
}

let ok = true;
const work = mkdtempSync(path.join(tmpdir(), "hiltbench-test-"));
chmodSync(work, 0o755); // the postgres user keeps its throwaway cluster in here
try {
  ensureNodeModules();
  if (only !== "unit" && only !== "system") ensureChromium();
  const pgPort = await freePort();
  const cluster = startCluster(path.join(work, "pg"), pgPort);
  cleanups.push(() => removeDir(cluster.dir));
  cleanups.push(cluster.stop);
  const base = cluster.baseUrl;
  runTsx("db/setup.ts", [], { DATABASE_URL: `${base}/hb_template` });
  // Font files of this run (the seed's synthesized demo fonts, e2e uploads) stay in the work folder.
  const dataDir = path.join(work, "data");
  runTsx("db/setup.ts", ["--seed"], { DATABASE_URL: `${base}/hb_e2e`, HB_DATA_DIR: dataDir });

  if (only !== "e2e" && only !== "system") {
    ok = step("type-checking", bin("react-router"), ["typegen"]) && ok;
    ok = step("type-checking", bin("tsc"), ["--noEmit", "-p", "."]) && ok;
    ok =
      step("unit and integration tests (vitest)", bin("vitest"), ["run", "--reporter=default", "--reporter=json", `--outputFile.json=${work}/vitest.json`, ...extra], {
        TEST_DATABASE_BASE: base,
        TEST_TEMPLATE_DB: "hb_template",
      }) && ok;
  }

  if (only !== "unit" && only !== "system") {
    const fakes = await startFakes({ FAKE_GITHUB_PORT: "0" });
    cleanups.push(stopChild(fakes.child));
    buildApp();
    const port = String(await freePort());
    const env = {
      HOST: "127.0.0.1",
      PORT: port,
      DATABASE_URL: `${base}/hb_e2e`,
      HB_DATA_DIR: dataDir,
      SESSION_SECRET: randomBytes(24).toString("hex"),
      APP_URL: `http://127.0.0.1:${port}`,
      AUTH_PROVIDER: "fake-github",
      ...fakes.settings,
    };
    const app = await startApp(env, { quiet: true });
    cleanups.push(stopChild(app));
    ok =
      step("browser tests (playwright, chromium)", bin("playwright"), ["test", "--reporter=list,json", ...extra], {
        BASE_URL: env.APP_URL,
        DATABASE_URL: env.DATABASE_URL,
        ...fakes.settings,
        PLAYWRIGHT_JSON_OUTPUT_NAME: `${work}/playwright.json`,
      }) && ok;
  }

  if (only === undefined || only === "system") {
    if (only === "system") buildApp();
    ok =
      step("system tests (vitest: database restarts, two app servers)", bin("vitest"), ["run", "-c", "vitest.system.config.ts", "--reporter=default", "--reporter=json", `--outputFile.json=${work}/system.json`, ...(only ? extra : [])]) && ok;
  }

  const v = counts(`${work}/vitest.json`, "vitest");
  const sysCounts = counts(`${work}/system.json`, "vitest");
  v.passed += sysCounts.passed;
  v.failed += sysCounts.failed;
  v.skipped += sysCounts.skipped;
  const p = counts(`${work}/playwright.json`, "playwright");
  console.log(`\nvitest: ${v.passed} passed, ${v.failed} failed, ${v.skipped} skipped`);
  console.log(`playwright: ${p.passed} passed, ${p.failed} failed, ${p.skipped} skipped`);
  if (v.passed + p.passed === 0) ok = false;
  console.log(`tests: ${v.passed + p.passed} passed, ${v.failed + p.failed} failed`);
} catch (e) {
  console.error(`[hiltbench] ${e instanceof Error ? e.stack : e}`);
  ok = false;
} finally {
  await cleanup();
  removeDir(work);
}
process.exit(ok ? 0 : 1);
