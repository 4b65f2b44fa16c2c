// Sessions live in PostgreSQL (the cookie holds only a signed id), so any number of app
// servers can answer the same person and signing out really ends the session.
import { createCookie, createSessionStorage } from "react-router";
import { randomBytes } from "node:crypto";
import { db } from "../db/db.server";
import { env, isProduction } from "../env.server";

const WEEK_SECONDS = 60 * 60 * 24 * 7;

export type SessionData = { userId: string; flash?: string };

let storage: ReturnType<typeof make> | undefined;

function make() {
  const cookie = createCookie("__hb_session", {
    httpOnly: true,
    sameSite: "lax",
    secure: isProduction(),
    path: "/",
    maxAge: WEEK_SECONDS,
    secrets: [env().SESSION_SECRET],
  });
  return createSessionStorage<SessionData>({
    cookie,
    async createData(data, expires) {
      const id = randomBytes(24).toString("base64url");
      await db()
        .insertInto("sessions")
        .values({ id, data: JSON.stringify(data), expires_at: expires ?? new Date(Date.now() + WEEK_SECONDS * 1000) })
        .execute();
      return id;
    },
    async readData(id) {
      const row = await db().selectFrom("sessions").select(["data", "expires_at"]).where("id", "=", id).executeTakeFirst();
      if (!row || row.expires_at.getTime() < Date.now()) return null;
      return row.data as SessionData;
    },
    async updateData(id, data, expires) {
      await db()
        .updateTable("sessions")
        .set({ data: JSON.stringify(data), expires_at: expires ?? new Date(Date.now() + WEEK_SECONDS * 1000) })
        .where("id", "=", id)
        .execute();
    },
    async deleteData(id) {
      await db().deleteFrom("sessions").where("id", "=", id).execute();
    },
  });
}

export function sessions() {
  storage ??= make();
  return storage;
}

/** A fresh session for a person who just signed in (a new id every time); its Set-Cookie value. */
export async function startSession(userId: string): Promise<string> {
  const store = sessions();
  const session = await store.getSession();
  session.set("userId", userId);
  return store.commitSession(session);
}
