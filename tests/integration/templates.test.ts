import { beforeAll, describe, expect, it } from "vitest";
import { sql, type Kysely } from "kysely";
import type { Database } from "~/lib/db/types";
import {
  createTemplate,
  getTemplateVersion,
  latestSources,
  listTemplates,
  listVersions,
  pinTemplate,
  saveTemplateVersion,
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
});
