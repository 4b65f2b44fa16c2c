// Personal API tokens: shown once, stored as a SHA-256 hash, looked up by that hash and
// compared in constant time, revocable.
import { createHash, randomBytes, timingSafeEqual } from "node:crypto";
import type { Kysely } from "kysely";
import type { Database } from "../db/types";

const LAST_USED_RESOLUTION_MS = 60_000;

const hash = (token: string) => createHash("sha256").update(token).digest("hex");

export async function createToken(db: Kysely<Database>, userId: string, name: string) {
  const token = `hbt_${randomBytes(32).toString("base64url")}`;
  const row = await db
    .insertInto("api_tokens")
    .values({ user_id: userId, name, token_hash: hash(token), prefix: token.slice(0, 10) })
    .returning(["id", "name", "prefix", "created_at"])
    .executeTakeFirstOrThrow();
  return { ...row, token };
}

export async function findUserByToken(db: Kysely<Database>, token: string): Promise<string | null> {
  if (token.length > 200) return null;
  const h = hash(token);
  const row = await db
    .selectFrom("api_tokens")
    .select(["id", "user_id", "token_hash", "revoked_at", "last_used_at"])
    .where("token_hash", "=", h)
    .executeTakeFirst();
  if (!row || row.revoked_at) return null;
  if (!timingSafeEqual(Buffer.from(row.token_hash), Buffer.from(h))) return null;
  // "Last used" to the minute: writing it on every request made every call of a busy token wait
  // for the same row lock (decision 010).
  if (!row.last_used_at || Date.now() - row.last_used_at.getTime() > LAST_USED_RESOLUTION_MS)
    await db.updateTable("api_tokens").set({ last_used_at: new Date() }).where("id", "=", row.id).execute();
  return row.user_id;
}

export async function listTokens(db: Kysely<Database>, userId: string) {
  return db
    .selectFrom("api_tokens")
    .select(["id", "name", "prefix", "created_at", "last_used_at", "revoked_at"])
    .where("user_id", "=", userId)
    .orderBy("created_at", "desc")
    .execute();
}

export async function revokeToken(db: Kysely<Database>, userId: string, tokenId: string) {
  const r = await db
    .updateTable("api_tokens")
    .set({ revoked_at: new Date() })
    .where("id", "=", tokenId)
    .where("user_id", "=", userId)
    .where("revoked_at", "is", null)
    .executeTakeFirst();
  return Number(r.numUpdatedRows) > 0;
}
