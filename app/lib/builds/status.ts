// Which build status changes a person may make by hand on the overview. In review and approved
// follow the reviews (app/lib/review/) and released follows a release (app/lib/release/), so the
// overview's save refuses them.
import type { BuildStatus } from "../db/types";

/**
 * "In review" and "approved" follow the reviews, "released" a release from the Release tab;
 * never a hand edit. Null when the change is allowed.
 */
export function manualStatusError(from: BuildStatus, to: BuildStatus): string | null {
  if (from === to) return null;
  if (to === "in-review") return "A build goes into review when someone asks for a review on the Reviews tab.";
  if (to === "approved") return "A build is approved by its reviewers' verdicts on the Reviews tab, not by hand.";
  if (to === "released") return "A build is released from its Release tab, after the bench check.";
  return null;
}
