// The preset library against PostgreSQL: publishing (201, 409 stale, 422 with diagnostics),
// immutable versions (the trigger), deleting only an unused version, adding to a build by role
// (a normal checked save with a revision; never to a released build), updates by three-way
// merge, the dry run across builds, imports (hostile, oversized, newer format). Every refusal
// leaves the tables as they were.
import { beforeAll, describe, expect, it } from "vitest";
import { sql, type Kysely } from "kysely";
import type { Database } from "~/lib/db/types";
import { demoConfig } from "~/lib/config/demo";
import { can, PERMISSIONS } from "~/lib/auth/permissions";
import { createBuild } from "~/lib/repo/builds.server";
import { bodyFromBuildPreset } from "~/lib/library/adapt";
import { addFromLibrary, applyUpdate, publish, rollOut, saveFromBuild, updatesFor, type Actor } from "~/lib/library/service.server";
import { exportPreset, importPreset } from "~/lib/library/exchange.server";
import { PRESET_FORMAT } from "~/lib/library/exchange";
import { deleteLibraryVersion, listLibrary, originsOf } from "~/lib/repo/library.server";
import { restoreRevision } from "~/lib/repo/revisions.server";
import { seed } from "../../db/seed";
import { freshDb, hasDatabase } from "./db";

describe.runIf(hasDatabase)("preset library (PostgreSQL)", () => {
  let db: Kysely<Database>;
  let a: Actor;
  const Z = { errors: 0, warnings: 0 };
  const meta = (name: string, status: "configuring" | "released" = "configuring") => ({ name, clientName: "", clientUserId: null, hiltNotes: "", status });
  const body = (name = "Ember drift") => ({ ...bodyFromBuildPreset(demoConfig(), "glasswind")!.body, name });
  const counts = async () => {
    const r = await sql<{ p: number; v: number; o: number; r: number }>`SELECT (SELECT count(*) FROM library_presets)::int AS p, (SELECT count(*) FROM library_versions)::int AS v,
      (SELECT count(*) FROM build_preset_origins)::int AS o, (SELECT count(*) FROM config_revisions)::int AS r`.execute(db);
    return r.rows[0];
  };

  beforeAll(async () => {
    db = await freshDb();
    const ws = (await seed(db)).workshopId;
    const builder = (await db.selectFrom("users").select("id").where("github_login", "=", "demo-builder").executeTakeFirstOrThrow()).id;
    a = { workshopId: ws, userId: builder };
  });

  it("the demo seed: two library presets, the Kestrel's Ashfall on v1 of two with a clean update waiting", async () => {
    const list = await listLibrary(db, a.workshopId, { tag: "demo", page: 1, perPage: 20 });
    expect(list.rows.map((r) => [r.name, r.latestVersion, r.buildNames])).toEqual([
      ["Ashfall embers", 2, ["Kestrel"]],
      ["Tidebreak swell", 1, ["Harrier"]],
    ]);
    const kestrel = await db.selectFrom("builds").select(["id", "config"]).where("name", "=", "Kestrel").executeTakeFirstOrThrow();
    const { updates } = await updatesFor(db, a, kestrel);
    expect(updates.map((u) => [u.presetId, u.from, u.to, u.conflicts.length])).toEqual([["ashfall", 1, 2, 0]]);
    expect(updates[0].changes.map((c) => c.text).join("\n")).toMatch(/layer 2 \(drift\) added/);
  });

  it("clients have no library permission; reviewers only read", () => {
    expect(PERMISSIONS.filter((p) => p.includes("library") && can("client", p))).toEqual([]);
    expect(PERMISSIONS.filter((p) => p.includes("library") && can("reviewer", p))).toEqual(["view:library"]);
    expect(PERMISSIONS.filter((p) => p.includes("library") && can("builder", p))).toEqual(["view:library", "publish:library", "apply:library"]);
  });

  it("publishes v1 and v2; a stale base is 409 and an erroneous preset 422 with diagnostics, both storing nothing", async () => {
    const one = await publish(db, a, { presetId: null, baseVersion: null, body: body("Stale test"), changelog: "First" });
    expect(one.status).toBe(201);
    const id = (one.body as { presetId: string }).presetId;
    const v2 = body("Stale test");
    v2.tags = ["frosty"];
    expect((await publish(db, a, { presetId: id, baseVersion: 1, body: v2, changelog: "Tagged" })).status).toBe(201);
    const before = await counts();
    const stale = await publish(db, a, { presetId: id, baseVersion: 1, body: v2, changelog: "Again" });
    expect(stale).toMatchObject({ status: 409, body: { latestVersion: 2 } });
    const broken = body("Stale test") as { looks: Record<string, { layers: { color?: string }[] }> };
    broken.looks["main-blade"].layers[0].color = "red";
    const bad = await publish(db, a, { presetId: id, baseVersion: 2, body: broken, changelog: "Broken" });
    expect(bad.status).toBe(422);
    expect((bad.body as { diagnostics: { code: string }[] }).diagnostics.some((d) => d.code === "invalid-color")).toBe(true);
    expect((await publish(db, a, { presetId: id, baseVersion: 2, body: v2, changelog: "  " })).status).toBe(422);
    expect(await counts()).toEqual(before);
    const list = await listLibrary(db, a.workshopId, { tag: "frosty", page: 1, perPage: 20 });
    expect(list.rows.map((r) => [r.name, r.latestVersion])).toEqual([["Stale test", 2]]);
  });

  it("the database refuses changing or deleting a published version outside the guarded path", async () => {
    const r = await publish(db, a, { presetId: null, baseVersion: null, body: body("Frozen"), changelog: "One" });
    const id = (r.body as { presetId: string }).presetId;
    await expect(sql`UPDATE library_versions SET changelog = 'edited' WHERE preset_id = ${id}`.execute(db)).rejects.toThrow(/immutable/);
    await expect(sql`DELETE FROM library_versions WHERE preset_id = ${id}`.execute(db)).rejects.toThrow(/immutable/);
    expect((await db.selectFrom("library_versions").select("changelog").where("preset_id", "=", id).executeTakeFirstOrThrow()).changelog).toBe("One");
  });

  it("adds by role to a build (a save with a revision and an origin), refuses a released build, and deletes only an unused version, naming the builds", async () => {
    const r = await publish(db, a, { presetId: null, baseVersion: null, body: body("Harbour glow"), changelog: "One" });
    const id = (r.body as { presetId: string }).presetId;
    await publish(db, a, { presetId: id, baseVersion: 1, body: { ...body("Harbour glow"), notes: "two" }, changelog: "Two" });
    const cfg = demoConfig();
    cfg.rig.channels = cfg.rig.channels.filter((c) => c.id !== "crystal");
    cfg.rig.channels[0].pixels = 100;
    for (const p of cfg.presets) delete p.looks.crystal;
    const { id: buildId } = await createBuild(db, a.workshopId, meta("Merlin"), cfg, { authorId: null, counts: Z });
    const added = await addFromLibrary(db, a, { buildId, libraryPresetId: id, version: 1, fontId: "glasswind", configVersion: 1 });
    expect(added.status).toBe(201);
    expect((added.body as { notes: { kind: string }[] }).notes.map((n) => n.kind)).toEqual(["skipped-role"]);
    const build = await db.selectFrom("builds").select(["config", "config_version"]).where("id", "=", buildId).executeTakeFirstOrThrow();
    expect(build.config_version).toBe(2);
    const rev = await db.selectFrom("config_revisions").select("message").where("build_id", "=", buildId).where("number", "=", 2).executeTakeFirstOrThrow();
    expect(rev.message).toMatch(/Harbour glow v1/);

    const { id: released } = await createBuild(db, a.workshopId, meta("Osprey", "released"), demoConfig(), { authorId: null, counts: Z });
    const before = await counts();
    expect((await addFromLibrary(db, a, { buildId: released, libraryPresetId: id, version: null, fontId: "glasswind", configVersion: 1 })).status).toBe(409);
    expect((await addFromLibrary(db, a, { buildId, libraryPresetId: id, version: null, fontId: "no-such-font", configVersion: 2 })).status).toBe(422);
    expect((await addFromLibrary(db, a, { buildId, libraryPresetId: id, version: null, fontId: "glasswind", configVersion: 1 })).status).toBe(409);
    const used = await deleteLibraryVersion(db, a.workshopId, id, 1);
    expect(used.kind).toBe("in-use");
    expect(used.kind === "in-use" && used.builds.map((b) => b.buildName)).toEqual(["Merlin"]);
    expect(await counts()).toEqual(before);
    expect(await deleteLibraryVersion(db, a.workshopId, id, 2)).toEqual({ kind: "deleted" });
    expect(await deleteLibraryVersion(db, a.workshopId, id, 2)).toEqual({ kind: "missing" });
  });

  it("save to library from a build, update available, apply with a collision picked", async () => {
    const { id: buildId } = await createBuild(db, a.workshopId, meta("Peregrine"), demoConfig(), { authorId: null, counts: Z });
    const saved = await saveFromBuild(db, a, { buildId, presetId: "tidebreak", changelog: "From the Peregrine", libraryPresetId: null, baseVersion: null, tags: ["sea"] });
    expect(saved.status).toBe(201);
    const lib = (saved.body as { presetId: string }).presetId;
    // The library changes the base fill; the build changes it too, differently, and edits the chamber.
    const v2 = bodyFromBuildPreset(demoConfig(), "tidebreak")!.body;
    (v2.looks["main-blade"].layers[0] as { color: string }).color = "#2244ff";
    (v2.looks["main-blade"].layers[2] as { opacity: number }).opacity = 0.4;
    expect((await publish(db, a, { presetId: lib, baseVersion: 1, body: v2, changelog: "Deeper blue" })).status).toBe(201);
    const mine = demoConfig();
    const tb = mine.presets.find((p) => p.id === "tidebreak")!;
    (tb.looks.blade.layers[0] as { color: string }).color = "#0000aa";
    (tb.looks.chamber.layers[0] as { periodMs: number }).periodMs = 3000;
    await db.updateTable("builds").set({ config: JSON.stringify(mine) }).where("id", "=", buildId).execute();
    const { updates } = await updatesFor(db, a, { id: buildId, config: mine });
    expect(updates).toHaveLength(1);
    expect(updates[0]).toMatchObject({ from: 1, to: 2, presetId: "tidebreak" });
    expect(updates[0].changes.map((c) => c.text).join("\n")).toMatch(/colour #1450ff → #2244ff/);
    expect(updates[0].conflicts).toHaveLength(1);
    const version = (await db.selectFrom("builds").select("config_version").where("id", "=", buildId).executeTakeFirstOrThrow()).config_version;
    const undecided = await applyUpdate(db, a, { buildId, presetId: "tidebreak", configVersion: version, choices: {} });
    expect(undecided.status).toBe(409);
    const done = await applyUpdate(db, a, { buildId, presetId: "tidebreak", configVersion: version, choices: { [updates[0].conflicts[0].path]: "mine" } });
    expect(done.status).toBe(200);
    const after = (await db.selectFrom("builds").select("config").where("id", "=", buildId).executeTakeFirstOrThrow()).config;
    const p = after.presets.find((x) => x.id === "tidebreak")!;
    expect(p.looks.blade.layers[0]).toMatchObject({ color: "#0000aa" });
    expect(p.looks.blade.layers[2]).toMatchObject({ opacity: 0.4 });
    expect(p.looks.chamber.layers[0]).toMatchObject({ periodMs: 3000 });
    expect((await updatesFor(db, a, { id: buildId, config: after })).updates).toEqual([]);
  });

  it("restoring a revision puts back the library origins that revision had, so an update merges from the right version", async () => {
    const r = await publish(db, a, { presetId: null, baseVersion: null, body: body("Restore glow"), changelog: "One" });
    const lib = (r.body as { presetId: string }).presetId;
    await publish(db, a, { presetId: lib, baseVersion: 1, body: { ...body("Restore glow"), notes: "two" }, changelog: "Two" });
    const { id: buildId } = await createBuild(db, a.workshopId, meta("Kite"), demoConfig(), { authorId: null, counts: Z });
    const added = await addFromLibrary(db, a, { buildId, libraryPresetId: lib, version: 1, fontId: "glasswind", configVersion: 1 });
    expect(added.status).toBe(201);
    const presetId = (added.body as { presetId: string }).presetId;
    expect((await applyUpdate(db, a, { buildId, presetId, configVersion: 2, choices: {} })).status).toBe(200); // revision 3, from v2
    const origin = async () => (await originsOf(db, a.workshopId, buildId)).map((o) => [o.presetId, o.version]);
    expect(await origin()).toEqual([[presetId, 2]]);
    const restore = async (n: number, expected: number) => expect(await restoreRevision(db, a.workshopId, buildId, n, expected, a.userId!)).toMatchObject({ kind: "restored", number: expected + 1 });
    await restore(2, 3); // revision 4 = revision 2: the preset as added from v1
    expect(await origin()).toEqual([[presetId, 1]]);
    const config4 = (await db.selectFrom("builds").select("config").where("id", "=", buildId).executeTakeFirstOrThrow()).config;
    expect((await updatesFor(db, a, { id: buildId, config: config4 })).updates.map((u) => [u.from, u.to, u.conflicts.length])).toEqual([[1, 2, 0]]);
    await restore(1, 4); // revision 5 = revision 1: no such preset, no origin
    expect(await origin()).toEqual([]);
    await restore(3, 5); // revision 6 = revision 3: from v2 again
    expect(await origin()).toEqual([[presetId, 2]]);
    await restore(5, 6); // revision 7 = revision 5: the cleared origin is remembered too
    expect(await origin()).toEqual([]);
    await restore(4, 7);
    expect(await origin()).toEqual([[presetId, 1]]);
    // A stale restore changes neither the config nor the origins.
    expect(await restoreRevision(db, a.workshopId, buildId, 3, 2, a.userId!)).toEqual({ kind: "stale" });
    expect(await origin()).toEqual([[presetId, 1]]);
  });

  it("roll-out: a dry run changes nothing; applying saves only the clean builds and never a released one", async () => {
    const r = await publish(db, a, { presetId: null, baseVersion: null, body: body("Rollout"), changelog: "One" });
    const lib = (r.body as { presetId: string }).presetId;
    const ids: Record<string, string> = {};
    for (const [name, status] of [["Kite", "configuring"], ["Buzzard", "configuring"], ["Condor", "configuring"]] as const) {
      const { id } = await createBuild(db, a.workshopId, meta(name, status), demoConfig(), { authorId: null, counts: Z });
      ids[name] = id;
      expect((await addFromLibrary(db, a, { buildId: id, libraryPresetId: lib, version: 1, fontId: "glasswind", configVersion: 1 })).status).toBe(201);
    }
    await sql`UPDATE builds SET status = 'released' WHERE id = ${ids.Condor}`.execute(db);
    // Buzzard edits the same field the library will change.
    const bz = (await db.selectFrom("builds").select("config").where("id", "=", ids.Buzzard).executeTakeFirstOrThrow()).config;
    (bz.presets.find((p) => p.id === "rollout")!.looks.blade.layers[0] as { color: string }).color = "#123456";
    await db.updateTable("builds").set({ config: JSON.stringify(bz) }).where("id", "=", ids.Buzzard).execute();
    const v2 = body("Rollout");
    (v2.looks["main-blade"].layers[0] as { color: string }).color = "#abcdef";
    await publish(db, a, { presetId: lib, baseVersion: 1, body: v2, changelog: "Two" });

    const before = await counts();
    const dry = await rollOut(db, a, lib, false);
    const outcome = (d: typeof dry) => Object.fromEntries((d.body as { rows: { buildName: string; outcome: string; applied?: boolean }[] }).rows.map((x) => [x.buildName, [x.outcome, x.applied ?? null]]));
    expect(outcome(dry)).toEqual({ Buzzard: ["conflicts", null], Condor: ["released", null], Kite: ["clean", null] });
    expect(await counts()).toEqual(before);
    const condorBefore = await db.selectFrom("builds").select(["config_version"]).where("id", "=", ids.Condor).executeTakeFirstOrThrow();
    expect(outcome(await rollOut(db, a, lib, true))).toEqual({ Buzzard: ["conflicts", null], Condor: ["released", null], Kite: ["clean", true] });
    expect((await db.selectFrom("builds").select(["config_version"]).where("id", "=", ids.Condor).executeTakeFirstOrThrow()).config_version).toBe(condorBefore.config_version);
    const kite = await db.selectFrom("build_preset_origins").select("library_version").where("build_id", "=", ids.Kite).executeTakeFirstOrThrow();
    expect(kite.library_version).toBe(2);
  });

  it("exports and imports hiltbench.preset/1; refuses newer, hostile and oversized files and stores nothing", async () => {
    const r = await publish(db, a, { presetId: null, baseVersion: null, body: body("Export me"), changelog: "One" });
    const lib = (r.body as { presetId: string }).presetId;
    const doc = (await exportPreset(db, a, lib))!;
    expect(doc).toMatchObject({ format: PRESET_FORMAT, name: "Export me", versions: [{ version: 1, changelog: "One" }] });
    const before = await counts();
    expect((await importPreset(db, a, doc)).status).toBe(409); // same name in this workshop
    expect((await importPreset(db, a, { ...doc, format: "hiltbench.preset/9" })).body).toMatchObject({ error: expect.stringMatching(/hiltbench\.preset\/9/) });
    expect((await importPreset(db, a, { ...doc, name: "Proto", __proto__: { polluted: true }, extra: 1 })).status).toBe(422);
    const hostile = structuredClone(doc) as { versions: { preset: { name: string; looks: Record<string, { layers: unknown[] }> } }[] };
    hostile.versions[0].preset.name = "x\u0000y";
    expect((await importPreset(db, a, { ...hostile, name: "Hostile" })).status).toBe(422);
    const many = { ...doc, name: "Many", versions: Array.from({ length: 51 }, (_, i) => ({ ...doc.versions[0], version: i + 1 })) };
    expect((await importPreset(db, a, many)).status).toBe(422);
    const huge = structuredClone(doc) as { versions: { preset: { looks: Record<string, { layers: unknown[] }> } }[] };
    huge.versions[0].preset.looks["main-blade"].layers = Array.from({ length: 300 }, () => ({ ...(huge.versions[0].preset.looks["main-blade"].layers[0] as object) }));
    expect((await importPreset(db, a, { ...huge, name: "Huge" })).status).toBe(422);
    expect(await counts()).toEqual(before);
    const ok = await importPreset(db, a, { ...doc, name: "Imported copy" });
    expect(ok.status).toBe(201);
  });
});
