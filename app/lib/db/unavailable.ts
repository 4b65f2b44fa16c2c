// Which errors mean "PostgreSQL cannot be reached right now" (as opposed to a bad query): the
// server is shutting down, restarting or refusing connections, or a pooled connection was cut.
// Those become a 503 with a message a person can act on; everything else stays a real error.

export const DATABASE_DOWN_MESSAGE =
  "The workshop database is not answering right now (it may be restarting). Nothing you saved before this was lost; try again in a minute.";

/** SQLSTATE codes for a server that is going away or not there yet, and class 08 (connection exception). */
const DOWN_CODES = new Set(["57P01", "57P02", "57P03", "57P05", "53300"]);
const NETWORK_CODES = new Set(["ECONNREFUSED", "ECONNRESET", "EPIPE", "ETIMEDOUT", "EHOSTUNREACH", "ENETUNREACH", "ENOTFOUND", "EAI_AGAIN"]);
const MESSAGES = [
  /^Connection terminated/i,
  /^timeout exceeded when trying to connect/i,
  /Client has encountered a connection error and is not queryable/i,
  /^Client was closed and is not queryable/i,
  /the database system is (starting up|shutting down|in recovery mode)/i,
];

export function isDatabaseUnavailable(e: unknown, depth = 0): boolean {
  if (typeof e !== "object" || e === null || depth > 4) return false;
  const err = e as { code?: unknown; message?: unknown; cause?: unknown; errors?: unknown };
  if (typeof err.code === "string") {
    if (DOWN_CODES.has(err.code) || err.code.startsWith("08") || NETWORK_CODES.has(err.code)) return true;
  }
  if (typeof err.message === "string" && MESSAGES.some((m) => m.test(err.message as string))) return true;
  // Node's AggregateError (a connect to several addresses that all failed) and wrapped causes.
  if (Array.isArray(err.errors) && err.errors.some((x) => isDatabaseUnavailable(x, depth + 1))) return true;
  return err.cause !== undefined && isDatabaseUnavailable(err.cause, depth + 1);
}
