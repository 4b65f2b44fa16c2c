// The database the backup and restore commands work on: DATABASE_URL when set (production),
// else the development cluster `npm start` keeps in .data/, started for the command when
// `npm start` is not running and stopped again afterwards.
import { existsSync, readFileSync } from "node:fs";
import path from "node:path";
import { devDatabaseUrl, root, startCluster } from "../lib/services.mjs";

export const dataDir = path.join(root, ".data");
export const filesDir = process.env.HB_FILES_DIR ?? path.join(dataDir, "files");
export const backupsDir = path.join(dataDir, "backups");

function npmStartRunning(): boolean {
  const lock = path.join(dataDir, "running.json");
  if (!existsSync(lock)) return false;
  try {
    process.kill((JSON.parse(readFileSync(lock, "utf8")) as { pid: number }).pid, 0);
    return true;
  } catch {
    return false;
  }
}

export async function withDatabase<T>(work: (databaseUrl: string) => T | Promise<T>): Promise<T> {
  if (process.env.DATABASE_URL || npmStartRunning()) return work(devDatabaseUrl());
  if (!existsSync(path.join(dataDir, "pg", "PG_VERSION"))) throw new Error("no development database in .data/pg yet: run `npm start` once (or set DATABASE_URL)");
  const cluster = startCluster(path.join(dataDir, "pg"), Number(process.env.PGPORT ?? 54329), { durable: true });
  try {
    return await work(devDatabaseUrl());
  } finally {
    cluster.stop();
  }
}
