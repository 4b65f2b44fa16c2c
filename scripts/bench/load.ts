// `npm run bench -- load`: the built app under 200 connections at once (autocannon), on a
// throwaway PostgreSQL cluster with the demo workshop. Each endpoint's requests per second and
// p95 latency are printed as ratios against GET /healthz (one `SELECT 1`) in the same run.
// Target (decision 010): GET /api/builds p95 under 250 ms at 200 connections, no errors.
// HB_LOAD_SECONDS (default 8) and HB_LOAD_CONNECTIONS (200) change the run; server settings
// such as HB_DB_POOL_MAX pass through to the app server.
import autocannon from "autocannon";
import { createHash, randomBytes } from "node:crypto";
import { chmodSync, existsSync, mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import pg from "pg";
import { Browser } from "../lib/browser";
import { buildApp, buildDir, freePort, removeDir, root, runTsx, startApp, startCluster, startFakes, stopChild } from "../lib/services.mjs";

type Result = { name: string; rps: number; p50: number; p95: number; p99: number; errors: number; non2xx: number; total: number };

async function drive(name: string, url: string, headers: Record<string, string>, seconds: number, connections: number): Promise<Result> {
  const times: number[] = [];
  const instance = autocannon({ url, connections, duration: seconds, headers });
  instance.on("response", (_client: unknown, _status: number, _bytes: number, ms: number) => times.push(ms));
  const r = await instance;
  times.sort((a, b) => a - b);
  const pct = (p: number) => times[Math.min(times.length - 1, Math.floor((p / 100) * times.length))] ?? NaN;
  return { name, rps: r.requests.average, p50: pct(50), p95: pct(95), p99: pct(99), errors: r.errors + r.timeouts, non2xx: r.non2xx, total: times.length };
}

export async function run(): Promise<void> {
  const seconds = Number(process.env.HB_LOAD_SECONDS ?? 8);
  const connections = Number(process.env.HB_LOAD_CONNECTIONS ?? 200);
  if (!existsSync(path.join(root, buildDir, "server", "index.js"))) buildApp();
  const work = mkdtempSync(path.join(tmpdir(), "hiltbench-load-"));
  chmodSync(work, 0o755);
  const cluster = startCluster(path.join(work, "pg"), await freePort());
  const stops: (() => unknown)[] = [() => removeDir(work), () => cluster.stop()];
  try {
    const databaseUrl = `${cluster.baseUrl}/hb_load`;
    runTsx("db/setup.ts", ["--seed"], { DATABASE_URL: databaseUrl });
    const fakes = await startFakes({ FAKE_GITHUB_PORT: "0", FAKE_SMTP_PORT: "0", MAIL_SINK_DATABASE_URL: databaseUrl });
    stops.push(() => stopChild(fakes.child));
    const port = String(await freePort());
    const base = `http://127.0.0.1:${port}`;
    // Limits high enough that the run measures the limiter's cost without being refused by it.
    const app = await startApp(
      {
        HOST: "127.0.0.1",
        PORT: port,
        DATABASE_URL: databaseUrl,
        SESSION_SECRET: randomBytes(24).toString("hex"),
        APP_URL: base,
        AUTH_PROVIDER: "fake-github",
        HB_RATE_API_PER_TOKEN: "100000000",
        HB_RATE_API_PER_ADDRESS: "100000000",
        ...fakes.settings,
      },
      { quiet: true },
    );
    stops.push(() => stopChild(app));

    const sql = new pg.Pool({ connectionString: databaseUrl, max: 1 });
    const token = `hbt_${randomBytes(32).toString("base64url")}`;
    const user = await sql.query("SELECT id FROM users WHERE github_login = 'demo-builder'");
    await sql.query("INSERT INTO api_tokens (user_id, name, token_hash, prefix) VALUES ($1, 'load', $2, $3)", [user.rows[0].id, createHash("sha256").update(token).digest("hex"), token.slice(0, 10)]);
    const buildId = (await sql.query("SELECT id FROM builds ORDER BY name LIMIT 1")).rows[0].id as string;
    await sql.end();
    const browser = new Browser(base);
    await browser.signIn("demo-builder");
    const bearer = { Authorization: `Bearer ${token}` };

    const targets: [string, string, Record<string, string>][] = [
      ["GET /healthz (reference)", "/healthz", {}],
      ["GET /api/builds", "/api/builds", bearer],
      ["GET /api/builds/:id/render", `/api/builds/${buildId}/render`, bearer],
      ["GET /builds (page, session)", "/builds", { Cookie: browser.cookieHeader() }],
    ];
    // Warm up: the first requests compile code paths and fill the pool.
    for (const [, p, h] of targets) await drive("warm-up", base + p, h, 2, 20);
    const results: Result[] = [];
    for (const [name, p, h] of targets) results.push(await drive(name, base + p, h, seconds, connections));

    const ref = results[0];
    console.log(`${connections} connections, ${seconds} s each, app server pool HB_DB_POOL_MAX=${process.env.HB_DB_POOL_MAX ?? "default"}`);
    console.log("endpoint                          req/s   p50 ms  p95 ms  p99 ms  errors  non-2xx   req/s vs healthz  p95 vs healthz");
    for (const r of results)
      console.log(
        `${r.name.padEnd(32)} ${r.rps.toFixed(0).padStart(6)} ${r.p50.toFixed(0).padStart(8)} ${r.p95.toFixed(0).padStart(7)} ${r.p99.toFixed(0).padStart(7)} ${String(r.errors).padStart(7)} ${String(r.non2xx).padStart(8)}   ${(r.rps / ref.rps).toFixed(2).padStart(14)}× ${(r.p95 / ref.p95).toFixed(2).padStart(14)}×`,
      );
    const builds = results[1];
    const ok = builds.p95 < 250 && builds.errors === 0 && builds.non2xx === 0;
    console.log(`target: GET /api/builds p95 under 250 ms with no errors at ${connections} connections: ${ok ? "met" : "NOT met"} (p95 ${builds.p95.toFixed(0)} ms)`);
  } finally {
    for (const f of stops.reverse()) await f();
  }
}
