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
  return (await tokenViewerRow(db, token))?.userId ?? null;
}

/**
 * A token's user and their workshop membership in one round trip (the API's hot path: one
 * query instead of a token lookup and then a membership lookup, decision 010). `member` is null
 * for a valid token of someone in no workshop.
 */
export async function tokenViewerRow(db: Kysely<Database>, token: string) {
  if (token.length > 200) return null;
  const h = hash(token);
  const row = await db
    .selectFrom("api_tokens as t")
    .leftJoin(
      (eb) =>
        eb
          .selectFrom("memberships as m")
          .innerJoin("users as u", "u.id", "m.user_id")
          .innerJoin("workshops as w", "w.id", "m.workshop_id")
          .select(["m.user_id", "m.workshop_id", "m.role", "m.created_at", "u.display_name", "u.github_login", "u.email", "w.name as workshop_name"])
          .as("mm"),
      (join) => join.onRef("mm.user_id", "=", "t.user_id"),
    )
    .select(["t.id", "t.user_id", "t.token_hash", "t.revoked_at", "t.last_used_at", "mm.workshop_id", "mm.role", "mm.display_name", "mm.github_login", "mm.email", "mm.workshop_name"])
    .where("t.token_hash", "=", h)
    .orderBy("mm.created_at")
    .limit(1)
    .executeTakeFirst();
  if (!row || row.revoked_at) return null;
  if (!timingSafeEqual(Buffer.from(row.token_hash), Buffer.from(h))) return null;
  // "Last used" to the minute: writing it on every request made every call of a busy token wait
  // for the same row lock (decision 010).
  if (!row.last_used_at || Date.now() - row.last_used_at.getTime() > LAST_USED_RESOLUTION_MS)
    await db.updateTable("api_tokens").set({ last_used_at: new Date() }).where("id", "=", row.id).execute();
  const member =
    row.workshop_id && row.role && row.display_name !== null
      ? { user_id: row.user_id, workshop_id: row.workshop_id, role: row.role, display_name: row.display_name, github_login: row.github_login, email: row.email, workshop_name: row.workshop_name ?? "" }
      : null;
  return { userId: row.user_id, member };
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
