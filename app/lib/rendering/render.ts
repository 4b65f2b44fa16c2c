// Compile and render in one call with the workshop's templates as partials — shared by the
// server (Render view, API) and the browser (template editor preview). Pure: no clock, no I/O.
import type { Config } from "../config/schema";
import { builtinPartials, compileTemplate, renderTemplate, type Limits, type RenderMeta, type TemplateError } from "../template";

/** The partial resolver: the workshop's templates (latest versions) first, then the built-ins. */
export function partialsFrom(sources: Record<string, string>): (name: string) => string | undefined {
  return (name) => (Object.hasOwn(sources, name) ? sources[name] : builtinPartials(name));
}

export type RenderOutcome =
  | { ok: true; output: string; warnings: TemplateError[]; target: "c" | "text" }
  | { ok: false; errors: TemplateError[]; warnings: TemplateError[] };

export function compileAndRender(source: string, config: Config, meta: RenderMeta, opts: { partials?: Record<string, string>; limits?: Partial<Limits>; cache?: boolean } = {}): RenderOutcome {
  const compiled = compileTemplate(source, { partials: partialsFrom(opts.partials ?? {}), limits: opts.limits, cache: opts.cache });
  if (!compiled.ok) return { ok: false, errors: compiled.errors.filter((e) => e.severity === "error"), warnings: compiled.errors.filter((e) => e.severity === "warning") };
  const r = renderTemplate(compiled.template, config, meta);
  if (!r.ok) return { ok: false, errors: r.errors, warnings: compiled.warnings };
  return { ok: true, output: r.output, warnings: compiled.warnings, target: compiled.template.target };
}

/**
 * A render stopped from outside the library (its worker terminated past the time limit, or out
 * of memory): one render error at 1:1, since where the template was is not known.
 */
export function stoppedRender(message: string): Extract<RenderOutcome, { ok: false }> {
  return { ok: false, errors: [{ stage: "render", severity: "error", message, line: 1, column: 1, from: 0, to: 0 }], warnings: [] };
}

/**
 * Render metadata for a build: savedAt is when its config was last saved (`config_saved_at`),
 * never the clock and never `updated_at` (which a rename or a status change also moves), so the
 * same config and template version always render the same bytes.
 */
export function metaForBuild(
  b: { name: string; client_name?: string | null; config_saved_at: Date | string; config_version?: number },
  template: { name: string; version: number },
): RenderMeta {
  const at = b.config_saved_at instanceof Date ? b.config_saved_at : new Date(b.config_saved_at);
  return {
    buildName: b.name,
    ...(b.client_name ? { clientName: b.client_name } : {}),
    savedAt: at.toISOString(),
    ...(b.config_version !== undefined ? { revision: b.config_version } : {}),
    templateName: template.name,
    templateVersion: template.version,
  };
}

/** A plain ASCII file name: build and template names reduced to letters, digits and dashes. */
export function downloadName(build: string, template: string, target: "c" | "text"): string {
  const slug = (s: string) => s.toLowerCase().replace(/[^a-z0-9]+/g, "-").replace(/^-|-$/g, "") || "build";
  const ext = target === "c" ? "h" : template === "config-json" ? "json" : "txt";
  return `${slug(build)}-${slug(template)}.${ext}`;
}

