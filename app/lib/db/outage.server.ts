// The app server's view of a database outage: any query that fails because PostgreSQL cannot be
// reached is re-thrown as a 503 answer (`data(...)` from React Router), so pages show the error
// page with that status and API routes (`apiAnswer`) answer JSON, without every route knowing.
// Bad queries and constraint errors pass through untouched.
import type { PostgresPool, PostgresPoolClient } from "kysely";
import type pg from "pg";
import { data } from "react-router";
import { DATABASE_DOWN_MESSAGE, isDatabaseUnavailable } from "./unavailable";

export const RETRY_AFTER_SECONDS = 10;

let lastNoted = 0;

/** The 503 thrown in place of a connection error (also used by /healthz and apiAnswer). */
export function databaseDown(): ReturnType<typeof data<{ message: string }>> {
  return data({ message: DATABASE_DOWN_MESSAGE }, { status: 503, headers: { "Retry-After": String(RETRY_AFTER_SECONDS) } });
}

function mapped(e: unknown): unknown {
  if (!isDatabaseUnavailable(e)) return e;
  // One line per outage-ish (at most every 10 s), not one per request.
  if (Date.now() - lastNoted > 10_000) {
    lastNoted = Date.now();
    console.warn(`[hiltbench] database unavailable, answering 503: ${(e as Error).message}`);
  }
  return databaseDown();
}

const wrapped = new WeakSet<object>();

function wrapClient(client: pg.PoolClient): PostgresPoolClient {
  if (!wrapped.has(client)) {
    wrapped.add(client);
    const query = client.query.bind(client) as (...a: unknown[]) => unknown;
    (client as unknown as { query: (...a: unknown[]) => unknown }).query = (...args: unknown[]) => {
      const r = query(...args);
      // A cursor (streaming) is returned as is; a promise gets its outage errors mapped.
      return r instanceof Promise ? r.catch((e) => Promise.reject(mapped(e))) : r;
    };
  }
  return client as unknown as PostgresPoolClient;
}

/** A pool for Kysely whose connection errors become 503 answers. */
export function answering503(pool: pg.Pool): PostgresPool {
  return {
    connect: () => pool.connect().then(wrapClient, (e) => Promise.reject(mapped(e))),
    end: () => pool.end(),
  };
}
