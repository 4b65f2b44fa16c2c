// Older forms of the config JSON, brought to the current one wherever a config is read: the
// validator (so every import, API body and checked save), the repository's reads of stored
// configs and revisions, and the header read-back. Pure and deterministic: the same old
// document always upgrades to the same new one, so renders of an old build stay stable.
//
// "hiltbench.config/1" → "/2": layers gained an `id`. Each layer without one gets the derived
// id of `derivedLayerId` (preset id, channel id, position); nothing else changes.
import { fillLayerIds } from "./layer-ids";
import { CONFIG_FORMAT, CONFIG_FORMAT_V1, type Config } from "./schema";

const isObj = (v: unknown): v is Record<string, unknown> => typeof v === "object" && v !== null && !Array.isArray(v);

/** True for a document in an older form that `upgradeConfig` brings up to date. */
export function isOldForm(input: unknown): boolean {
  return isObj(input) && input.format === CONFIG_FORMAT_V1;
}

/**
 * The document in the current form. An older form is upgraded in a copy; anything else
 * (the current form, an unknown format, not an object) comes back as it is, for the validator
 * to judge. Idempotent.
 */
export function upgradeConfig(input: unknown): unknown {
  if (!isOldForm(input)) return input;
  const doc = input as Record<string, unknown>;
  // format keeps its place as the first key.
  return fillLayerIds({ ...doc, format: CONFIG_FORMAT });
}

/** A stored config (a row's jsonb, typed by the repo as the current form) in the current form. */
export function upgradeStored(config: Config): Config {
  return upgradeConfig(config) as Config;
}
