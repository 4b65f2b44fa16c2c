// `tsx db/setup.ts [--seed]`: create the database named in DATABASE_URL if it is missing,
// migrate it to the latest schema, and optionally seed the demo workshop.
import pg from "pg";
import { connect } from "../app/lib/db/connect";
import { storage } from "../app/lib/storage/settings.server";
import { migrateToLatest } from "./migrate";
import { seed } from "./seed";
import { seedDemoFonts } from "./seed-fonts";

export async function ensureDatabase(url: string) {
  const target = new URL(url);
  const name = decodeURIComponent(target.pathname.slice(1));
  const admin = new URL(url);
  admin.pathname = "/postgres";
  const client = new pg.Client({ connectionString: admin.toString() });
  await client.connect();
  try {
    const r = await client.query("SELECT 1 FROM pg_database WHERE datname = $1", [name]);
    if (r.rowCount === 0) await client.query(`CREATE DATABASE "${name.replace(/"/g, '""')}"`);
  } finally {
    await client.end();
  }
}

async function main() {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error("DATABASE_URL is not set");
  await ensureDatabase(url);
  const db = connect(url, 2);
  try {
    const applied = await migrateToLatest(db);
    if (applied.length) console.log(`migrated: ${applied.join(", ")}`);
    if (process.argv.includes("--seed")) {
      const { workshopId } = await seed(db);
      const fonts = await seedDemoFonts(db, workshopId, storage());
      console.log(`seeded the demo workshop (Ember & Anvil Props)${fonts ? `, with ${fonts} synthesized font${fonts === 1 ? "" : "s"}` : ""}`);
    }
  } finally {
    await db.destroy();
  }
}

await main();
