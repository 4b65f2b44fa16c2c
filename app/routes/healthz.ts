// Liveness for the start and test scripts (and a load balancer): the database answers. While it
// does not, 503 with what is down, so a balancer takes this server out until it recovers.
import { databaseAnswers } from "~/lib/db/db.server";
import { RETRY_AFTER_SECONDS } from "~/lib/db/outage.server";
import { json } from "~/lib/web/http.server";

export async function loader() {
  try {
    await databaseAnswers();
  } catch {
    return json(
      { status: "unavailable", database: "down", message: "The app server is running but cannot reach PostgreSQL." },
      { status: 503, headers: { "Retry-After": String(RETRY_AFTER_SECONDS) } },
    );
  }
  return new Response("ok", { headers: { "Content-Type": "text/plain" } });
}
