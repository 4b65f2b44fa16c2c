// Form and query parsing for builds, shared by pages and API: zod at the edge, field errors
// back to the form, never a 500 for bad input.
import { z } from "zod";
import { BUILD_STATUSES } from "./db/types";

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

export type FieldErrors = Record<string, string>;

/** A zod issue in words a person understands (custom messages pass through unchanged). */
export function issueText(issue: z.core.$ZodIssue): string {
  switch (issue.code) {
    case "too_small":
      return issue.origin === "array" ? `needs at least ${issue.minimum}` : issue.origin === "string" ? "must not be empty" : `must be at least ${issue.minimum}`;
    case "too_big":
      return issue.origin === "array" ? `allows at most ${issue.maximum}` : issue.origin === "string" ? `must be at most ${issue.maximum} characters` : `must be at most ${issue.maximum}`;
    case "invalid_type":
      return issue.expected === "number" ? "enter a number" : issue.expected === "int" ? "enter a whole number" : `expected ${issue.expected}`;
    case "invalid_value":
      return `choose one of: ${issue.values.map(String).join(", ")}`;
    default:
      return issue.message;
  }
}

export function fieldErrors(error: z.ZodError): FieldErrors {
  const out: FieldErrors = {};
  for (const issue of error.issues) {
    const key = issue.path.map(String).join(".") || "form";
    out[key] ??= issue.message && !issue.message.startsWith("Invalid") && !issue.message.startsWith("Too") ? issue.message : issueText(issue);
  }
  return out;
}
