// Liveness for the start and test scripts (and a load balancer): the database answers.
import { sql } from "kysely";
import { db } from "~/lib/db/db.server";

export async function loader() {
  await sql`SELECT 1`.execute(db());
  return new Response("ok", { headers: { "Content-Type": "text/plain" } });
}
