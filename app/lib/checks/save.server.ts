// Replacing a build's whole config (the API's PUT and the Checks page's import): validate first,
// store only a config without errors, and only over the version it was read at.
import type { Kysely } from "kysely";
import type { Viewer } from "../auth/auth.server";
import type { Database } from "../db/types";
import { db as appDb } from "../db/db.server";
import { hasErrors, type Diagnostic } from "./diagnostics";
import { powerModeFor } from "./power-mode";
import { validateConfig } from "./validate";
import { saveConfig } from "../repo/builds.server";

export type StoreResult =
  | { kind: "saved"; version: number; diagnostics: Diagnostic[] }
  | { kind: "invalid"; message: string; diagnostics: Diagnostic[] }
  | { kind: "stale"; message: string; currentVersion: number | null };

/** The same with the database passed in (tests, transactions). */
export async function storeCheckedConfigIn(db: Kysely<Database>, workshopId: string, buildId: string, input: unknown, expectedVersion: number): Promise<StoreResult> {
  const { config, diagnostics } = validateConfig(input, { power: powerModeFor(input) });
  if (!config || hasErrors(diagnostics)) {
    const n = diagnostics.filter((d) => d.severity === "error").length;
    return { kind: "invalid", message: `The config has ${n} error${n === 1 ? "" : "s"}; nothing was stored.`, diagnostics };
  }
  const version = await saveConfig(db, workshopId, buildId, config, expectedVersion);
  if (version === null) {
    const row = await db.selectFrom("builds").select("config_version").where("id", "=", buildId).where("workshop_id", "=", workshopId).executeTakeFirst();
    const current = row?.config_version ?? null;
    return {
      kind: "stale",
      message: `The config was changed since version ${expectedVersion} was read${current !== null ? ` (it is now version ${current})` : ""}; nothing was stored. Read it again and reapply your change.`,
      currentVersion: current,
    };
  }
  return { kind: "saved", version, diagnostics };
}

/** Replace the build's config as this viewer's workshop. */
export function storeCheckedConfig(v: Viewer, buildId: string, input: unknown, expectedVersion: number): Promise<StoreResult> {
  return storeCheckedConfigIn(appDb(), v.workshop.id, buildId, input, expectedVersion);
}
