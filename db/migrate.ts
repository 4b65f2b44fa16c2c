// Runs the frozen migrations in db/migrations against a database. Lives beside them so the app's
// own code never imports the database folder (the arrow runs one way: db/ → app/lib/db/types).
import { Migrator, type Kysely, type MigrationProvider } from "kysely";
import type { Database } from "../app/lib/db/types";
import { migrations } from "./migrations/index";

const provider: MigrationProvider = { getMigrations: async () => migrations };

export async function migrateToLatest(db: Kysely<Database>): Promise<string[]> {
  const migrator = new Migrator({ db, provider });
  const { error, results } = await migrator.migrateToLatest();
  if (error) throw error;
  return (results ?? []).filter((r) => r.status === "Success").map((r) => r.migrationName);
}
