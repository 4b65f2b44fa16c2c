// `npm run backup` / `npm run restore`: a backup of a seeded workshop (and its stored files),
// restored into a fresh empty database, holds every table row for row.
import { mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { sql } from "kysely";
import pg from "pg";
import { afterAll, describe, expect, it } from "vitest";
import { backup, restore, unpack } from "../../scripts/backup/archive";
import { createToken } from "~/lib/repo/tokens.server";
import { seed } from "../../db/seed";
import { freshDatabase, hasDatabase } from "./db";

const work = mkdtempSync(path.join(tmpdir(), "hb-backup-test-"));
afterAll(() => rmSync(work, { recursive: true, force: true }));

/** Every table in public, each as its rows' text forms in a stable order. */
async function snapshot(url: string) {
  const c = new pg.Client({ connectionString: url });
  await c.connect();
  try {
    const tables = (await c.query("SELECT tablename FROM pg_tables WHERE schemaname = 'public' ORDER BY tablename")).rows.map((r) => r.tablename as string);
    const out: Record<string, string[]> = {};
    for (const t of tables) out[t] = (await c.query(`SELECT x::text AS row FROM "${t}" x ORDER BY 1`)).rows.map((r) => r.row as string);
    const columns = (
      await c.query("SELECT table_name, column_name, data_type, is_nullable, column_default FROM information_schema.columns WHERE table_schema = 'public' ORDER BY 1, 2")
    ).rows;
    return { tables, rows: out, columns };
  } finally {
    await c.end();
  }
}

function tree(dir: string): Record<string, string> {
  const out: Record<string, string> = {};
  const walk = (d: string) => {
    for (const e of readdirSync(d, { withFileTypes: true })) {
      const p = path.join(d, e.name);
      if (e.isDirectory()) walk(p);
      else out[path.relative(dir, p)] = readFileSync(p).toString("base64");
    }
  };
  walk(dir);
  return out;
}

describe.skipIf(!hasDatabase)("backup and restore", () => {
  it("restores a seeded workshop and its stored files into a fresh database, every table row for row", async () => {
    const source = await freshDatabase();
    await seed(source.db);
    const owner = await source.db.selectFrom("users").select("id").where("github_login", "=", "demo-owner").executeTakeFirstOrThrow();
    await createToken(source.db, owner.id, "backup test");
    const ws = await source.db.selectFrom("workshops").select("id").executeTakeFirstOrThrow();
    const tpl = await source.db.insertInto("templates").values({ workshop_id: ws.id, name: "Kestrel header", created_by: owner.id }).returning("id").executeTakeFirstOrThrow();
    await source.db
      .insertInto("template_versions")
      .values([
        { template_id: tpl.id, version: 1, source: "// v1\n", created_by: owner.id, uses: JSON.stringify({}) },
        { template_id: tpl.id, version: 2, source: "// v2 with a\ttab\n", created_by: owner.id, uses: null },
      ])
      .execute();
    await source.db.insertInto("invitations").values({ workshop_id: ws.id, github_login: "new-hand", email: null, role: "builder", invited_by: owner.id, accepted_at: null }).execute();
    await sql`INSERT INTO rate_limits (key, points, expire) VALUES ('api-token:abc', 3, ${Date.now() + 60_000})`.execute(source.db);
    await source.db.insertInto("sessions").values({ id: "s1", data: JSON.stringify({ userId: owner.id }), expires_at: new Date(Date.now() + 3600_000) }).execute();
    // Text that is awkward to carry: quotes, backslashes, tabs, newlines and non-Latin script.
    await source.db.updateTable("builds").set({ hilt_notes: "Line one\n\tTab 'quote' \"double\" back\\slash — Ünïcødé 鷹" }).execute();

    const filesDir = path.join(work, "files");
    mkdirSync(path.join(filesDir, "fonts", "ab"), { recursive: true });
    writeFileSync(path.join(filesDir, "fonts", "ab", "abcdef.wav"), Buffer.from([0, 1, 2, 255, 254]));
    writeFileSync(path.join(filesDir, "index.json"), "{}");

    const file = backup({ databaseUrl: source.url, outDir: path.join(work, "backups"), filesDir });
    expect(path.basename(file)).toMatch(/^hiltbench-.*\.tar$/);
    expect(unpack(file).manifest).toMatchObject({ format: "hiltbench-backup/1", files: true });

    const target = await freshDatabase({ empty: true });
    const restoredFiles = path.join(work, "restored-files");
    mkdirSync(restoredFiles);
    writeFileSync(path.join(restoredFiles, "stale.txt"), "from before the restore");
    restore({ databaseUrl: target.url, file, filesDir: restoredFiles });

    const before = await snapshot(source.url);
    const after = await snapshot(target.url);
    expect(before.tables).toContain("builds");
    expect(before.tables).toContain("kysely_migration");
    // Tables this test fills (the seed and the inserts above); tables added later (fonts, mail,
    // rate limits) may be empty here but are still compared row for row below.
    for (const t of ["workshops", "users", "memberships", "invitations", "builds", "sessions", "templates", "template_versions", "config_revisions", "kysely_migration"])
      expect(before.rows[t]?.length ?? 0, `${t} has rows to compare`).toBeGreaterThan(0);
    expect(after.tables).toEqual(before.tables);
    expect(after.columns).toEqual(before.columns);
    for (const t of before.tables) expect(after.rows[t], t).toEqual(before.rows[t]);
    expect(tree(restoredFiles)).toEqual(tree(filesDir));
  });

  it("restoring over a database that has data replaces it, triggers included", async () => {
    const a = await freshDatabase();
    await seed(a.db);
    const file = backup({ databaseUrl: a.url, outDir: path.join(work, "backups-2") });
    expect(unpack(file).manifest.files).toBe(false);
    const b = await freshDatabase();
    await seed(b.db);
    await b.db.updateTable("builds").set({ name: "Changed after the backup" }).execute();
    restore({ databaseUrl: b.url, file });
    expect((await snapshot(b.url)).rows).toEqual((await snapshot(a.url)).rows);
    // The restored schema still refuses to rewrite a saved template version (its trigger came back).
    const c = new pg.Client({ connectionString: b.url });
    await c.connect();
    const triggers = await c.query("SELECT tgname FROM pg_trigger WHERE NOT tgisinternal ORDER BY 1");
    await c.end();
    expect(triggers.rows.map((r) => r.tgname)).toEqual(expect.arrayContaining(["config_revisions_immutable", "template_versions_immutable", "template_versions_no_lone_delete"]));
  });

  it("refuses a file that is not a backup, and changes nothing", async () => {
    const bogus = path.join(work, "bogus.tar");
    writeFileSync(path.join(work, "evil.txt"), "x");
    const { spawnSync } = await import("node:child_process");
    spawnSync("tar", ["-cf", bogus, "-C", work, "evil.txt"]);
    const t = await freshDatabase();
    expect(() => restore({ databaseUrl: t.url, file: bogus })).toThrow(/not a Hiltbench backup/);
    expect((await snapshot(t.url)).tables).toContain("builds");
  });
});
