// The client's card download (decision 023) on a real PostgreSQL database: GET
// /api/builds/:id/release-bundle answers the newest release's zip, byte for byte the one the
// builder downloaded at release (its SHA-256 is the row's), and nothing else: no parameters, no
// other client's build, nothing before a release.
import { createHash } from "node:crypto";
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import type { Kysely } from "kysely";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Database } from "~/lib/db/types";
import { createToken } from "~/lib/repo/tokens.server";
import { seed } from "../../db/seed";
import { freshAppDatabase, hasDatabase } from "./db";

const work = mkdtempSync(path.join(tmpdir(), "hb-release-bundle-"));
afterAll(() => rmSync(work, { recursive: true, force: true }));
type Loader = (args: { request: Request; params: Record<string, string>; context: unknown }) => Promise<Response>;

describe.runIf(hasDatabase)("GET /api/builds/:id/release-bundle (PostgreSQL)", () => {
  let db: Kysely<Database>;
  let ws: string;
  let kestrel: string;
  let harrier: string;
  const tokens: Record<string, string> = {};
  let bundle: Loader;
  let release: Loader;

  const call = (loader: Loader, route: string, buildId: string, query: string, who: string) =>
    loader({ request: new Request(`http://127.0.0.1/api/builds/${buildId}/${route}${query}`, { headers: { Authorization: `Bearer ${tokens[who]}` } }), params: { buildId }, context: {} });
  const bytesOf = async (res: Response) => new Uint8Array(await res.arrayBuffer());
  const sha = (b: Uint8Array) => createHash("sha256").update(b).digest("hex");

  beforeAll(async () => {
    // The routes read their settings from the environment, as the server does.
    const fresh = await freshAppDatabase({ HB_DATA_DIR: work, HB_STORAGE: "disk" });
    db = fresh.db;
    ws = (await seed(db)).workshopId;
    kestrel = (await db.selectFrom("builds").select("id").where("name", "=", "Kestrel").executeTakeFirstOrThrow()).id;
    harrier = (await db.selectFrom("builds").select("id").where("name", "=", "Harrier").executeTakeFirstOrThrow()).id;
    const builder = await db.selectFrom("users").select("id").where("github_login", "=", "demo-builder").executeTakeFirstOrThrow();
    tokens.builder = (await createToken(db, builder.id, "release test")).token;
    for (const who of ["client-one", "client-two"]) {
      const u = await db.selectFrom("users").select("id").where("email", "=", `${who}@example.test`).executeTakeFirstOrThrow();
      tokens[who] = (await createToken(db, u.id, "release test")).token;
    }
    bundle = (await import("~/routes/api.builds.$buildId.bundle")).loader as never;
    release = (await import("~/routes/api.builds.$buildId.release-bundle")).loader as never;
  });

  it("answers 404 with its reason before the build is released", async () => {
    const res = await call(release, "release-bundle", kestrel, "", "client-one");
    expect(res.status).toBe(404);
    expect((await res.json()).error).toMatch(/has not been released yet/);
  });

  it("streams the released zip, whose SHA-256 is the one recorded at release; nothing else for a client", async () => {
    // The builder's download at release time: the plan names the template, the zip gives size and checksum.
    const revision = (await db.selectFrom("builds").select("config_version").where("id", "=", kestrel).executeTakeFirstOrThrow()).config_version;
    const plan = await (await call(bundle, "bundle", kestrel, `?revision=${revision}&names=8.3&card=16&check=1`, "builder")).json();
    const zip = await bytesOf(await call(bundle, "bundle", kestrel, `?revision=${revision}&template=${plan.template.ref}&names=8.3&card=16`, "builder"));
    await db
      .insertInto("releases")
      .values({ build_id: kestrel, workshop_id: ws, number: 1, revision, template_ref: plan.template.ref, template_version: plan.template.version, name_mode: "8.3", card_gb: 16, bundle_sha256: sha(zip), bundle_bytes: zip.length, released_by: null })
      .execute();

    const res = await call(release, "release-bundle", kestrel, "", "client-one");
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("application/zip");
    expect(res.headers.get("x-bundle-sha256")).toBe(sha(zip));
    expect(res.headers.get("content-disposition")).toContain("kestrel-release-1.zip");
    const got = await bytesOf(res);
    expect([got.length, sha(got)]).toEqual([zip.length, sha(zip)]);
    // Workshop members get the same bytes here.
    expect(sha(await bytesOf(await call(release, "release-bundle", kestrel, "", "builder")))).toBe(sha(zip));

    // Parameters are refused, another client's build is not found, and the general bundle route is closed to clients.
    const asked = await call(release, "release-bundle", kestrel, `?revision=${revision}`, "client-one");
    expect(asked.status).toBe(400);
    expect((await asked.json()).error).toMatch(/takes no parameters/);
    const other = await call(release, "release-bundle", kestrel, "", "client-two");
    expect(other.status).toBe(404);
    expect((await other.json()).error).toMatch(/No build with this id/);
    expect((await call(release, "release-bundle", harrier, "", "client-one")).status).toBe(404);
    const general = await call(bundle, "bundle", kestrel, `?revision=${revision}&names=8.3&card=16`, "client-one");
    expect(general.status).toBe(403);
    expect((await general.json()).error).toMatch(/release-bundle/);
  });

  it("makes the released bytes again after the revision's own workshop template gets a new version", async () => {
    const { builtinSource, BUILTIN_VERSION } = await import("~/lib/template");
    const source = builtinSource("generic-header", BUILTIN_VERSION)!;
    const t = await db.insertInto("templates").values({ workshop_id: ws, name: `release-pin-${Date.now()}` }).returning("id").executeTakeFirstOrThrow();
    await db.insertInto("template_versions").values({ template_id: t.id, version: 1, source }).execute();
    // Revision n is saved pinned to that template (version 1); a later save makes it an older revision.
    const b = await db.selectFrom("builds").select(["config_version", "config"]).where("id", "=", harrier).executeTakeFirstOrThrow();
    const n = b.config_version + 1;
    for (const [number, pin] of [[n, true], [n + 1, false]] as const) {
      await db
        .insertInto("config_revisions")
        .values({ build_id: harrier, workshop_id: ws, number, config: JSON.stringify(b.config), created_at: new Date(Date.UTC(2026, 11, 3, 10, number)), template_id: pin ? t.id : null, template_version: pin ? 1 : null })
        .execute();
      await db.updateTable("builds").set({ config_version: number }).where("id", "=", harrier).execute();
    }
    // The release download of revision n with its own template (asked for by no name: its recorded version).
    const zip = await bytesOf(await call(bundle, "bundle", harrier, `?revision=${n}`, "builder"));
    await db
      .insertInto("releases")
      .values({ build_id: harrier, workshop_id: ws, number: 1, revision: n, template_ref: t.id, template_version: 1, name_mode: "long", card_gb: 32, bundle_sha256: sha(zip), bundle_bytes: zip.length, released_by: null })
      .execute();
    await db.insertInto("template_versions").values({ template_id: t.id, version: 2, source: `${source}\n/* changed in version 2 */\n` }).execute();
    // Asking for the template by id now takes version 2: other bytes (so this test can tell).
    expect(sha(await bytesOf(await call(bundle, "bundle", harrier, `?revision=${n}&template=${t.id}`, "builder")))).not.toBe(sha(zip));
    const got = await bytesOf(await call(release, "release-bundle", harrier, "", "client-two"));
    expect(sha(got)).toBe(sha(zip));
  });

  it("makes the released bytes again after a template chosen by hand at release gets a new version", async () => {
    const { builtinSource, BUILTIN_VERSION } = await import("~/lib/template");
    const source = builtinSource("generic-header", BUILTIN_VERSION)!;
    const t = await db.insertInto("templates").values({ workshop_id: ws, name: `release-chosen-${Date.now()}` }).returning("id").executeTakeFirstOrThrow();
    await db.insertInto("template_versions").values({ template_id: t.id, version: 1, source: `${source}\n/* chosen at release */\n` }).execute();
    const revision = (await db.selectFrom("builds").select("config_version").where("id", "=", kestrel).executeTakeFirstOrThrow()).config_version;
    const zip = await bytesOf(await call(bundle, "bundle", kestrel, `?revision=${revision}&template=${t.id}&version=1`, "builder"));
    const number = Number((await db.selectFrom("releases").select((eb) => eb.fn.max("number").as("n")).where("build_id", "=", kestrel).executeTakeFirst())?.n ?? 0) + 1;
    await db
      .insertInto("releases")
      .values({ build_id: kestrel, workshop_id: ws, number, revision, template_ref: t.id, template_version: 1, name_mode: "long", card_gb: 32, bundle_sha256: sha(zip), bundle_bytes: zip.length, released_by: null })
      .execute();
    await db.insertInto("template_versions").values({ template_id: t.id, version: 2, source: `${source}\n/* changed after release */\n` }).execute();
    // The template's newest version now makes other bytes; the release still makes its own.
    expect(sha(await bytesOf(await call(bundle, "bundle", kestrel, `?revision=${revision}&template=${t.id}`, "builder")))).not.toBe(sha(zip));
    expect(sha(await bytesOf(await call(release, "release-bundle", kestrel, "", "client-one")))).toBe(sha(zip));
    // A version the template does not have is a 404 naming it.
    const missing = await call(bundle, "bundle", kestrel, `?revision=${revision}&template=${t.id}&version=9`, "builder");
    expect(missing.status).toBe(404);
    expect((await missing.json()).error).toMatch(/no version 9/);
  });
});
