// People, memberships and invitations.
import { sql, type Kysely } from "kysely";
import type { Database, Role } from "../db/types";

export type GitHubProfile = { login: string; name: string; verifiedEmails: string[] };
type Db = Kysely<Database>;

/**
 * Find the person behind a GitHub profile (by login, then by a verified e-mail so an invited
 * client is recognised), create them if new, and turn matching invitations into memberships.
 */
export async function signInGitHubUser(db: Db, profile: GitHubProfile): Promise<string> {
  return db.transaction().execute(async (trx) => {
    let user = await trx.selectFrom("users").selectAll().where(sql`lower(github_login)`, "=", profile.login.toLowerCase()).executeTakeFirst();
    if (!user && profile.verifiedEmails.length > 0) {
      user = await trx.selectFrom("users").selectAll().where(sql`lower(email)`, "in", profile.verifiedEmails).executeTakeFirst();
      if (user && !user.github_login)
        await trx.updateTable("users").set({ github_login: profile.login }).where("id", "=", user.id).execute();
    }
    if (!user) {
      const email = profile.verifiedEmails[0] ?? null;
      const taken = email ? await trx.selectFrom("users").select("id").where(sql`lower(email)`, "=", email).executeTakeFirst() : undefined;
      user = await trx
        .insertInto("users")
        .values({ github_login: profile.login, email: taken ? null : email, display_name: profile.name })
        .returningAll()
        .executeTakeFirstOrThrow();
    }
    await acceptInvitations(trx, user.id, profile.login, profile.verifiedEmails);
    return user.id;
  });
}

/**
 * A client who signed in with an e-mailed code: the person with that address, or a new person
 * for a pending invitation to it; invitations to the address become memberships.
 */
export async function signInEmailUser(db: Db, email: string): Promise<string> {
  const address = email.toLowerCase();
  return db.transaction().execute(async (trx) => {
    let user = await trx.selectFrom("users").selectAll().where(sql`lower(email)`, "=", address).executeTakeFirst();
    user ??= await trx
      .insertInto("users")
      .values({ github_login: null, email: address, display_name: address.split("@")[0] || address })
      .returningAll()
      .executeTakeFirstOrThrow();
    await acceptInvitations(trx, user.id, null, [address]);
    return user.id;
  });
}

/** May this address get a sign-in code: a client member's e-mail, or a pending client invitation to it. */
export async function isClientAddress(db: Db, email: string): Promise<boolean> {
  const address = email.toLowerCase();
  const member = await db
    .selectFrom("users as u")
    .innerJoin("memberships as m", "m.user_id", "u.id")
    .select("u.id")
    .where(sql`lower(u.email)`, "=", address)
    .where("m.role", "=", "client")
    .executeTakeFirst();
  if (member) return true;
  const invited = await db
    .selectFrom("invitations")
    .select("id")
    .where(sql`lower(email)`, "=", address)
    .where("role", "=", "client")
    .where("accepted_at", "is", null)
    .executeTakeFirst();
  return Boolean(invited);
}

async function acceptInvitations(db: Db, userId: string, login: string | null, emails: string[]) {
  let q = db.selectFrom("invitations").selectAll().where("accepted_at", "is", null);
  q = q.where((eb) =>
    eb.or([
      ...(login ? [eb(sql`lower(github_login)`, "=", login.toLowerCase())] : []),
      ...(emails.length ? [eb(sql`lower(email)`, "in", emails.map((e) => e.toLowerCase()))] : []),
    ]),
  );
  if (!login && emails.length === 0) return;
  for (const inv of await q.execute()) {
    await db
      .insertInto("memberships")
      .values({ workshop_id: inv.workshop_id, user_id: userId, role: inv.role })
      .onConflict((oc) => oc.columns(["workshop_id", "user_id"]).doNothing())
      .execute();
    await db.updateTable("invitations").set({ accepted_at: new Date() }).where("id", "=", inv.id).execute();
  }
}

/** A person's workshop and role. A person in several workshops works in the oldest membership. */
export async function membershipFor(db: Db, userId: string) {
  return db
    .selectFrom("memberships as m")
    .innerJoin("users as u", "u.id", "m.user_id")
    .innerJoin("workshops as w", "w.id", "m.workshop_id")
    .select(["m.user_id", "m.workshop_id", "m.role", "u.display_name", "u.github_login", "u.email", "w.name as workshop_name"])
    .where("m.user_id", "=", userId)
    .orderBy("m.created_at")
    .executeTakeFirst();
}

