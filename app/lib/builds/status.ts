// Which build status changes a person may make by hand on the overview. In review and approved
// follow the reviews (app/lib/review/), so the overview's save refuses them.
import type { BuildStatus } from "../db/types";

/**
 * "In review" and "approved" follow the reviews, never a hand edit; "released" only follows
 * "approved" (release itself is another feature). Null when the change is allowed.
 */
export function manualStatusError(from: BuildStatus, to: BuildStatus): string | null {
  if (from === to) return null;
  if (to === "in-review") return "A build goes into review when someone asks for a review on the Reviews tab.";
  if (to === "approved") return "A build is approved by its reviewers' verdicts on the Reviews tab, not by hand.";
  if (to === "released" && from !== "approved") return "Only an approved build can be released.";
  return null;
}
