// Liveness for the start and test scripts (and a load balancer): the database answers.
import { databaseAnswers } from "~/lib/db/db.server";

export async function loader() {
  await databaseAnswers();
  return new Response("ok", { headers: { "Content-Type": "text/plain" } });
}
