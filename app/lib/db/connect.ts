// Opens a Kysely instance on a PostgreSQL URL and runs the migrations. Used by the app server,
// the set-up scripts and the integration tests alike.
import { Kysely, Migrator, PostgresDialect, type MigrationProvider } from "kysely";
import pg from "pg";
import { migrations } from "../../../db/migrations/index";
import type { Database } from "./types";

// Postgres returns bigint counts as strings; our counts always fit a JS number.
pg.types.setTypeParser(20, (v) => Number.parseInt(v, 10));

export function connect(url: string, max = 10): Kysely<Database> {
  return new Kysely<Database>({ dialect: new PostgresDialect({ pool: new pg.Pool({ connectionString: url, max }) }) });
}

const provider: MigrationProvider = { getMigrations: async () => migrations };

export async function migrateToLatest(db: Kysely<Database>): Promise<string[]> {
  const migrator = new Migrator({ db, provider });
  const { error, results } = await migrator.migrateToLatest();
  if (error) throw error;
  return (results ?? []).filter((r) => r.status === "Success").map((r) => r.migrationName);
}
