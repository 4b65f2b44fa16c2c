// Replacing a build's whole config (the API's PUT and the Checks page's import): validate first,
// store only a config without errors, and only over the version it was read at.
import type { Kysely } from "kysely";
import type { Viewer } from "../auth/auth.server";
import type { Database } from "../db/types";
import { db as appDb } from "../db/db.server";
import type { Diagnostic } from "./diagnostics";
import { powerModeFor } from "./power-mode";
import { validateConfig } from "./validate";
import { currentConfigVersion, saveConfig } from "../repo/builds.server";

export type StoreResult =
  | { kind: "saved"; version: number; diagnostics: Diagnostic[] }
  /** `errors`: the errors that refused it (all of them, unless the save named some as already known). */
  | { kind: "invalid"; message: string; diagnostics: Diagnostic[]; errors: Diagnostic[] }
  | { kind: "stale"; message: string; currentVersion: number | null };

export type StoreOptions = {
  /**
   * Errors the stored config already has (same code and path). A save that edits one part of a
   * config (the rig form) is refused only for errors it adds: a build still being configured
   * (no presets yet) keeps its rig editable. Whole-config saves pass nothing: any error refuses.
   * A function is called only when the new config has errors (validating costs up to a second).
   */
  known?: readonly Diagnostic[] | (() => readonly Diagnostic[]);
  /** The revision's author (the viewer) and optional "what changed" message. */
  author?: string | null;
  message?: string | null;
  /**
   * Error codes that do not stop this save. A font upload records a font whose files failed
   * their checks ("font-invalid"): the build is then truthfully in error, and says why.
   */
  acceptErrors?: readonly string[];
};

const sameDiagnostic = (a: Diagnostic, b: Diagnostic) => a.code === b.code && a.path === b.path;

/** The same with the database passed in (tests, transactions). */
export async function storeCheckedConfigIn(db: Kysely<Database>, workshopId: string, buildId: string, input: unknown, expectedVersion: number, opts: StoreOptions = {}): Promise<StoreResult> {
  const { config, diagnostics } = validateConfig(input, { power: powerModeFor(input) });
  let errors = diagnostics.filter((d) => d.severity === "error" && !opts.acceptErrors?.includes(d.code));
  if (errors.length > 0 && opts.known) {
    const known = typeof opts.known === "function" ? opts.known() : opts.known;
    errors = errors.filter((d) => !known.some((k) => sameDiagnostic(k, d)));
  }
  // A config without the model's shape is never stored, whatever was known before.
  if (!config && errors.length === 0) errors = diagnostics.filter((d) => d.severity === "error");
  if (!config || errors.length > 0) {
    const n = errors.length;
    return { kind: "invalid", message: `The config has ${n} error${n === 1 ? "" : "s"}; nothing was stored.`, diagnostics, errors };
  }
  const counts = { errors: diagnostics.filter((d) => d.severity === "error").length, warnings: diagnostics.filter((d) => d.severity === "warning").length };
  const version = await saveConfig(db, workshopId, buildId, config, expectedVersion, { authorId: opts.author ?? null, message: opts.message, counts });
  if (version === null) {
    const current = await currentConfigVersion(db, workshopId, buildId);
    return {
      kind: "stale",
      message: `The config was changed since version ${expectedVersion} was read${current !== null ? ` (it is now version ${current})` : ""}; nothing was stored. Read it again and reapply your change.`,
      currentVersion: current,
    };
  }
  return { kind: "saved", version, diagnostics };
}

/** Replace the build's config as this viewer's workshop; the viewer is the revision's author. */
export function storeCheckedConfig(v: Viewer, buildId: string, input: unknown, expectedVersion: number, opts: StoreOptions = {}): Promise<StoreResult> {
  return storeCheckedConfigIn(appDb(), v.workshop.id, buildId, input, expectedVersion, { ...opts, author: v.user.id });
}
