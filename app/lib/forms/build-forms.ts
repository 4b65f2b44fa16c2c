// Form and query parsing for builds, shared by pages and API: zod at the edge, field errors
// back to the form, never a 500 for bad input.
import { z } from "zod";
import { BUILD_STATUSES } from "../db/types";

export const STATUS_LABELS: Record<(typeof BUILD_STATUSES)[number], string> = {
  intake: "Intake",
  configuring: "Configuring",
  "in-review": "In review",
  approved: "Approved",
  released: "Released",
};

export const buildQuerySchema = z.object({
  q: z.string().trim().max(100).optional().catch(undefined),
  status: z.enum(BUILD_STATUSES).optional().catch(undefined),
  archived: z.enum(["1"]).optional().catch(undefined).transform((v) => v === "1"),
  sort: z.enum(["name", "client", "status", "updated", "created"]).catch("updated"),
  dir: z.enum(["asc", "desc"]).catch("desc"),
  page: z.coerce.number().int().min(1).max(100000).catch(1),
  perPage: z.coerce.number().int().min(5).max(100).catch(25),
});

export function parseBuildQuery(url: URL) {
  return buildQuerySchema.parse(Object.fromEntries(url.searchParams));
}

export const buildMetaSchema = z.object({
  name: z.string().trim().min(1, "Give the build a name.").max(80, "Keep the name under 80 characters."),
  clientName: z.string().trim().max(120, "Keep the client name under 120 characters.").default(""),
  clientUserId: z
    .string()
    .trim()
    .transform((v) => (v === "" ? null : v))
    .nullable()
    .default(null),
  hiltNotes: z.string().max(4000, "Keep hilt notes under 4,000 characters.").default(""),
  status: z.enum(BUILD_STATUSES, { message: "Choose a status from the list." }),
});
