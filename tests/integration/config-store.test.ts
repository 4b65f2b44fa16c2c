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

  it("refuses a partial edit (the rig form) only for errors it adds, never for ones the config already had", async () => {
    const { validateConfig } = await import("~/lib/checks/validate");
    const before = await row();
    // A config still being put together: no presets yet, which is an error of its own.
    const unfinished = { ...demoConfig(), presets: [] };
    const known = validateConfig(unfinished).diagnostics;
    expect(known.some((d) => d.code === "no-presets" && d.severity === "error")).toBe(true);
    const worse = structuredClone(unfinished);
    worse.rig.channels[0].pin = 99;
    const refused = await storeCheckedConfigIn(db, ws, id, worse, before.config_version, { known });
    expect(refused).toMatchObject({ kind: "invalid", message: "The config has 1 error; nothing was stored.", errors: [expect.objectContaining({ code: "unknown-data-pin", path: "rig.channels[0].pin" })] });
    expect(await row()).toEqual(before);
    // Without `known` (a whole-config save) the known error refuses too.
    expect(await storeCheckedConfigIn(db, ws, id, unfinished, before.config_version)).toMatchObject({ kind: "invalid" });
    expect(await row()).toEqual(before);
    const saved = await storeCheckedConfigIn(db, ws, id, unfinished, before.config_version, { known });
    expect(saved).toMatchObject({ kind: "saved", version: before.config_version + 1 });
    // Put Kestrel back for the next test.
    await storeCheckedConfigIn(db, ws, id, before.config, before.config_version + 1);
  });

  it("does not touch another workshop's build", async () => {
    const before = await row();
    const other = "00000000-0000-4000-8000-000000000000";
    expect(await storeCheckedConfigIn(db, other, id, demoConfig(), before.config_version)).toMatchObject({ kind: "stale", currentVersion: null });
    expect(await row()).toEqual(before);
  });
});
