// E-mailed sign-in codes (decision 023): the server's record of each code that was sent.
import { sql, type Kysely } from "kysely";
import type { Database } from "../db/types";

type Db = Kysely<Database>;

export async function recordCode(db: Db, c: { email: string; tokenHash: string; linkHash: string; expiresAt: Date }) {
  // Old rows go as new ones come: nothing else reads a code past its expiry.
  await db.deleteFrom("sign_in_codes").where("expires_at", "<", sql<Date>`now() - interval '1 day'`).execute();
  await db.insertInto("sign_in_codes").values({ email: c.email.toLowerCase(), token_hash: c.tokenHash, link_hash: c.linkHash, expires_at: c.expiresAt }).execute();
}

export function codeBy(db: Db, by: "token_hash" | "link_hash", hash: string) {
  return db.selectFrom("sign_in_codes").selectAll().where(by, "=", hash).executeTakeFirst();
}

/** One more wrong code typed for this row; the new count. */
export async function countWrongCode(db: Db, id: string): Promise<number> {
  const r = await db.updateTable("sign_in_codes").set((eb) => ({ attempts: eb("attempts", "+", 1) })).where("id", "=", id).returning("attempts").executeTakeFirst();
  return r?.attempts ?? 0;
}

/** Use a code once: true only for the first use of a live code with tries left. */
export async function useCode(db: Db, id: string, maxAttempts: number): Promise<boolean> {
  const r = await db
    .updateTable("sign_in_codes")
    .set({ used_at: new Date() })
    .where("id", "=", id)
    .where("used_at", "is", null)
    .where("expires_at", ">", new Date())
    .where("attempts", "<", maxAttempts)
    .executeTakeFirst();
  return Number(r.numUpdatedRows) === 1;
}
