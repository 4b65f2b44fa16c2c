// A saved template version renders with the partials it recorded when it was saved, so the same
// config and template version give the same bytes after a partial is edited.
import { beforeAll, describe, expect, it } from "vitest";
import { sql, type Kysely } from "kysely";
import type { Database } from "~/lib/db/types";
import { demoConfig } from "~/lib/config/demo";
import { createTemplate, latestSources, pinTemplate, saveTemplateVersion, sourcesForVersion, templateDependents, usesOf } from "~/lib/repo/templates.server";
import { compileAndRender } from "~/lib/rendering/render";
import { seed } from "../../db/seed";
import { freshDb, hasDatabase } from "./db";

const META = { buildName: "Kestrel", savedAt: "2026-03-14T09:30:00Z", templateName: "outer", templateVersion: 1 };

describe.runIf(hasDatabase)("partials recorded per template version (PostgreSQL)", () => {
  let db: Kysely<Database>;
  let ws: string;
  let other: string;
  beforeAll(async () => {
    db = await freshDb();
    ws = (await seed(db)).workshopId;
    other = (await db.insertInto("workshops").values({ name: "Elsewhere", slug: "elsewhere" }).returning("id").executeTakeFirstOrThrow()).id;
  });

  const idOf = (r: { kind: string; id?: string }) => (r as { id: string }).id;
  const renderVersion = async (id: string, version: number) => {
    const { sources } = await sourcesForVersion(db, ws, id, version);
    const source = (await db.selectFrom("template_versions").select("source").where("template_id", "=", id).where("version", "=", version).executeTakeFirstOrThrow()).source;
    const r = compileAndRender(source, demoConfig(), META, { partials: sources, cache: false });
    return r.ok ? r.output : `ERR ${r.errors.map((e) => e.message).join("; ")}`;
  };

  it("renders a saved version with its partials as they were, while drafts see the latest", async () => {
    const inner = idOf(await createTemplate(db, ws, null, "inner", "[inner one]"));
    const deep = idOf(await createTemplate(db, ws, null, "deep", "[deep one]"));
    await saveTemplateVersion(db, ws, inner, null, '[inner two @[ use "deep" ]@]', 1);
    const outer = idOf(await createTemplate(db, ws, null, "outer", 'A @[ use "inner" ]@ Z'));
    // Recorded transitively: inner at 2, and deep (which inner v2 uses) at 1.
    expect((await sourcesForVersion(db, ws, outer, 1)).uses).toEqual({ inner: { id: inner, version: 2 }, deep: { id: deep, version: 1 } });
    expect(await renderVersion(outer, 1)).toBe("A [inner two [deep one]] Z");

    // Editing the partials changes what a draft (latest sources) renders, not the saved version.
    await saveTemplateVersion(db, ws, inner, null, '[inner three @[ use "deep" ]@]', 2);
    await saveTemplateVersion(db, ws, deep, null, "[deep two]", 1);
    expect(await renderVersion(outer, 1)).toBe("A [inner two [deep one]] Z");
    const draft = compileAndRender('A @[ use "inner" ]@ Z', demoConfig(), META, { partials: await latestSources(db, ws), cache: false });
    expect(draft.ok && draft.output).toBe("A [inner three [deep two]] Z");

    // Saving the same source again records the new versions: moving a pin there picks them up.
    expect(await saveTemplateVersion(db, ws, outer, null, 'A @[ use "inner" ]@ Z', 1)).toEqual({ kind: "saved", version: 2 });
    expect(await renderVersion(outer, 2)).toBe("A [inner three [deep two]] Z");
    expect(await renderVersion(outer, 1)).toBe("A [inner two [deep one]] Z");

    // A build pinned to outer v1 reaches deep only through inner v2's recorded use: deep stays.
    await saveTemplateVersion(db, ws, inner, null, "[inner four, alone]", 3);
    const kestrel = (await db.selectFrom("builds").select("id").where("workshop_id", "=", ws).where("name", "=", "Kestrel").executeTakeFirstOrThrow()).id;
    expect(await pinTemplate(db, ws, kestrel, { templateId: outer, version: 1 })).toBe(true);
    const d = await templateDependents(db, ws, deep, "deep");
    expect(d.usedThroughPins.map((b) => [b.name, b.template, b.version])).toEqual([["Kestrel", "outer", 1]]);
  });

  it("records a version saved before recording existed at its first render, once", async () => {
    const p = idOf(await createTemplate(db, ws, null, "late-part", "[late one]"));
    // A version as one saved before migration 0600 looks: inserted without a record.
    const legacy = await db.insertInto("templates").values({ workshop_id: ws, name: "late-user" }).returning("id").executeTakeFirstOrThrow();
    await db.insertInto("template_versions").values({ template_id: legacy.id, version: 1, source: '<@[ use "late-part" ]@>' }).execute();
    expect((await db.selectFrom("template_versions").select("uses").where("template_id", "=", legacy.id).executeTakeFirstOrThrow()).uses).toBeNull();

    expect(await renderVersion(legacy.id, 1)).toBe("<[late one]>");
    await saveTemplateVersion(db, ws, p, null, "[late two]", 1);
    expect(await renderVersion(legacy.id, 1)).toBe("<[late one]>");
    // Once recorded it never changes.
    await expect(sql`UPDATE template_versions SET uses = '{}'::jsonb WHERE template_id = ${legacy.id}`.execute(db)).rejects.toThrow(/immutable/);
  });

  it("reads only the workshop's own templates and leaves built-ins and unknown names out", async () => {
    await createTemplate(db, other, null, "theirs", "[not yours]");
    expect(await usesOf(db, ws, '@[ use "theirs" ]@ @[ use "readable-copy" ]@ @[ use "nowhere" ]@')).toEqual({});
  });
});
