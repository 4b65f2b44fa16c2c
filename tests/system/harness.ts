// What the system tests share: a PostgreSQL cluster of their own (so they may restart it), the
// local fakes, and app servers from the built app (`react-router-serve`, as `npm start` runs it),
// plus an HTTP client that signs in through the fake GitHub the way a browser would.
import type { ChildProcess } from "node:child_process";
import { createHash, randomBytes } from "node:crypto";
import { chmodSync, existsSync, mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import pg from "pg";
import { buildDir, freePort, removeDir, root, runTsx, startApp, startCluster, startFakes, stopChild, type Cluster } from "../../scripts/lib/services.mjs";

export type System = {
  cluster: Cluster;
  databaseUrl: string;
  sql: pg.Pool;
  fakes: Record<string, string>;
  sessionSecret: string;
  startServer(extraEnv?: Record<string, string>): Promise<Server>;
  close(): Promise<void>;
};
export type Server = { url: string; child: ChildProcess; stop(): Promise<void> };

export function requireBuiltApp() {
  if (!existsSync(path.join(root, buildDir, "server", "index.js")))
    throw new Error(`no built app in ${buildDir}/: run system tests through \`node scripts/test.mjs system\`, which builds it`);
}

export async function startSystem(): Promise<System> {
  requireBuiltApp();
  const work = mkdtempSync(path.join(tmpdir(), "hiltbench-system-"));
  chmodSync(work, 0o755);
  const cluster = startCluster(path.join(work, "pg"), await freePort());
  const databaseUrl = `${cluster.baseUrl}/hb_system`;
  runTsx("db/setup.ts", ["--seed"], { DATABASE_URL: databaseUrl });
  const fakes = await startFakes({ FAKE_GITHUB_PORT: "0", FAKE_SMTP_PORT: "0", MAIL_SINK_DATABASE_URL: databaseUrl });
  const sql = new pg.Pool({ connectionString: databaseUrl, max: 2 });
  sql.on("error", () => {}); // the tests restart the cluster under it
  const sessionSecret = randomBytes(24).toString("hex");
  const servers: Server[] = [];
  return {
    cluster,
    databaseUrl,
    sql,
    fakes: fakes.settings,
    sessionSecret,
    async startServer(extraEnv = {}) {
      const port = String(await freePort());
      const url = `http://127.0.0.1:${port}`;
      const child = await startApp(
        { HOST: "127.0.0.1", PORT: port, DATABASE_URL: databaseUrl, SESSION_SECRET: sessionSecret, APP_URL: url, AUTH_PROVIDER: "fake-github", ...fakes.settings, ...extraEnv },
        { quiet: true },
      );
      const server = { url, child, stop: () => stopChild(child) };
      servers.push(server);
      return server;
    },
    async close() {
      for (const s of servers) await s.stop();
      await stopChild(fakes.child);
      await sql.end().catch(() => {});
      cluster.stop();
      removeDir(work);
    },
  };
}

/** A personal API token stored as the app stores them. */
export async function tokenFor(sql: pg.Pool, login: string): Promise<string> {
  const token = `hbt_${randomBytes(32).toString("base64url")}`;
  const user = await sql.query("SELECT id FROM users WHERE github_login = $1", [login]);
  await sql.query("INSERT INTO api_tokens (user_id, name, token_hash, prefix) VALUES ($1, 'system test', $2, $3)", [
    user.rows[0].id,
    createHash("sha256").update(token).digest("hex"),
    token.slice(0, 10),
  ]);
  return token;
}

export { Browser } from "../../scripts/lib/browser";
