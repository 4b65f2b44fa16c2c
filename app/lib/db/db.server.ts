// The app server's one database handle, created lazily from the validated environment.
import { sql, type Kysely } from "kysely";
import { connect } from "./connect";
import type { Database } from "./types";
import { env } from "../env.server";

let instance: Kysely<Database> | undefined;

export function db(): Kysely<Database> {
  instance ??= connect(env().DATABASE_URL);
  return instance;
}

/** Resolves once the database answers a trivial query (the health check). */
export async function databaseAnswers(): Promise<void> {
  await sql`SELECT 1`.execute(db());
}
