import { beforeAll, describe, expect, it } from "vitest";
import { sql, type Kysely } from "kysely";
import type { Database } from "~/lib/db/types";
import {
  createTemplate,
  deleteTemplate,
  describeDependents,
  getTemplateVersion,
  latestSources,
  listTemplates,
  listVersions,
  pinTemplate,
  saveTemplateVersion,
  templateDependents,
} from "~/lib/repo/templates.server";
import { seed } from "../../db/seed";
import { freshDb, hasDatabase } from "./db";

describe.runIf(hasDatabase)("workshop templates and versions (PostgreSQL)", () => {
  let db: Kysely<Database>;
  let ws: string;
  let other: string;
  let user: string;
  beforeAll(async () => {
    db = await freshDb();
    ws = (await seed(db)).workshopId;
    other = (await db.insertInto("workshops").values({ name: "Other shop", slug: "other-shop" }).returning("id").executeTakeFirstOrThrow()).id;
    user = (await db.selectFrom("users").select("id").where("github_login", "=", "demo-builder").executeTakeFirstOrThrow()).id;
  });

  it("creates a template with version 1, names unique per workshop", async () => {
    const r = await createTemplate(db, ws, user, "banner", "hello @( meta.buildName )@");
    expect(r.kind).toBe("created");
    expect(await createTemplate(db, ws, user, "banner", "again")).toEqual({ kind: "taken" });
    // Another workshop may use the same name, and does not see this one.
    expect((await createTemplate(db, other, null, "banner", "theirs")).kind).toBe("created");
    const mine = await listTemplates(db, ws);
    expect(mine.map((t) => [t.name, t.latest])).toEqual([["banner", 1]]);
    const id = (r as { id: string }).id;
    expect(await getTemplateVersion(db, other, id)).toBeUndefined();
    expect((await getTemplateVersion(db, ws, id))?.source).toBe("hello @( meta.buildName )@");
  });

  it("appends versions only from the latest one, and one of two racing saves wins", async () => {
    const r = await createTemplate(db, ws, user, "racer", "v1");
    const id = (r as { id: string }).id;
    expect(await saveTemplateVersion(db, ws, id, user, "v2", 1)).toEqual({ kind: "saved", version: 2 });
    expect(await saveTemplateVersion(db, ws, id, user, "stale", 1)).toEqual({ kind: "stale", latest: 2 });
    const both = await Promise.all([saveTemplateVersion(db, ws, id, user, "a", 2), saveTemplateVersion(db, ws, id, user, "b", 2)]);
    expect(both.map((b) => b.kind).sort()).toEqual(["saved", "stale"]);
    const versions = await listVersions(db, ws, id);
    expect(versions.map((v) => v.version)).toEqual([3, 2, 1]);
    expect((await getTemplateVersion(db, ws, id, 2))?.source).toBe("v2");
    expect(await saveTemplateVersion(db, other, id, null, "x", 3)).toEqual({ kind: "missing" });
  });

  it("keeps versions immutable", async () => {
    const r = await createTemplate(db, ws, user, "frozen", "original");
    const id = (r as { id: string }).id;
    await expect(sql`UPDATE template_versions SET source = 'changed' WHERE template_id = ${id}`.execute(db)).rejects.toThrow(/immutable/);
    expect((await getTemplateVersion(db, ws, id, 1))?.source).toBe("original");
  });

  it("resolves partials to each template's latest version, within the workshop", async () => {
    const sources = await latestSources(db, ws);
    expect(sources["banner"]).toBe("hello @( meta.buildName )@");
    expect(["a", "b"]).toContain(sources["racer"]);
    expect(Object.keys(await latestSources(db, other))).toEqual(["banner"]);
    expect((await latestSources(db, other))["banner"]).toBe("theirs");
  });

  it("pins a build to an existing version only, and unpins", async () => {
    const build = (await db.selectFrom("builds").select("id").where("name", "=", "Kestrel").executeTakeFirstOrThrow()).id;
    const t = (await listTemplates(db, ws)).find((x) => x.name === "racer")!;
    expect(await pinTemplate(db, ws, build, { templateId: t.id, version: 2 })).toBe(true);
    const row = await db.selectFrom("builds").select(["pinned_template_id", "pinned_template_version"]).where("id", "=", build).executeTakeFirstOrThrow();
    expect(row).toEqual({ pinned_template_id: t.id, pinned_template_version: 2 });
    await expect(pinTemplate(db, ws, build, { templateId: t.id, version: 99 })).rejects.toThrow(/foreign key/);
    // Another workshop cannot pin this workshop's build.
    expect(await pinTemplate(db, other, build, null)).toBe(false);
    expect(await pinTemplate(db, ws, build, null)).toBe(true);
    expect((await db.selectFrom("builds").select("pinned_template_version").where("id", "=", build).executeTakeFirstOrThrow()).pinned_template_version).toBeNull();
  });

  describe("deleting a template", () => {
    const make = async (name: string, ...sources: string[]) => {
      const r = await createTemplate(db, ws, user, name, sources[0]);
      const id = (r as { id: string }).id;
      for (const [i, src] of sources.slice(1).entries()) await saveTemplateVersion(db, ws, id, user, src, i + 1);
      return id;
    };
    const count = async (sqlText: string, id: string) => Number((await sql<{ n: string }>`SELECT count(*) AS n FROM ${sql.raw(sqlText)} WHERE ${sql.raw(sqlText === "templates" ? "id" : "template_id")} = ${id}`.execute(db)).rows[0].n);
    const buildId = async (name: string) => (await db.selectFrom("builds").select("id").where("name", "=", name).executeTakeFirstOrThrow()).id;

    it("removes the template with all its versions, and only in its own workshop", async () => {
      const id = await make("scrap", "one", "two", "three");
      expect(await deleteTemplate(db, other, id)).toEqual({ kind: "missing" });
      expect(await count("template_versions", id)).toBe(3);
      expect(await deleteTemplate(db, ws, id)).toEqual({ kind: "deleted", name: "scrap", versions: 3 });
      expect(await count("templates", id)).toBe(0);
      expect(await count("template_versions", id)).toBe(0);
      expect(await deleteTemplate(db, ws, id)).toEqual({ kind: "missing" });
      expect(await deleteTemplate(db, ws, "not-a-uuid")).toEqual({ kind: "missing" });
    });

    it("still refuses to delete or change a single version on its own", async () => {
      const id = await make("kept", "v1", "v2");
      await expect(sql`DELETE FROM template_versions WHERE template_id = ${id} AND version = 1`.execute(db)).rejects.toThrow(/immutable/);
      await expect(sql`UPDATE template_versions SET source = 'x' WHERE template_id = ${id}`.execute(db)).rejects.toThrow(/immutable/);
      expect(await count("template_versions", id)).toBe(2);
    });

    it("refuses while a build (archived too) is pinned to it, naming the build, and changes nothing", async () => {
      const id = await make("pinned-one", "p1", "p2");
      const harrier = await buildId("Harrier");
      await db.updateTable("builds").set({ archived_at: new Date() }).where("id", "=", harrier).execute();
      try {
        expect(await pinTemplate(db, ws, harrier, { templateId: id, version: 1 })).toBe(true);
        const r = await deleteTemplate(db, ws, id);
        expect(r.kind).toBe("in-use");
        if (r.kind !== "in-use") return;
        expect(r.dependents.pinnedBy).toEqual([{ id: harrier, name: "Harrier", version: 1, archived: true }]);
        expect(describeDependents(r.name, r.dependents)).toBe("'pinned-one' cannot be deleted: build Harrier (archived) (v1) is pinned to it. Nothing was deleted.");
        expect(await count("template_versions", id)).toBe(2);
      } finally {
        await pinTemplate(db, ws, harrier, null);
        await db.updateTable("builds").set({ archived_at: null }).where("id", "=", harrier).execute();
      }
      expect((await deleteTemplate(db, ws, id)).kind).toBe("deleted");
    });

    it("refuses while another template's latest version uses it, or a build is pinned to an older version that does", async () => {
      const base = await make("base-part", "BASE");
      const user1 = await make("user-one", 'A @[ use "base-part" ]@', "A no longer uses it");
      const user2 = await make("user-two", 'B @[ use "base-part" ]@');
      const kestrel = await buildId("Kestrel");
      await pinTemplate(db, ws, kestrel, { templateId: user1, version: 1 });
      try {
        const d = await templateDependents(db, ws, base, "base-part");
        expect(d.pinnedBy).toEqual([]);
        expect(d.usedBy).toEqual([{ id: user2, name: "user-two" }]);
        expect(d.usedThroughPins).toEqual([{ id: kestrel, name: "Kestrel", template: "user-one", version: 1 }]);
        const r = await deleteTemplate(db, ws, base);
        expect(r.kind === "in-use" && describeDependents(r.name, r.dependents)).toBe(
          "'base-part' cannot be deleted: template user-two uses it as a partial; build Kestrel is pinned to user-one v1, which uses it. Nothing was deleted.",
        );
        expect(await count("templates", base)).toBe(1);
      } finally {
        await pinTemplate(db, ws, kestrel, null);
      }
      // The same name in another workshop is not a dependency.
      expect((await createTemplate(db, other, null, "uses-base", '@[ use "base-part" ]@')).kind).toBe("created");
      expect((await deleteTemplate(db, ws, user2)).kind).toBe("deleted");
      expect((await deleteTemplate(db, ws, base)).kind).toBe("deleted");
    });

    it("a pin made while the delete runs is found or refused: never a pin to a deleted template", async () => {
      const id = await make("racing", "r1");
      const kestrel = await buildId("Kestrel");
      // The pin's transaction holds the template row (its foreign key check) when the delete starts.
      let deleting: Promise<Awaited<ReturnType<typeof deleteTemplate>>> | undefined;
      await db.transaction().execute(async (trx) => {
        await pinTemplate(trx, ws, kestrel, { templateId: id, version: 1 });
        deleting = deleteTemplate(db, ws, id);
        await new Promise((r) => setTimeout(r, 300));
      });
      expect((await deleting!).kind).toBe("in-use");
      expect(await count("template_versions", id)).toBe(1);
      await pinTemplate(db, ws, kestrel, null);

      // The other order: the delete holds the row, the pin waits and then fails its foreign key.
      const racing = await db.transaction().execute(async (trx) => {
        await trx.selectFrom("templates").select("id").where("id", "=", id).forUpdate().execute();
        const pin = pinTemplate(db, ws, kestrel, { templateId: id, version: 1 }).then(
          () => "pinned",
          (e) => (isFk(e) ? "refused" : String(e)),
        );
        await new Promise((r) => setTimeout(r, 300));
        await trx.deleteFrom("templates").where("id", "=", id).execute();
        return { pin }; // not awaited in here: the pin can only finish once this commits
      });
      expect(await racing.pin).toBe("refused");
      const row = await db.selectFrom("builds").select(["pinned_template_id"]).where("id", "=", kestrel).executeTakeFirstOrThrow();
      expect(row.pinned_template_id).toBeNull();
    });
  });
});

const isFk = (e: unknown) => (e as { code?: string }).code === "23503";
