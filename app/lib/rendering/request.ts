// The body of POST /api/render: a config or a build, and the template to render it with. The
// route parses with these and the API document shows them (app/lib/api-doc).
import { z } from "zod";
import { INT4_MAX } from "../input/edges";

export const templateRefSchema = z
  .union([
    z.object({ id: z.string().min(1), version: z.number().int().min(1).max(INT4_MAX).optional() }).strict().meta({ description: "A workshop template (its newest version unless one is named) or a built-in by name." }),
    z.object({ source: z.string() }).strict().meta({ description: "Template source posted with the request." }),
    z.object({ builtin: z.string() }).strict().meta({ description: "A built-in template at its current version, e.g. generic-header." }),
  ])
  .meta({ id: "TemplateRef" });

export const renderBodySchema = z.union([
  z.object({ config: z.unknown().meta({ description: "A hiltbench.config/2 (or /1) document." }), buildId: z.undefined().optional(), template: z.unknown() }),
  z.object({ buildId: z.string().meta({ description: "Render this build's current config." }), config: z.undefined().optional(), template: z.unknown() }),
]);

/** What the API document shows for the body: exactly one of config and buildId, and a template reference. */
export const renderBodyDoc = z.union([
  z.object({ config: z.unknown().meta({ description: "A hiltbench.config/2 (or /1) document." }), template: templateRefSchema }),
  z.object({ buildId: z.string().meta({ description: "Render this build's current config." }), template: templateRefSchema }),
]);
