// The config_revisions table (migration 0700): backfill, immutability, and the two cascades the
// trigger lets through (the build deleted, the author's account deleted).
import { beforeAll, describe, expect, it } from "vitest";
import { sql, type Kysely } from "kysely";
import type { Database } from "~/lib/db/types";
import * as m0700 from "../../db/migrations/20261202_0700_revisions";
import * as m1300 from "../../db/migrations/20261203_1300_release";
import { seed } from "../../db/seed";
import { freshDb, hasDatabase } from "./db";

describe.runIf(hasDatabase)("config_revisions table (PostgreSQL)", () => {
  let db: Kysely<Database>;
  let ws: string;
  beforeAll(async () => {
    db = await freshDb();
    ws = (await seed(db)).workshopId;
  });

  it("seeded builds start with revision 1", async () => {
    const rows = await db.selectFrom("config_revisions as r").innerJoin("builds as b", "b.id", "r.build_id")
      .select(["b.name", "r.number", "r.created_at", "b.config_saved_at"]).orderBy("b.name").execute();
    expect(rows.map((r) => [r.name, r.number])).toEqual([["Harrier", 1], ["Kestrel", 1]]);
    for (const r of rows) expect(r.created_at.getTime()).toBe(r.config_saved_at.getTime());
  });

  it("backfills each build's current config as revision config_version", async () => {
    // Bench-check ticks and releases refer to revisions: take them away and back around the re-run.
    await m1300.down(db);
    await m0700.down(db);
    await sql`UPDATE builds SET config_version = 7, config = jsonb_set(config, '{rig,power,wireGaugeAwg}', '22') WHERE name = 'Kestrel'`.execute(db);
    await m0700.up(db);
    await m1300.up(db);
    const k = await db.selectFrom("config_revisions as r").innerJoin("builds as b", "b.id", "r.build_id")
      .select(["r.number", "r.config", "r.created_at", "b.config_saved_at", "r.author_id", "r.message"]).where("b.name", "=", "Kestrel").execute();
    expect(k).toHaveLength(1);
    expect(k[0].number).toBe(7);
    expect(k[0].config.rig.power.wireGaugeAwg).toBe(22);
    expect(k[0].created_at.getTime()).toBe(k[0].config_saved_at.getTime());
    expect(k[0].author_id).toBeNull();
    expect(k[0].message).toMatch(/revisions began/);
  });

  it("refuses UPDATE and a lone DELETE", async () => {
    const r = await db.selectFrom("config_revisions").select(["id"]).executeTakeFirstOrThrow();
    await expect(sql`UPDATE config_revisions SET message = 'rewritten' WHERE id = ${r.id}`.execute(db)).rejects.toThrow(/immutable/);
    await expect(sql`UPDATE config_revisions SET config = '{}'::jsonb WHERE id = ${r.id}`.execute(db)).rejects.toThrow(/immutable/);
    await expect(sql`UPDATE config_revisions SET author_id = NULL, number = 99 WHERE id = ${r.id}`.execute(db)).rejects.toThrow(/immutable/);
    await expect(sql`DELETE FROM config_revisions WHERE id = ${r.id}`.execute(db)).rejects.toThrow(/immutable/);
    expect((await db.selectFrom("config_revisions").select("id").where("id", "=", r.id).execute())).toHaveLength(1);
  });

  it("lets the database's own cascades through: an account deleted, a build deleted", async () => {
    const user = await db.insertInto("users").values({ github_login: "gone-soon", email: null, display_name: "Gone Soon" }).returning("id").executeTakeFirstOrThrow();
    const b = await db.insertInto("builds").values({ workshop_id: ws, name: "Merlin", status: "intake", config: "{}" }).returning("id").executeTakeFirstOrThrow();
    await db.insertInto("config_revisions").values({ build_id: b.id, workshop_id: ws, number: 1, config: "{}", author_id: user.id, message: "m", template_id: null, template_version: null }).execute();
    await db.insertInto("config_revisions").values({ build_id: b.id, workshop_id: ws, number: 2, config: "{}", author_id: user.id, message: null, template_id: null, template_version: null }).execute();
    await db.deleteFrom("users").where("id", "=", user.id).execute();
    const after = await db.selectFrom("config_revisions").select(["author_id", "message"]).where("build_id", "=", b.id).orderBy("number").execute();
    expect(after).toEqual([{ author_id: null, message: "m" }, { author_id: null, message: null }]);
    await db.deleteFrom("builds").where("id", "=", b.id).execute();
    expect(await db.selectFrom("config_revisions").select("id").where("build_id", "=", b.id).execute()).toHaveLength(0);
  });

  it("keeps numbers unique per build", async () => {
    const r = await db.selectFrom("config_revisions").selectAll().executeTakeFirstOrThrow();
    await expect(db.insertInto("config_revisions").values({ build_id: r.build_id, workshop_id: r.workshop_id, number: r.number, config: "{}", author_id: null, message: null, template_id: null, template_version: null }).execute()).rejects.toThrow(/unique|duplicate/);
  });
});
