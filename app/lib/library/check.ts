// Checking a body before it is published: its own shape (zod), then the validator on the
// stand-in rig. Diagnostics are data, with paths into the stand-in config ("presets[0].looks.main-blade…").
import { hasErrors, type Diagnostic } from "../checks/diagnostics";
import { validateConfig } from "../checks/validate";
import { structureDiagnostics } from "../checks/structure";
import { fillLayerIds } from "../config/layer-ids";
import { presetBodySchema, type PresetBody } from "./format";
import { standInConfig } from "./standin";

export type BodyCheck = { body: PresetBody | null; diagnostics: Diagnostic[]; counts: { errors: number; warnings: number } };

export function checkBody(input: unknown): BodyCheck {
  const parsed = presetBodySchema.safeParse(input);
  if (!parsed.success) {
    const diagnostics = structureDiagnostics(parsed.error.issues, input);
    return { body: null, diagnostics, counts: { errors: diagnostics.filter((d) => d.severity === "error").length, warnings: 0 } };
  }
  const body = parsed.data;
  const { diagnostics } = validateConfig(fillLayerIds(standInConfig(body)));
  const errors = diagnostics.filter((d) => d.severity === "error").length;
  return { body: hasErrors(diagnostics) ? null : body, diagnostics, counts: { errors, warnings: diagnostics.filter((d) => d.severity === "warning").length } };
}
