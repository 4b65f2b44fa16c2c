// A build stored before layers had ids ("hiltbench.config/1", migrations never rewrite configs
// and revisions are immutable) reads as its deterministic "/2" upgrade everywhere: the build,
// its revisions, a restore, a checked save of an old document, and its renders stay stable.
import { beforeAll, describe, expect, it } from "vitest";
import type { Kysely } from "kysely";
import type { Database } from "~/lib/db/types";
import { demoConfig } from "~/lib/config/demo";
import { CONFIG_FORMAT_V1, type Config } from "~/lib/config/schema";
import { storeCheckedConfigIn } from "~/lib/checks/save.server";
import { createBuild, getBuild } from "~/lib/repo/builds.server";
import { getRevision, restoreRevision } from "~/lib/repo/revisions.server";
import { compileAndRender, metaForBuild } from "~/lib/rendering/render";
import { BUILTIN_TEMPLATES, BUILTIN_VERSION } from "~/lib/template/builtins";
import { seed } from "../../db/seed";
import { freshDb, hasDatabase } from "./db";

/** The demo as it was stored before layer ids: format /1, layers without `id`. */
function demoV1(): Config {
  const c = demoConfig();
  const presets = c.presets.map((p) => ({ ...p, looks: Object.fromEntries(Object.entries(p.looks).map(([k, look]) => [k, { layers: look.layers.map(({ id: _, ...l }) => l) }])) }));
  return { ...c, format: CONFIG_FORMAT_V1, presets } as unknown as Config;
}

describe.runIf(hasDatabase)("configs stored in the hiltbench.config/1 form (PostgreSQL)", () => {
  let db: Kysely<Database>;
  let ws: string;
  let owner: string;
  let id: string;
  const raw = () => db.selectFrom("builds").select(["config", "config_version"]).where("id", "=", id).executeTakeFirstOrThrow();
  const render = async (name: "generic-header" | "config-json") => {
    const b = (await getBuild(db, { workshopId: ws }, id))!;
    const r = compileAndRender(BUILTIN_TEMPLATES[name], b.config, metaForBuild(b, { name, version: BUILTIN_VERSION }), { partials: {} });
    if (!r.ok) throw new Error(r.errors.map((e) => e.message).join("; "));
    return r.output;
  };

  beforeAll(async () => {
    db = await freshDb();
    ws = (await seed(db)).workshopId;
    owner = (await db.selectFrom("users").select("id").where("github_login", "=", "demo-owner").executeTakeFirstOrThrow()).id;
    // Written the way the app wrote it before /2: the row and revision 1 hold the old form.
    id = (await createBuild(db, ws, { name: "Lanner", clientName: "", clientUserId: null, hiltNotes: "", status: "intake" }, demoV1(), { authorId: owner, counts: { errors: 0, warnings: 1 } })).id;
  });

  it("reads the build and its revision as the upgrade, the same every time", async () => {
    expect((await raw()).config).toMatchObject({ format: "hiltbench.config/1" });
    expect((await getBuild(db, { workshopId: ws }, id))!.config).toEqual(demoConfig());
    expect((await getRevision(db, ws, id, 1))!.config).toEqual(demoConfig());
    // Renders are stable across reads (the ids are derived, not fresh), and print the /2 form.
    const h = await render("generic-header");
    expect(await render("generic-header")).toBe(h);
    expect(h).toContain('#define HB_FORMAT "hiltbench.config/2"');
    const j = await render("config-json");
    expect(await render("config-json")).toBe(j);
    expect(JSON.parse(j)).toEqual(demoConfig());
  });

  it("stores a checked save of an old document, and a restore of an old revision, in the /2 form", async () => {
    const v1 = demoV1() as unknown as { rig: { power: { brightnessCap: number } } };
    v1.rig.power.brightnessCap = 0.5;
    const r = await storeCheckedConfigIn(db, ws, id, v1, 1, { author: owner });
    expect(r).toMatchObject({ kind: "saved", version: 2 });
    const expected = demoConfig();
    expected.rig.power.brightnessCap = 0.5;
    expect((await raw()).config).toEqual(expected);
    expect(await restoreRevision(db, ws, id, 1, 2, owner)).toEqual({ kind: "restored", number: 3 });
    expect((await raw()).config).toEqual(demoConfig());
  });
});
