// What GET /api/builds/:buildId/bundle reads from its query; the route parses with it and the
// API document shows it (app/lib/api-doc).
import { z } from "zod";

export const bundleQuerySchema = z.object({
  template: z.string().min(1).max(100).optional().meta({ description: "A template id or built-in name; the build's pinned template when absent." }),
  names: z.enum(["long", "8.3"]).default("long").meta({ description: "Long FAT32 names, or 8.3 names for boards that read only those." }),
  card: z.coerce.number().positive().max(2048).default(32).meta({ description: "The card's size in GB; a bundle that does not fit is refused." }),
  check: z.enum(["1"]).optional().meta({ description: "1: answer the plan (files, sizes, SHA-256, findings) as JSON instead of the zip." }),
});
