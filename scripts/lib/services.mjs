// Set-up shared by `npm start` and `npm test`, written with Node's built-ins only because it
// runs before the project's packages are installed.
import { execFileSync, spawn, spawnSync } from "node:child_process";
import { createHash } from "node:crypto";
import { existsSync, mkdirSync, readdirSync, readFileSync, writeFileSync, chmodSync, rmSync } from "node:fs";
import net from "node:net";
import path from "node:path";

export const root = path.resolve(path.dirname(new URL(import.meta.url).pathname), "../..");
const isRoot = process.getuid?.() === 0;

export function log(msg) {
  console.log(`[hiltbench] ${msg}`);
}

function run(cmd, args, opts = {}) {
  const r = spawnSync(cmd, args, { stdio: "inherit", cwd: root, ...opts });
  if (r.status !== 0) throw new Error(`${cmd} ${args.join(" ")} failed (exit ${r.status})`);
}

/** npm packages: install when node_modules is missing or was installed from another lock file. */
export function ensureNodeModules() {
  const lock = readFileSync(path.join(root, "package-lock.json"));
  const want = createHash("sha256").update(lock).digest("hex");
  const marker = path.join(root, "node_modules", ".hiltbench-lock-sha256");
  if (existsSync(marker) && readFileSync(marker, "utf8").trim() === want) return;
  log("installing npm packages");
  run("npm", ["ci", "--no-audit", "--no-fund"], { env: { ...process.env, PLAYWRIGHT_SKIP_BROWSER_DOWNLOAD: "1" } });
  writeFileSync(marker, want);
}

function aptInstall(pkgs, why) {
  if (!isRoot) {
    console.error(`[hiltbench] ${why} is missing. Run as root:\n  apt-get update && apt-get install -y ${pkgs.join(" ")}`);
    process.exit(1);
  }
  log(`installing ${pkgs.join(", ")} from Debian's packages`);
  run("apt-get", ["update", "-q"]);
  run("apt-get", ["install", "-y", "-q", "--no-install-recommends", ...pkgs], { env: { ...process.env, DEBIAN_FRONTEND: "noninteractive" } });
}

/** PostgreSQL's server programs; installed from Debian when absent. */
export function postgresBin() {
  const find = () => {
    const base = "/usr/lib/postgresql";
    if (!existsSync(base)) return null;
    const majors = readdirSync(base).filter((d) => existsSync(path.join(base, d, "bin", "initdb"))).sort((a, b) => Number(b) - Number(a));
    return majors.length ? path.join(base, majors[0], "bin") : null;
  };
  let bin = find();
  if (!bin) {
    aptInstall(["postgresql"], "PostgreSQL");
    bin = find();
  }
  if (!bin) throw new Error("PostgreSQL was installed but initdb was not found under /usr/lib/postgresql");
  return bin;
}

export function ensureChromium() {
  if (existsSync("/usr/bin/chromium")) return;
  aptInstall(["chromium"], "Chromium (for browser tests)");
}

/** Can the unprivileged postgres user reach this folder? (Every parent must be searchable.) */
function reachableByPostgres(dir) {
  if (!isRoot) return true;
  return spawnSync("runuser", ["-u", "postgres", "--", "test", "-x", dir]).status === 0;
}

export async function freePort() {
  return new Promise((resolve, reject) => {
    const s = net.createServer();
    s.once("error", reject);
    s.listen(0, "127.0.0.1", () => {
      const { port } = s.address();
      s.close(() => resolve(port));
    });
  });
}

/**
 * Start (creating if needed) a PostgreSQL cluster in `dataDir`, listening on 127.0.0.1 only,
 * with its socket inside the folder. As root the server runs as the `postgres` user.
 */
