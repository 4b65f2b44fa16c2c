import { beforeAll, describe, expect, it } from "vitest";
import { sql, type Kysely } from "kysely";
import type { Database } from "~/lib/db/types";
import { demoConfig } from "~/lib/config/demo";
import { getBuild, listBuilds, saveConfig } from "~/lib/repo/builds.server";
import { createToken, findUserByToken, revokeToken } from "~/lib/repo/tokens.server";
import { seed } from "../../db/seed";
import { freshDb, hasDatabase } from "./db";

describe.runIf(hasDatabase)("builds table and tokens (PostgreSQL)", () => {
  let db: Kysely<Database>;
  let ws: string;
  beforeAll(async () => {
    db = await freshDb();
    ws = (await seed(db)).workshopId;
    // 10,000 builds, the size the table must stay fast at.
    const cfg = JSON.stringify(demoConfig());
    await sql`INSERT INTO builds (workshop_id, name, client_name, status, config, created_at, updated_at)
      SELECT ${ws}, 'Bench build ' || lpad(i::text, 5, '0'), 'Client ' || (i % 97), (ARRAY['intake','configuring','in-review','approved','released'])[1 + i % 5],
             ${cfg}::jsonb, now() - (i || ' minutes')::interval, now() - (i || ' seconds')::interval
      FROM generate_series(1, 10000) AS i`.execute(db);
    await sql`ANALYZE builds`.execute(db);
  });

  it("pages, sorts, filters and searches 10,000 builds", async () => {
    const t0 = performance.now();
    const page = await listBuilds(db, { workshopId: ws }, { sort: "name", dir: "desc", page: 3, perPage: 25 });
    const ms = performance.now() - t0;
    expect(page.total).toBe(10002);
    expect(page.rows).toHaveLength(25);
    expect(page.rows[0].name).toBe("Bench build 09952"); // Kestrel and Harrier sort first, descending
    const filtered = await listBuilds(db, { workshopId: ws }, { sort: "updated", dir: "desc", page: 1, perPage: 10, status: "released", q: "client 9" });
    expect(filtered.rows.every((r) => r.status === "released" && /client 9/i.test(r.client_name))).toBe(true);
    expect(filtered.total).toBeGreaterThan(0);
    const wildcard = await listBuilds(db, { workshopId: ws }, { sort: "name", dir: "asc", page: 1, perPage: 10, q: "%_" });
    expect(wildcard.total).toBe(0); // % and _ are searched literally
    console.log(`listBuilds over 10,000 rows: ${ms.toFixed(1)} ms`);
  });

  it("hides builds of other clients and workshops", async () => {
    const kestrel = await db.selectFrom("builds").select("id").where("name", "=", "Kestrel").executeTakeFirstOrThrow();
    expect(await getBuild(db, { workshopId: ws, clientUserId: "00000000-0000-0000-0000-000000000000" }, kestrel.id)).toBeUndefined();
    expect(await getBuild(db, { workshopId: "00000000-0000-0000-0000-000000000000" }, kestrel.id)).toBeUndefined();
    expect(await getBuild(db, { workshopId: ws }, "not-a-uuid")).toBeUndefined();
  });

  it("refuses a stale config save and keeps the newer one", async () => {
    const b = await db.selectFrom("builds").select(["id", "config_version"]).where("name", "=", "Kestrel").executeTakeFirstOrThrow();
    const cfg = demoConfig();
    cfg.rig.power.wireGaugeAwg = 20;
    expect(await saveConfig(db, ws, b.id, cfg, b.config_version, { authorId: null, counts: { errors: 0, warnings: 0 } })).toBe(b.config_version + 1);
    cfg.rig.power.wireGaugeAwg = 26;
    expect(await saveConfig(db, ws, b.id, cfg, b.config_version, { authorId: null, counts: { errors: 0, warnings: 0 } })).toBeNull();
    const now = await db.selectFrom("builds").select("config").where("id", "=", b.id).executeTakeFirstOrThrow();
    expect(now.config.rig.power.wireGaugeAwg).toBe(20);
  });

  it("stores tokens hashed and forgets revoked ones", async () => {
    const user = await db.selectFrom("users").select("id").where("github_login", "=", "demo-builder").executeTakeFirstOrThrow();
    const t = await createToken(db, user.id, "script");
    const row = await db.selectFrom("api_tokens").select("token_hash").where("id", "=", t.id).executeTakeFirstOrThrow();
    expect(row.token_hash).not.toContain(t.token.slice(4));
    expect(await findUserByToken(db, t.token)).toBe(user.id);
    expect(await revokeToken(db, user.id, t.id)).toBe(true);
    expect(await findUserByToken(db, t.token)).toBeNull();
    expect(await findUserByToken(db, "x".repeat(5000))).toBeNull();
  });
});
