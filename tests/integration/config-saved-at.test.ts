// A rendered header follows the config, not the build row: renaming a build, changing its
// status, notes or archiving it leaves the generic header byte-for-byte the same; saving a
// changed config (the editors' save, the import / API replace) moves the "saved:" line.
import { beforeAll, describe, expect, it } from "vitest";
import { sql, type Kysely } from "kysely";
import type { Database } from "~/lib/db/types";
import { demoConfig } from "~/lib/config/demo";
import { storeCheckedConfigIn } from "~/lib/checks/save.server";
import { getBuild, saveConfig, setArchived, updateBuildMeta } from "~/lib/repo/builds.server";
import { BUILTIN_TEMPLATES } from "~/lib/template";
import { compileAndRender, metaForBuild } from "~/lib/rendering/render";
import { BUILTIN_VERSION } from "~/lib/template/builtins";
import * as m0500 from "../../db/migrations/20261202_0500_config_saved_at";
import { seed } from "../../db/seed";
import { freshDb, hasDatabase } from "./db";

const savedLine = (h: string) => /^ \* saved: .*$/m.exec(h)?.[0];
const tick = () => new Promise((r) => setTimeout(r, 15));

describe.runIf(hasDatabase)("the saved time a render prints (PostgreSQL)", () => {
  let db: Kysely<Database>;
  let ws: string;
  let id: string;

  async function header(): Promise<string> {
    const b = await getBuild(db, { workshopId: ws }, id);
    if (!b) throw new Error("Kestrel is gone");
    const r = compileAndRender(BUILTIN_TEMPLATES["generic-header"], b.config, metaForBuild(b, { name: "generic-header", version: BUILTIN_VERSION }), { partials: {} });
    if (!r.ok) throw new Error(r.errors.map((e) => e.message).join("; "));
    return r.output;
  }
  const meta = async () => {
    const b = (await getBuild(db, { workshopId: ws }, id))!;
    return { name: b.name, clientName: b.client_name, clientUserId: b.client_user_id, hiltNotes: b.hilt_notes, status: b.status };
  };
  const times = () => db.selectFrom("builds").select(["updated_at", "config_saved_at", "config_version"]).where("id", "=", id).executeTakeFirstOrThrow();

  beforeAll(async () => {
    db = await freshDb();
    ws = (await seed(db)).workshopId;
    id = (await db.selectFrom("builds").select("id").where("name", "=", "Kestrel").executeTakeFirstOrThrow()).id;
  });

  it("keeps the same bytes after a rename, a status change, new notes and archiving", async () => {
    const before = await header();
    const t0 = await times();
    expect(savedLine(before)).toContain(t0.config_saved_at.toISOString().slice(0, 19));

    await tick();
    await updateBuildMeta(db, ws, id, { ...(await meta()), status: "in-review" });
    await updateBuildMeta(db, ws, id, { ...(await meta()), hiltNotes: "Pommel cap re-threaded." });
    await setArchived(db, ws, id, true);
    await setArchived(db, ws, id, false);
    const t1 = await times();
    expect(t1.updated_at.getTime()).toBeGreaterThan(t0.updated_at.getTime());
    expect(t1.config_saved_at).toEqual(t0.config_saved_at);
    expect(await header()).toBe(before);

    // The name is printed in the header, so a rename changes that line and nothing else.
    const name = (await meta()).name;
    await updateBuildMeta(db, ws, id, { ...(await meta()), name: `${name} II` });
    const renamed = await header();
    expect(savedLine(renamed)).toBe(savedLine(before));
    expect(renamed).toBe(before.replaceAll(name, `${name} II`));
    await updateBuildMeta(db, ws, id, { ...(await meta()), name });
    expect(await header()).toBe(before);
  });

  it("moves the saved line when a changed config is saved, by the editors' save and by a replace", async () => {
    const before = await header();
    const t0 = await times();
    await tick();
    const next = demoConfig();
    next.rig.power.brightnessCap = 0.6;
    expect(await saveConfig(db, ws, id, next, t0.config_version, { authorId: null, counts: { errors: 0, warnings: 0 } })).toBe(t0.config_version + 1);
    const t1 = await times();
    expect(t1.config_saved_at.getTime()).toBeGreaterThan(t0.config_saved_at.getTime());
    expect(t1.config_saved_at).toEqual(t1.updated_at);
    const after = await header();
    expect(savedLine(after)).not.toBe(savedLine(before));
    expect(savedLine(after)).toContain(t1.config_saved_at.toISOString().slice(0, 19));

    await tick();
    const replaced = demoConfig();
    replaced.rig.power.brightnessCap = 0.65;
    expect(await storeCheckedConfigIn(db, ws, id, replaced, t1.config_version)).toMatchObject({ kind: "saved", version: t1.config_version + 1 });
    const t2 = await times();
    expect(t2.config_saved_at.getTime()).toBeGreaterThan(t1.config_saved_at.getTime());
    expect(savedLine(await header())).not.toBe(savedLine(after));

    // A stale save stores nothing and moves nothing.
    expect(await saveConfig(db, ws, id, demoConfig(), t1.config_version, { authorId: null, counts: { errors: 0, warnings: 0 } })).toBeNull();
    expect((await times()).config_saved_at).toEqual(t2.config_saved_at);
  });

  it("the migration fills config_saved_at from updated_at for builds that already exist", async () => {
    // Replay the step on this database: drop the column, age a build, run the migration again.
    await m0500.down(db);
    const aged = new Date("2026-06-01T08:15:00Z");
    await sql`UPDATE builds SET updated_at = ${aged} WHERE id = ${id}`.execute(db);
    await m0500.up(db);
    expect((await times()).config_saved_at).toEqual(aged);
    const inserted = await sql<{ config_saved_at: Date }>`INSERT INTO builds (workshop_id, name, status, config) VALUES (${ws}, 'Fresh', 'intake', ${JSON.stringify(demoConfig())}::jsonb) RETURNING config_saved_at`.execute(db);
    expect(inserted.rows[0].config_saved_at).toBeInstanceOf(Date);
    const nullable = await sql<{ is_nullable: string }>`SELECT is_nullable FROM information_schema.columns WHERE table_name = 'builds' AND column_name = 'config_saved_at'`.execute(db);
    expect(nullable.rows[0].is_nullable).toBe("NO");
  });
});
