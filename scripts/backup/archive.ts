// Backups of a workshop: one tar file holding a PostgreSQL dump (pg_dump's custom format, a
// consistent snapshot taken in one transaction), a manifest, and the stored files folder when
// there is one (`.data/files/`, fonts). Restoring wipes the database's `public` schema and loads
// the dump in the same transaction, so a restore that fails leaves the data as it was.
// Debian's PostgreSQL programs (/usr/lib/postgresql/<major>/bin) and the system `tar` do the work.
import { spawnSync } from "node:child_process";
import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, renameSync, rmSync, statSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";

export const BACKUP_FORMAT = "hiltbench-backup/1";

export type Manifest = { format: typeof BACKUP_FORMAT; createdAt: string; database: string; files: boolean; pgDump: string };

/** The newest PostgreSQL major's programs (a newer pg_dump reads older servers; not the reverse). */
export function pgTool(name: "pg_dump" | "psql" | "pg_restore"): string {
  const base = "/usr/lib/postgresql";
  const majors = existsSync(base) ? readdirSync(base).filter((d) => existsSync(path.join(base, d, "bin", name))) : [];
  majors.sort((a, b) => Number(b) - Number(a));
  if (!majors.length) throw new Error(`${name} not found under ${base}: install Debian's postgresql-client`);
  return path.join(base, majors[0], "bin", name);
}

/** The URL without its password (which goes in PGPASSWORD, out of the process list). */
function connection(databaseUrl: string) {
  const u = new URL(databaseUrl);
  const password = decodeURIComponent(u.password);
  u.password = "";
  return { url: u.toString(), database: decodeURIComponent(u.pathname.slice(1)), env: { ...process.env, ...(password ? { PGPASSWORD: password } : {}) } };
}

function run(cmd: string, args: string[], env: NodeJS.ProcessEnv = process.env): string {
  const r = spawnSync(cmd, args, { env, encoding: "utf8", maxBuffer: 64 * 1024 * 1024 });
  if (r.status !== 0) throw new Error(`${path.basename(cmd)} failed (exit ${r.status}): ${(r.stderr || r.error?.message || "").trim()}`);
  return r.stdout;
}

export type BackupOptions = { databaseUrl: string; outDir: string; filesDir?: string; now?: Date };

export function backup({ databaseUrl, outDir, filesDir, now = new Date() }: BackupOptions): string {
  const c = connection(databaseUrl);
  mkdirSync(outDir, { recursive: true, mode: 0o700 });
  const staging = mkdtempSync(path.join(tmpdir(), "hiltbench-backup-"));
  try {
    const pgDump = pgTool("pg_dump");
    run(pgDump, ["--format=custom", "--no-owner", "--no-privileges", "--file", path.join(staging, "database.dump"), "--dbname", c.url], c.env);
    const withFiles = Boolean(filesDir && existsSync(filesDir) && statSync(filesDir).isDirectory());
    const manifest: Manifest = { format: BACKUP_FORMAT, createdAt: now.toISOString(), database: c.database, files: withFiles, pgDump: run(pgDump, ["--version"]).trim() };
    writeFileSync(path.join(staging, "manifest.json"), JSON.stringify(manifest, null, 2));
    const stamp = now.toISOString().replace(/[:.]/g, "-");
    const file = path.join(outDir, `hiltbench-${stamp}.tar`);
    const partial = `${file}.partial`;
    const args = ["-cf", partial, "-C", staging, "manifest.json", "database.dump"];
    if (withFiles) args.push("-C", filesDir!, "--transform", "s,^\\.,files,", ".");
    run("tar", args);
    renameSync(partial, file); // a backup file that exists is complete
    return file;
  } finally {
    rmSync(staging, { recursive: true, force: true });
  }
}

/** Unpack a backup into a new temporary folder, refusing entries that would land outside it. */
export function unpack(file: string): { dir: string; manifest: Manifest } {
  if (!existsSync(file)) throw new Error(`no backup file at ${file}`);
  const names = run("tar", ["-tf", file]).split("\n").filter(Boolean);
  for (const n of names) {
    if (n.startsWith("/") || n.split("/").includes("..")) throw new Error(`refusing a backup with the entry ${JSON.stringify(n)}`);
    if (!["manifest.json", "database.dump"].includes(n) && !/^files(\/|$)/.test(n)) throw new Error(`not a Hiltbench backup: unexpected entry ${JSON.stringify(n)}`);
  }
  if (!names.includes("manifest.json") || !names.includes("database.dump")) throw new Error("not a Hiltbench backup: manifest.json or database.dump is missing");
  const dir = mkdtempSync(path.join(tmpdir(), "hiltbench-restore-"));
  run("tar", ["-xf", file, "-C", dir, "--no-same-owner"]);
  const manifest = JSON.parse(readFileSync(path.join(dir, "manifest.json"), "utf8")) as Manifest;
  if (manifest.format !== BACKUP_FORMAT) throw new Error(`not a backup this version can read (format ${JSON.stringify(manifest.format)})`);
  return { dir, manifest };
}

export type RestoreOptions = { databaseUrl: string; file: string; filesDir?: string };

/** Replace the database's data (and the files folder, when the backup has one) with the backup's. */
export function restore({ databaseUrl, file, filesDir }: RestoreOptions): Manifest {
  const c = connection(databaseUrl);
  const { dir, manifest } = unpack(file);
  try {
    const script = path.join(dir, "restore.sql");
    run(pgTool("pg_restore"), ["--no-owner", "--no-privileges", "--file", script, path.join(dir, "database.dump")]);
    const wipe = path.join(dir, "wipe.sql");
    writeFileSync(wipe, "DROP SCHEMA IF EXISTS public CASCADE;\nCREATE SCHEMA public;\n");
    // One transaction: the wipe and the load commit together or not at all.
    run(pgTool("psql"), ["-X", "-q", "--single-transaction", "-v", "ON_ERROR_STOP=1", "-f", wipe, "-f", script, "--dbname", c.url], c.env);
    if (manifest.files && filesDir) {
      const incoming = path.join(dir, "files");
      mkdirSync(path.dirname(filesDir), { recursive: true });
      const old = `${filesDir}.before-restore`;
      rmSync(old, { recursive: true, force: true });
      if (existsSync(filesDir)) renameSync(filesDir, old);
      try {
        renameSync(incoming, filesDir);
      } catch {
        // Another file system (the temp folder on tmpfs): copy instead.
        run("cp", ["-a", incoming, filesDir]);
      }
      rmSync(old, { recursive: true, force: true });
    }
    return manifest;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
