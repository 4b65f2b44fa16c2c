// The app server's one database handle, created lazily from the validated environment. Its
// pool's connection errors become 503 answers (outage.server.ts). Its size is HB_DB_POOL_MAX.
import { Kysely, PostgresDialect, sql } from "kysely";
import "./connect"; // type parsers
import { answering503 } from "./outage.server";
import { createPool } from "./pool";
import type { Database } from "./types";
import { env } from "../env.server";

let instance: Kysely<Database> | undefined;

export function db(): Kysely<Database> {
  instance ??= new Kysely<Database>({ dialect: new PostgresDialect({ pool: answering503(createPool(env().DATABASE_URL, { max: env().HB_DB_POOL_MAX })) }) });
  return instance;
}

/** Resolves once the database answers a trivial query (the health check). */
export async function databaseAnswers(): Promise<void> {
  await sql`SELECT 1`.execute(db());
}