export async function listMembers(db: Db, workshopId: string) {
  return db
    .selectFrom("memberships as m")
    .innerJoin("users as u", "u.id", "m.user_id")
    .select(["u.id", "u.display_name", "u.github_login", "u.email", "m.role", "m.created_at"])
    .where("m.workshop_id", "=", workshopId)
    .orderBy("u.display_name")
    .execute();
}

export async function listInvitations(db: Db, workshopId: string) {
  return db
    .selectFrom("invitations")
    .selectAll()
    .where("workshop_id", "=", workshopId)
    .where("accepted_at", "is", null)
    .orderBy("created_at", "desc")
    .execute();
}

export type MemberChangeResult = { ok: true } | { ok: false; status: number; message: string };

export async function invite(
  db: Db,
  workshopId: string,
  invitedBy: string,
  target: { githubLogin?: string; email?: string },
  role: Role,
): Promise<MemberChangeResult> {
  return db.transaction().execute(async (trx) => {
    // Someone already known joins at once; anyone else when they first sign in.
    const login = target.githubLogin?.trim() || null;
    const email = target.email?.trim().toLowerCase() || null;
    const existing = await trx
      .selectFrom("users")
      .select("id")
      .where((eb) =>
        eb.or([
          ...(login ? [eb(sql`lower(github_login)`, "=", login.toLowerCase())] : []),
          ...(email ? [eb(sql`lower(email)`, "=", email)] : []),
        ]),
      )
      .executeTakeFirst();
    if (existing) {
      const member = await trx.selectFrom("memberships").select("role").where("workshop_id", "=", workshopId).where("user_id", "=", existing.id).executeTakeFirst();
      if (member) return { ok: false, status: 409, message: "That person is already a member of this workshop." };
      await trx.insertInto("memberships").values({ workshop_id: workshopId, user_id: existing.id, role }).execute();
      return { ok: true };
    }
    await trx.insertInto("invitations").values({ workshop_id: workshopId, github_login: login, email, role, invited_by: invitedBy }).execute();
    return { ok: true };
  });
}

async function ownerCount(db: Db, workshopId: string) {
  const r = await db
    .selectFrom("memberships")
    .select((eb) => eb.fn.countAll<number>().as("n"))
    .where("workshop_id", "=", workshopId)
    .where("role", "=", "owner")
    .executeTakeFirstOrThrow();
  return Number(r.n);
}

export async function changeRole(db: Db, workshopId: string, userId: string, role: Role): Promise<MemberChangeResult> {
  return db.transaction().execute(async (trx) => {
    // Lock the workshop's owner rows so two owners demoting each other cannot leave none.
    await sql`SELECT 1 FROM memberships WHERE workshop_id = ${workshopId} AND role = 'owner' FOR UPDATE`.execute(trx);
    const m = await trx.selectFrom("memberships").select("role").where("workshop_id", "=", workshopId).where("user_id", "=", userId).executeTakeFirst();
    if (!m) return { ok: false, status: 404, message: "No such member in this workshop." };
    if (m.role === "owner" && role !== "owner" && (await ownerCount(trx, workshopId)) <= 1)
      return { ok: false, status: 409, message: "The last owner cannot be demoted: make someone else an owner first." };
    await trx.updateTable("memberships").set({ role }).where("workshop_id", "=", workshopId).where("user_id", "=", userId).execute();
    return { ok: true };
  });
}

export async function removeMember(db: Db, workshopId: string, userId: string): Promise<MemberChangeResult> {
  return db.transaction().execute(async (trx) => {
    await sql`SELECT 1 FROM memberships WHERE workshop_id = ${workshopId} AND role = 'owner' FOR UPDATE`.execute(trx);
    const m = await trx.selectFrom("memberships").select("role").where("workshop_id", "=", workshopId).where("user_id", "=", userId).executeTakeFirst();
    if (!m) return { ok: false, status: 404, message: "No such member in this workshop." };
    if (m.role === "owner" && (await ownerCount(trx, workshopId)) <= 1)
      return { ok: false, status: 409, message: "The last owner cannot be removed: make someone else an owner first." };
    await trx.deleteFrom("memberships").where("workshop_id", "=", workshopId).where("user_id", "=", userId).execute();
    return { ok: true };
  });
}

export async function cancelInvitation(db: Db, workshopId: string, invitationId: string) {
  const r = await db.deleteFrom("invitations").where("workshop_id", "=", workshopId).where("id", "=", invitationId).executeTakeFirst();
  return Number(r.numDeletedRows) > 0;
}
