import { beforeAll, describe, expect, it } from "vitest";
import type { Kysely } from "kysely";
import type { Database } from "~/lib/db/types";
import { changeRole, invite, listMembers, membershipFor, removeMember, signInGitHubUser } from "~/lib/repo/users.server";
import { seed } from "../../db/seed";
import { freshDb, hasDatabase } from "./db";

describe.runIf(hasDatabase)("members and invitations (PostgreSQL)", () => {
  let db: Kysely<Database>;
  let ws: string;
  beforeAll(async () => {
    db = await freshDb();
    ws = (await seed(db)).workshopId;
    await seed(db); // a second run changes nothing
  });

  it("seeds idempotently: five members and two builds", async () => {
    expect(await listMembers(db, ws)).toHaveLength(5);
    const builds = await db.selectFrom("builds").select("name").orderBy("name").execute();
    expect(builds.map((b) => b.name)).toEqual(["Harrier", "Kestrel"]);
  });

  it("recognises a seeded client by verified e-mail and links their GitHub login", async () => {
    const id = await signInGitHubUser(db, { login: "client-one", name: "Client One", verifiedEmails: ["client-one@example.test"] });
    const m = await membershipFor(db, id);
    expect(m?.role).toBe("client");
    expect(m?.github_login).toBe("client-one");
  });

  it("turns an invitation into a membership at first sign-in", async () => {
    const owner = (await listMembers(db, ws)).find((m) => m.role === "owner")!;
    expect(await invite(db, ws, owner.id, { githubLogin: "Fresh-Hand" }, "reviewer")).toEqual({ ok: true });
    const id = await signInGitHubUser(db, { login: "fresh-hand", name: "Fresh", verifiedEmails: [] });
    expect((await membershipFor(db, id))?.role).toBe("reviewer");
    expect(await invite(db, ws, owner.id, { githubLogin: "fresh-hand" }, "builder")).toMatchObject({ ok: false, status: 409 });
  });

  it("never leaves a workshop without an owner", async () => {
    const owner = (await listMembers(db, ws)).find((m) => m.role === "owner")!;
    expect(await changeRole(db, ws, owner.id, "builder")).toMatchObject({ ok: false, status: 409 });
    expect(await removeMember(db, ws, owner.id)).toMatchObject({ ok: false, status: 409 });
    const builder = (await listMembers(db, ws)).find((m) => m.role === "builder")!;
    expect(await changeRole(db, ws, builder.id, "owner")).toEqual({ ok: true });
    expect(await changeRole(db, ws, owner.id, "builder")).toEqual({ ok: true });
    // Two owners demoting each other at the same moment: one of them must stay owner.
    const [a, b] = [builder.id, owner.id];
    await changeRole(db, ws, b, "owner");
    await Promise.all([changeRole(db, ws, a, "reviewer"), changeRole(db, ws, b, "reviewer")]);
    const owners = (await listMembers(db, ws)).filter((m) => m.role === "owner");
    expect(owners.length).toBeGreaterThanOrEqual(1);
  });
});
