// `npm start`: install what is missing, start PostgreSQL on 127.0.0.1 (kept in .data/, durable
// settings, SCRAM passwords, an app role that is not a superuser), migrate, seed the demo
// workshop, start the local fakes and serve the app. An app server that dies is started again
// with backoff; Ctrl-C stops the app, the fakes and PostgreSQL, in that order.
import { randomBytes } from "node:crypto";
import { existsSync, mkdirSync, readFileSync, writeFileSync, rmSync } from "node:fs";
import path from "node:path";
import { buildApp, ensureAppRole, ensureNodeModules, log, root, runTsx, spawnApp, startApp, startCluster, startFakes, stopChild } from "./lib/services.mjs";
import { supervise } from "./lib/supervise.mjs";

const dataDir = path.join(root, ".data");
mkdirSync(dataDir, { recursive: true });
const lockFile = path.join(dataDir, "running.json");

// A second `npm start` must not start a second server on the same database folder.
if (existsSync(lockFile)) {
  const prev = JSON.parse(readFileSync(lockFile, "utf8"));
  let alive = false;
  try {
    process.kill(prev.pid, 0);
    alive = true;
  } catch {}
  if (alive) {
    console.error(`[hiltbench] Hiltbench is already running (pid ${prev.pid}) at ${prev.url}. Stop it first (Ctrl+C in its terminal).`);
    process.exit(1);
  }
  rmSync(lockFile);
}

const HOST = process.env.HOST ?? "127.0.0.1";
const PORT = process.env.PORT ?? "5178";
const url = `http://${HOST}:${PORT}`;
writeFileSync(lockFile, JSON.stringify({ pid: process.pid, url }));

const cleanups = [];
let stopping = false;
async function shutdown(code = 0) {
  if (stopping) return;
  stopping = true;
  if (cleanups.length) log("stopping");
  for (const f of cleanups.reverse()) {
    try {
      await f();
    } catch {}
  }
  rmSync(lockFile, { force: true });
  process.exit(code);
}
for (const signal of ["SIGINT", "SIGTERM", "SIGHUP"]) process.on(signal, () => shutdown(0));

try {
  const started = Date.now();
  ensureNodeModules();

  let databaseUrl = process.env.DATABASE_URL;
  if (!databaseUrl) {
    const cluster = startCluster(path.join(dataDir, "pg"), Number(process.env.PGPORT ?? 54329), { durable: true });
    cleanups.push(() => {
      log("stopping PostgreSQL");
      cluster.stop();
    });
    databaseUrl = ensureAppRole(cluster);
  }
  // The fakes start first: with HB_STORAGE=s3 the seed's demo fonts go to the fake S3.
  const fakes = await startFakes({ FAKE_GITHUB_PORT: process.env.FAKE_GITHUB_PORT ?? "0" });
  cleanups.push(() => stopChild(fakes.child));
  runTsx("db/setup.ts", ["--seed"], { DATABASE_URL: databaseUrl, ...fakes.settings });

  const secretFile = path.join(dataDir, "session-secret");
  if (!existsSync(secretFile)) writeFileSync(secretFile, randomBytes(32).toString("hex"), { mode: 0o600 });

  buildApp();
  const appEnv = {
    HOST,
    PORT,
    DATABASE_URL: databaseUrl,
    SESSION_SECRET: process.env.SESSION_SECRET ?? readFileSync(secretFile, "utf8"),
    APP_URL: process.env.APP_URL ?? url,
    AUTH_PROVIDER: process.env.AUTH_PROVIDER ?? "fake-github",
    ...fakes.settings,
  };
  const app = supervise("the app server", () => spawnApp(appEnv, { quiet: true }));
  app.adopt(await startApp(appEnv, { quiet: true }));
  cleanups.push(() => app.stop());
  log(`ready in ${((Date.now() - started) / 1000).toFixed(1)} s`);
  console.log(`\n  Hiltbench is running at ${url}\n  Sign in with the local GitHub stand-in as demo-owner, demo-builder, demo-reviewer or a client.\n`);
} catch (e) {
  console.error(`[hiltbench] ${e instanceof Error ? e.message : e}`);
  await shutdown(1);
}
