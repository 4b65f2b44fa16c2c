// `npm run restore -- <file> [--yes]`: replace the workshop's data (database and stored files)
// with a backup made by `npm run backup`. Everything saved since that backup is lost, so it asks
// first unless --yes is given.
import { createInterface } from "node:readline/promises";
import { restore, unpack } from "./backup/archive";
import { filesDir, withDatabase } from "./backup/dev-database";
import { rmSync } from "node:fs";

const args = process.argv.slice(2);
const yes = args.includes("--yes") || args.includes("-y");
const file = args.find((a) => !a.startsWith("-"));

async function confirm(database: string, createdAt: string): Promise<boolean> {
  if (yes) return true;
  if (!process.stdin.isTTY) {
    console.error("[hiltbench] restore replaces every row of the database; run it in a terminal to confirm, or add --yes.");
    return false;
  }
  const rl = createInterface({ input: process.stdin, output: process.stdout });
  const answer = await rl.question(
    `This replaces ALL data in the database "${database}" (and the stored files) with the backup from ${createdAt}.\nAnything saved since then is lost. Type the database name to go on: `,
  );
  rl.close();
  return answer.trim() === database;
}

try {
  if (!file) throw new Error("usage: npm run restore -- <backup file> [--yes]");
  const check = unpack(file); // refuse a bad file before touching anything
  rmSync(check.dir, { recursive: true, force: true });
  await withDatabase(async (url) => {
    const database = decodeURIComponent(new URL(url).pathname.slice(1));
    if (!(await confirm(database, check.manifest.createdAt))) {
      console.error("[hiltbench] nothing was changed.");
      process.exitCode = 1;
      return;
    }
    const m = restore({ databaseUrl: url, file, filesDir });
    console.log(`restored the backup from ${m.createdAt} into "${database}"${m.files ? `, and the stored files into ${filesDir}` : ""}.`);
  });
} catch (e) {
  console.error(`[hiltbench] restore failed: ${e instanceof Error ? e.message : e}`);
  process.exitCode = 1;
}
