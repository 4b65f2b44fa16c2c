// The validator: the schema first, then the semantic rules over the parsed config. Diagnostics
// are data, never thrown. When the schema fails, only its diagnostics are returned, plus a note
// that the other checks wait: rules written for a well-formed config would otherwise report
// noise (a "missing" channel that is only misspelt, power for a look that did not parse).
import { engineDrawSource } from "../power/draw-source";
import { powerSummary, type PowerSummary } from "../power/estimate";
import { DiagnosticSink, sortDiagnostics, type Diagnostic } from "./diagnostics";
import { buildContext, walkLayers } from "./rules/context";
import { completenessRules } from "./rules/completeness";
import { powerLayerCheck, powerRules } from "./rules/power";
import { fontRules } from "./rules/fonts";
import { referenceRules } from "./rules/references";
import { rigLayerCheck, rigRules } from "./rules/rig";
import { timingLayerCheck } from "./rules/timing";
import { configSchema, type Config } from "../config/schema";
import { upgradeConfig } from "../config/upgrade";
import { structureDiagnostics } from "./structure";

export type { Diagnostic } from "./diagnostics";
export type { PowerSummary } from "../power/estimate";

const LAYER_CHECKS = [rigLayerCheck, timingLayerCheck, powerLayerCheck];

export type ValidationResult = { config: Config | null; diagnostics: Diagnostic[]; power: PowerSummary | null };

/**
 * power: "estimate" (default) takes LED current from a bound over the looks' colours, fast enough
 * for every keystroke; "engine" renders every frame of the demonstration sequence (what the API
 * and the look editor show), about 85 ms for the demo config.
 */
export type ValidateOptions = { power?: "estimate" | "engine" };

export function validateConfig(raw: unknown, options: ValidateOptions = {}): ValidationResult {
  // An older form ("hiltbench.config/1") is judged, and answered, as its upgrade.
  const input = upgradeConfig(raw);
  const parsed = configSchema.safeParse(input);
  if (!parsed.success) {
    const diagnostics = structureDiagnostics(parsed.error.issues, input);
    diagnostics.push({
      severity: "info",
      code: "semantic-rules-skipped",
      path: "",
      message: "References, pins, timings and power were not checked because the config's structure is wrong.",
      hint: "Fix the errors above; the remaining checks run once the structure is right.",
    });
    return { config: null, diagnostics, power: null };
  }
  const config = parsed.data;
  const power = powerSummary(config, options.power === "engine" ? engineDrawSource() : undefined);
  const sink = new DiagnosticSink();
  const ctx = buildContext(config, power, sink);
  referenceRules(ctx);
  completenessRules(ctx);
  fontRules(ctx);
  rigRules(ctx);
  powerRules(ctx);
  // Per-layer checks share one walk over all looks.
  walkLayers(ctx, LAYER_CHECKS);
  return { config, diagnostics: sortDiagnostics(sink.list), power };
}

export function validate(input: unknown, options: ValidateOptions = {}): Diagnostic[] {
  return validateConfig(input, options).diagnostics;
}
