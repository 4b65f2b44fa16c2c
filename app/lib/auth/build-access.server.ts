// One place that decides which build a viewer may open: their workshop's, and for a client
// only their own. Anything else is "not found", so ids of other workshops leak nothing.
import type { Viewer } from "./auth.server";
import { db } from "../db/db.server";
import { fail } from "../web/http.server";
import { seesOnlyOwnBuilds } from "./permissions";
import { getBuild } from "../repo/builds.server";

export function scopeFor(v: Viewer) {
  return { workshopId: v.workshop.id, clientUserId: seesOnlyOwnBuilds(v.role) ? v.user.id : undefined };
}

export async function loadBuildFor(v: Viewer, buildId: string) {
  const build = await getBuild(db(), scopeFor(v), buildId);
  if (!build) fail(404, "No build with this id in your workshop.");
  return build;
}
