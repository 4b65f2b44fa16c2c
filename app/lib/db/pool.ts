// The pg pool every Kysely instance sits on, with its faults handled. pg emits 'error' on the
// pool for an idle client whose server went away (a restart: "terminating connection due to
// administrator command") and on a checked-out client between queries; an 'error' event nobody
// listens to crashes Node, so both get a listener that only notes it. The next query on a dead
// client fails and the pool drops it; new connections are made when the server is back.
import pg from "pg";

export type PoolOptions = { max?: number; onError?: (err: Error) => void; /** Server settings for each connection, e.g. "-c synchronous_commit=off". */ options?: string };

let lastWarned = 0;
let quiet = 0;
/** One line per burst (a restart cuts every pooled connection at once), not one per connection. */
const defaultOnError = (err: Error) => {
  if (Date.now() - lastWarned < 10_000) return void quiet++;
  console.warn(`[hiltbench] database connection lost: ${err.message}${quiet ? ` (and ${quiet} more since the last note)` : ""}`);
  lastWarned = Date.now();
  quiet = 0;
};

export function createPool(url: string, { max = 10, onError = defaultOnError, options }: PoolOptions = {}): pg.Pool {
  const pool = new pg.Pool({
    connectionString: url,
    max,
    ...(options ? { options } : {}),
    // While the server is unreachable, a request fails within seconds instead of waiting for ever.
    connectionTimeoutMillis: 5_000,
    keepAlive: true,
  });
  pool.on("error", onError);
  pool.on("connect", (client) => client.on("error", onError));
  return pool;
}
