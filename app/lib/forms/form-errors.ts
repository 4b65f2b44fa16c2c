// Zod issues turned into one message per form field, in words a person understands; every
// form action returns these beside a 400.
import type { z } from "zod";

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
