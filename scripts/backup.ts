// `npm run backup`: a consistent dump of the workshop's database, plus the stored files when
// there are any, as one tar file in .data/backups/ (its path is the last line printed).
import { backup } from "./backup/archive";
import { backupsDir, filesDir, withDatabase } from "./backup/dev-database";

try {
  const file = await withDatabase((url) => backup({ databaseUrl: url, outDir: process.env.HB_BACKUP_DIR ?? backupsDir, filesDir }));
  console.log("backup written:");
  console.log(file);
} catch (e) {
  console.error(`[hiltbench] backup failed: ${e instanceof Error ? e.message : e}`);
  process.exitCode = 1;
}
