// Rate limits per API token and per client address on /api/*, and per address on sign-in,
// counted in PostgreSQL (rate-limiter-flexible's store, table from migration 1100) so every app
// server on the database shares the counts. Over the limit: 429 with Retry-After (JSON through
// apiAnswer on the API). A database outage is a 503 like everywhere else; any other limiter
// failure lets the request through (a broken counter must not lock the workshop out).
import { createHash } from "node:crypto";
import { data } from "react-router";
import { RateLimiterPostgres, RateLimiterRes } from "rate-limiter-flexible";
import pg from "pg";
import { databaseDown } from "../db/outage.server";
import { createPool } from "../db/pool";
import { isDatabaseUnavailable } from "../db/unavailable";
import { env } from "../env.server";
import { clientAddress } from "./client-address.server";

type Kind = "api-token" | "api-address" | "sign-in" | "sign-in-codes";
/** Sign-in codes per address are counted over a quarter of an hour, whatever the general window. */
const CODES_WINDOW_SECONDS = 15 * 60;
const limiters = new Map<Kind, RateLimiterPostgres>();
let counterPool: pg.Pool | undefined;

/**
 * The counters' own connections, with synchronous_commit off: a counter lost to a crash costs
 * nothing, and the app's saves (on the main pool) stay durable. Without this, every API request
 * waited for a WAL flush of two counter rows (decision 010).
 */
function countersPool(): pg.Pool {
  counterPool ??= createPool(env().DATABASE_URL, { max: 4, options: "-c synchronous_commit=off" });
  return counterPool;
}

function limiter(kind: Kind): RateLimiterPostgres {
  let l = limiters.get(kind);
  if (!l) {
    const e = env();
    const points = { "api-token": e.HB_RATE_API_PER_TOKEN, "api-address": e.HB_RATE_API_PER_ADDRESS, "sign-in": e.HB_RATE_SIGNIN_PER_ADDRESS, "sign-in-codes": e.HB_RATE_SIGNIN_CODES_PER_EMAIL }[kind];
    l = new RateLimiterPostgres({
      storeClient: countersPool(),
      storeType: "pool",
      tableName: "rate_limits",
      tableCreated: true,
      keyPrefix: kind,
      points,
      duration: kind === "sign-in-codes" ? CODES_WINDOW_SECONDS : e.HB_RATE_WINDOW_SECONDS,
    });
    limiters.set(kind, l);
  }
  return l;
}

/** The limiter's own key for a token: a hash, never the token itself. */
const tokenKey = (token: string) => createHash("sha256").update(token).digest("hex").slice(0, 32);

async function consume(kind: Kind, key: string, what: string) {
  try {
    await limiter(kind).consume(key);
  } catch (e) {
    if (e instanceof RateLimiterRes) {
      const seconds = Math.max(1, Math.ceil(e.msBeforeNext / 1000));
      throw data({ message: `Too many requests ${what}; try again in ${seconds} s.` }, { status: 429, headers: { "Retry-After": String(seconds) } });
    }
    if (isDatabaseUnavailable(e)) throw databaseDown();
    console.warn(`[hiltbench] rate limiter failed, letting the request through: ${e instanceof Error ? e.message : e}`);
  }
}

/** For every /api/* request: one point per address, and one per bearer token when there is one. */
export async function limitApi(request: Request) {
  const authz = request.headers.get("Authorization");
  const token = authz ? /^Bearer\s+(\S+)$/i.exec(authz)?.[1] : undefined;
  await Promise.all([
    consume("api-address", clientAddress(request), "from this address"),
    token ? consume("api-token", tokenKey(token), "with this API token") : undefined,
  ]);
}

/** For sign-in steps (starting it, the provider's callback): one point per address. */
export async function limitSignIn(request: Request) {
  await consume("sign-in", clientAddress(request), "to sign in from this address");
}

/**
 * Before e-mailing a sign-in code: one point per e-mail address (its hash is the key), counted
 * for every address asked for, known or not, so the answer says nothing about who is a client.
 */
export async function limitSignInCodes(email: string) {
  await consume("sign-in-codes", tokenKey(email.toLowerCase()), "for this e-mail address");
}

/** Tests: forget the limiters so new settings take effect. */
export function resetLimitersForTests() {
  limiters.clear();
}
