// Counters for rate limits, shared by every app server on this database. The shape is the one
// rate-limiter-flexible's PostgreSQL store reads and writes (key, points, expire in epoch ms);
// the app tells the library the table exists, so it never creates tables at run time.
// Frozen in time: never import app code here.
import { sql, type Kysely } from "kysely";

export async function up(db: Kysely<any>): Promise<void> {
  await sql`CREATE TABLE rate_limits (
    key varchar(255) PRIMARY KEY,
    points integer NOT NULL DEFAULT 0,
    expire bigint
  )`.execute(db);
  await sql`CREATE INDEX rate_limits_expire ON rate_limits (expire)`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`DROP TABLE IF EXISTS rate_limits`.execute(db);
}
