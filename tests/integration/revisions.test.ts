// Every save appends a revision in the same statement; concurrent saves from one base leave
// exactly one winner and an intact history; a restore is a new revision with the old content.
import { beforeAll, describe, expect, it } from "vitest";
import type { Kysely } from "kysely";
import type { Database } from "~/lib/db/types";
import { demoConfig } from "~/lib/config/demo";
import { storeCheckedConfigIn } from "~/lib/checks/save.server";
import { createBuild, saveConfig } from "~/lib/repo/builds.server";
import { getRevision, listRevisions, restoreRevision, revisionAuthors } from "~/lib/repo/revisions.server";
import { validate } from "~/lib/checks/validate";
import { seed } from "../../db/seed";
import { freshDb, hasDatabase } from "./db";

describe.runIf(hasDatabase)("config revisions (PostgreSQL)", () => {
  let db: Kysely<Database>;
  let ws: string;
  let builder: string;
  let owner: string;
  beforeAll(async () => {
    db = await freshDb();
    ws = (await seed(db)).workshopId;
    builder = (await db.selectFrom("users").select("id").where("github_login", "=", "demo-builder").executeTakeFirstOrThrow()).id;
    owner = (await db.selectFrom("users").select("id").where("github_login", "=", "demo-owner").executeTakeFirstOrThrow()).id;
  });
  const Z = { errors: 0, warnings: 0 };
  const meta = { name: "Merlin", clientName: "", clientUserId: null, hiltNotes: "", status: "intake" as const };

  it("creates revision 1 with the build and appends one per save, with author, message, counts and the saved time", async () => {
    const { id } = await createBuild(db, ws, meta, demoConfig(), { authorId: builder, counts: Z });
    const cfg = demoConfig();
    cfg.rig.channels[0].pixels = 128;
    const r = await storeCheckedConfigIn(db, ws, id, cfg, 1, { author: owner, message: "  shorter blade " });
    expect(r).toMatchObject({ kind: "saved", version: 2 });
    const b = await db.selectFrom("builds").selectAll().where("id", "=", id).executeTakeFirstOrThrow();
    const two = (await getRevision(db, ws, id, 2))!;
    expect(two).toMatchObject({ number: 2, authorId: owner, authorName: "Demo Owner", message: "shorter blade", errorCount: 0 });
    expect(two.createdAt.getTime()).toBe(b.config_saved_at.getTime());
    expect(two.config).toEqual(b.config);
    const one = (await getRevision(db, ws, id, 1))!;
    expect(one).toMatchObject({ number: 1, authorId: builder, message: null });
    expect(one.config.rig.channels[0].pixels).toBe(demoConfig().rig.channels[0].pixels);
    // The rig form's path stores a config with errors it already had: counts from the validator.
    const broken = structuredClone(cfg);
    broken.presets[0].fontId = "no-such-font";
    expect(await storeCheckedConfigIn(db, ws, id, broken, 2, { author: builder, known: () => validate(broken) })).toMatchObject({ kind: "saved", version: 3 });
    expect((await getRevision(db, ws, id, 3))!.errorCount).toBeGreaterThan(0);
  });

  it("20 concurrent saves from one base: one success, 19 conflicts, history intact", async () => {
    const { id } = await createBuild(db, ws, { ...meta, name: "Goshawk" }, demoConfig(), { authorId: builder, counts: Z });
    const results = await Promise.all(
      Array.from({ length: 20 }, (_, i) => {
        const c = demoConfig();
        c.rig.power.wireLengthMm = 100 + i;
        return storeCheckedConfigIn(db, ws, id, c, 1, { author: builder, message: `try ${i}` });
      }),
    );
    expect(results.filter((r) => r.kind === "saved")).toHaveLength(1);
    expect(results.filter((r) => r.kind === "stale")).toHaveLength(19);
    const winner = results.findIndex((r) => r.kind === "saved");
    const revs = await db.selectFrom("config_revisions").selectAll().where("build_id", "=", id).orderBy("number").execute();
    expect(revs.map((r) => r.number)).toEqual([1, 2]);
    expect(revs[1].message).toBe(`try ${winner}`);
    expect(revs[1].config.rig.power.wireLengthMm).toBe(100 + winner);
    const b = await db.selectFrom("builds").select(["config", "config_version"]).where("id", "=", id).executeTakeFirstOrThrow();
    expect(b.config_version).toBe(2);
    expect(b.config).toEqual(revs[1].config);
  });

  it("restores an old revision as a new one, stale-checked, and lists, sorts, filters and pages", async () => {
    const { id } = await createBuild(db, ws, { ...meta, name: "Sparrowhawk" }, demoConfig(), { authorId: builder, counts: Z });
    for (let i = 0; i < 5; i++) {
      const c = demoConfig();
      c.rig.power.wireLengthMm = 200 + i;
      expect(await saveConfig(db, ws, id, c, i + 1, { authorId: i % 2 ? owner : builder, message: `step ${i}`, counts: Z })).toBe(i + 2);
    }
    expect(await restoreRevision(db, ws, id, 2, 5, builder)).toEqual({ kind: "stale" });
    expect(await restoreRevision(db, ws, id, 99, 6, builder)).toEqual({ kind: "missing" });
    expect(await restoreRevision(db, ws, id, 2, 6, builder)).toEqual({ kind: "restored", number: 7 });
    const seven = (await getRevision(db, ws, id, 7))!;
    expect(seven.config).toEqual((await getRevision(db, ws, id, 2))!.config);
    expect(seven.message).toBe("Restored revision 2");
    const page = await listRevisions(db, ws, id, { sort: "number", dir: "desc", page: 2, perPage: 3 });
    expect(page.total).toBe(7);
    expect(page.rows.map((r) => r.number)).toEqual([4, 3, 2]);
    const mine = await listRevisions(db, ws, id, { sort: "number", dir: "asc", page: 1, perPage: 10, author: owner });
    expect(mine.rows.map((r) => r.number)).toEqual([3, 5]);
    const byAuthor = await listRevisions(db, ws, id, { sort: "author", dir: "asc", page: 1, perPage: 10 });
    expect(byAuthor.rows[0].authorName).toBe("Demo Builder");
    expect((await revisionAuthors(db, ws, id)).map((a) => a.name)).toEqual(["Demo Builder", "Demo Owner"]);
    // Another workshop sees none of it.
    expect(await getRevision(db, "00000000-0000-0000-0000-000000000000", id, 1)).toBeUndefined();
  });
});
