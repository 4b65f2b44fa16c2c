// Opens a Kysely instance on a PostgreSQL URL. Used by the app server, the set-up scripts and the
// integration tests alike. Migrations are run from db/migrate.ts, outside the app's code.
import { Kysely, PostgresDialect } from "kysely";
import pg from "pg";
import { createPool } from "./pool";
import type { Database } from "./types";

// Postgres returns bigint counts as strings; our counts always fit a JS number.
pg.types.setTypeParser(20, (v) => Number.parseInt(v, 10));

export function connect(url: string, max = 10): Kysely<Database> {
  return new Kysely<Database>({ dialect: new PostgresDialect({ pool: createPool(url, { max }) }) });
}
