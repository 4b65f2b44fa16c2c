// `npm run api-token -- <email-or-login>`: print a fresh personal API token for a user of the
// development database (the one `npm start` keeps), as the last line of output.
import { sql } from "kysely";
import { connect } from "../app/lib/db/connect";
import { createToken } from "../app/lib/repo/tokens.server";
import { devDatabaseUrl } from "./lib/services.mjs";

const who = process.argv[2];
if (!who) {
  console.error("usage: npm run api-token -- <email-or-github-login>");
  process.exit(2);
}
const db = connect(devDatabaseUrl(), 1);
try {
  const user = await db
    .selectFrom("users")
    .select(["id", "display_name"])
    .where((eb) => eb.or([eb(sql`lower(email)`, "=", who.toLowerCase()), eb(sql`lower(github_login)`, "=", who.toLowerCase())]))
    .executeTakeFirst();
  if (!user) {
    console.error(`No user with e-mail or GitHub login '${who}'. Is \`npm start\` running (or DATABASE_URL set)?`);
    process.exitCode = 1;
  } else {
    const t = await createToken(db, user.id, `cli ${new Date().toISOString().slice(0, 10)}`);
    console.log(`token for ${user.display_name}:`);
    console.log(t.token);
  }
} finally {
  await db.destroy();
}
