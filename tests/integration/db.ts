// Each integration test file gets its own database, copied from the migrated template that
// `npm test` prepares (CREATE DATABASE ... TEMPLATE is about 0.1 s), and drops it afterwards.
import { randomBytes } from "node:crypto";
import pg from "pg";
import { afterAll } from "vitest";
import { connect } from "~/lib/db/connect";

const base = process.env.TEST_DATABASE_BASE;
const template = process.env.TEST_TEMPLATE_DB ?? "hb_template";

export const hasDatabase = Boolean(base);

export async function freshDb() {
  return (await freshDatabase()).db;
}

/** Like freshDb, with the database's URL too; `empty` copies template0 (no schema) instead. */
export async function freshDatabase({ empty = false } = {}) {
  if (!base) throw new Error("TEST_DATABASE_BASE is not set: run integration tests through `npm test`.");
  const name = `t_${randomBytes(6).toString("hex")}`;
  const admin = new pg.Client({ connectionString: `${base}/postgres` });
  await admin.connect();
  await admin.query(`CREATE DATABASE ${name} TEMPLATE ${empty ? "template0" : template}`);
  await admin.end();
  const url = `${base}/${name}`;
  const db = connect(url, 4);
  afterAll(async () => {
    await db.destroy();
    const a = new pg.Client({ connectionString: `${base}/postgres` });
    await a.connect();
    await a.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
    await a.end();
  });
  return { db, url };
}

/**
 * A fresh database and the environment the app's routes and services read, as the server would
 * have it (settings are read from process.env). `more` adds or overrides settings (e.g. HB_DATA_DIR).
 */
export async function freshAppDatabase(more: Record<string, string> = {}) {
  const fresh = await freshDatabase();
  Object.assign(process.env, {
    DATABASE_URL: fresh.url,
    SESSION_SECRET: "integration-test-secret-0123456789",
    APP_URL: "http://127.0.0.1:9",
    AUTH_PROVIDER: "fake-github",
    FAKE_GITHUB_URL: "http://127.0.0.1:9",
    SMTP_URL: "smtp://127.0.0.1:9",
    ...more,
  });
  return fresh;
}