export function startCluster(dataDir, port) {
  const bin = postgresBin();
  let dir = dataDir;
  mkdirSync(path.dirname(dir), { recursive: true });
  if (!reachableByPostgres(path.dirname(dir))) {
    // The project sits somewhere the postgres user cannot enter (a home folder, say).
    dir = path.join("/var/tmp", `hiltbench-pg-${Buffer.from(dataDir).toString("hex").slice(-24)}`);
    log(`the postgres user cannot enter ${path.dirname(dataDir)}; keeping the database in ${dir}`);
  }
  const asPg = (cmd, args, opts = {}) => (isRoot ? run("runuser", ["-u", "postgres", "--", cmd, ...args], opts) : run(cmd, args, opts));
  if (!existsSync(path.join(dir, "PG_VERSION"))) {
    mkdirSync(dir, { recursive: true });
    if (isRoot) execFileSync("chown", ["-R", "postgres:postgres", dir]);
    chmodSync(dir, 0o700);
    log(`creating a PostgreSQL cluster in ${dir}`);
    asPg(path.join(bin, "initdb"), ["-D", dir, "-U", "postgres", "--auth=trust", "-E", "UTF8", "--locale=C.UTF-8"], { stdio: "ignore" });
  }
  const opts = `-c listen_addresses=127.0.0.1 -p ${port} -k ${dir} -c fsync=off -c synchronous_commit=off`;
  const logFile = path.join(dir, "server.log");
  asPg(path.join(bin, "pg_ctl"), ["-D", dir, "-o", opts, "-l", logFile, "-w", "-t", "60", "start"], { stdio: "ignore" });
  const stop = () => {
    const args = ["-D", dir, "-m", "fast", "-w", "stop"];
    spawnSync(isRoot ? "runuser" : path.join(bin, "pg_ctl"), isRoot ? ["-u", "postgres", "--", path.join(bin, "pg_ctl"), ...args] : args, { stdio: "ignore" });
  };
  return { dir, stop, baseUrl: `postgres://postgres@127.0.0.1:${port}` };
}

export function removeDir(dir) {
  rmSync(dir, { recursive: true, force: true });
}

const tsx = path.join(root, "node_modules", ".bin", "tsx");

export function runTsx(file, args, env) {
  run(tsx, [file, ...args], { env: { ...process.env, ...env } });
}

/** Start the local fakes; resolves with the settings they print. */
export function startFakes(env = {}) {
  return new Promise((resolve, reject) => {
    const child = spawn(tsx, [path.join(root, "scripts/fakes/index.ts")], { cwd: root, env: { ...process.env, ...env }, stdio: ["ignore", "pipe", "inherit"] });
    let buf = "";
    child.stdout.on("data", (d) => {
      buf += d;
      const m = /FAKES_READY (\{.*\})/.exec(buf);
      if (m) resolve({ child, settings: JSON.parse(m[1]) });
    });
    child.on("exit", (code) => reject(new Error(`fakes exited early (${code})`)));
  });
}

/** Where the built app goes; HB_BUILD_DIR lets two builds (say, two test runs) coexist. */
export const buildDir = process.env.HB_BUILD_DIR ?? "build";

export function buildApp() {
  log("building the app");
  run(path.join(root, "node_modules", ".bin", "react-router"), ["build"], { stdio: ["ignore", "ignore", "inherit"] });
}

/** Serve the built app and resolve once it answers HTTP. */
export async function startApp(env, { quiet = false } = {}) {
  const child = spawn(path.join(root, "node_modules", ".bin", "react-router-serve"), [`./${buildDir}/server/index.js`], {
    cwd: root,
    env: { ...process.env, NODE_ENV: "production", ...env },
    stdio: ["ignore", quiet ? "ignore" : "inherit", "inherit"],
  });
  const url = `http://${env.HOST}:${env.PORT}/healthz`;
  for (let i = 0; i < 300; i++) {
    if (child.exitCode !== null) throw new Error(`the app server exited (${child.exitCode})`);
    try {
      const r = await fetch(url);
      if (r.ok) return child;
    } catch {}
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error("the app server did not answer within 30 s");
}
