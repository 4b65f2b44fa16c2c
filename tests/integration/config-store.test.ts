import { beforeAll, describe, expect, it } from "vitest";
import type { Kysely } from "kysely";
import type { Database } from "~/lib/db/types";
import { demoConfig } from "~/lib/config/demo";
import { storeCheckedConfigIn } from "~/lib/checks/save.server";
import { seed } from "../../db/seed";
import { freshDb, hasDatabase } from "./db";

describe.runIf(hasDatabase)("replacing a build's config (PostgreSQL)", () => {
  let db: Kysely<Database>;
  let ws: string;
  let id: string;
  const row = () => db.selectFrom("builds").select(["config", "config_version"]).where("id", "=", id).executeTakeFirstOrThrow();

  beforeAll(async () => {
    db = await freshDb();
    ws = (await seed(db)).workshopId;
    id = (await db.selectFrom("builds").select("id").where("name", "=", "Kestrel").executeTakeFirstOrThrow()).id;
  });

  it("stores a valid config over the version it was read at and answers its warnings", async () => {
    const before = await row();
    const next = demoConfig();
    next.rig.power.brightnessCap = 0.7;
    const r = await storeCheckedConfigIn(db, ws, id, next, before.config_version);
    expect(r).toEqual({ kind: "saved", version: before.config_version + 1, diagnostics: [expect.objectContaining({ code: "font-promised", severity: "warning" })] });
    expect(await row()).toEqual({ config: next, config_version: before.config_version + 1 });
  });

  it("refuses a config with errors and a stale version, storing nothing", async () => {
    const before = await row();
    const broken = demoConfig() as unknown as { rig: { channels: { pixels: number }[] } };
    broken.rig.channels[0].pixels = 0;
    const invalid = await storeCheckedConfigIn(db, ws, id, broken, before.config_version);
    expect(invalid).toMatchObject({ kind: "invalid", message: "The config has 1 error; nothing was stored." });
    expect(invalid.kind === "invalid" && invalid.diagnostics[0]).toMatchObject({ code: "out-of-range", path: "rig.channels[0].pixels" });
    // A semantic error (a pin the board does not have) is refused the same way.
    const badPin = demoConfig();
    badPin.rig.channels[0].pin = 99;
    expect(await storeCheckedConfigIn(db, ws, id, badPin, before.config_version)).toMatchObject({ kind: "invalid" });
    const stale = await storeCheckedConfigIn(db, ws, id, demoConfig(), before.config_version - 1);
    expect(stale).toEqual({ kind: "stale", message: expect.stringContaining(`now version ${before.config_version}`), currentVersion: before.config_version });
    expect(await row()).toEqual(before);
  });

  it("does not touch another workshop's build", async () => {
    const before = await row();
    const other = "00000000-0000-4000-8000-000000000000";
    expect(await storeCheckedConfigIn(db, other, id, demoConfig(), before.config_version)).toMatchObject({ kind: "stale", currentVersion: null });
    expect(await row()).toEqual(before);
  });
});
