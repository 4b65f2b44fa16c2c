// The review rules as plain functions: what a request's state is from its reviewers' verdicts,
// which build status follows, which status changes a person may make by hand, and which model
// paths a comment may point at.
import type { BuildStatus, ReviewState, Verdict } from "../db/types";

/** Long enough for a careful note, far below what a form could carry. */
export const MAX_COMMENT_CHARS = 8000;
export const MAX_NOTE_CHARS = 2000;
/** A review form never needs more than this; bigger bodies get a 413 before parsing. */
export const MAX_REVIEW_FORM_BYTES = 64 * 1024;

/** Any "changes requested" decides; otherwise approved once every asked reviewer approved. */
export function requestStateFrom(verdicts: (Verdict | null)[]): ReviewState {
  if (verdicts.includes("changes-requested")) return "changes-requested";
  if (verdicts.length > 0 && verdicts.every((v) => v === "approved")) return "approved";
  return "open";
}

export function buildStatusFor(state: ReviewState): BuildStatus {
  return state === "open" ? "in-review" : state === "approved" ? "approved" : "configuring";
}

// The hand-set status rule lives with the builds (builds/status.ts), which apply it on the
// overview's save; builds/ must not import review/ (review/ renders through rendering/, which
// reaches builds/).
export { manualStatusError } from "../builds/status";

/**
 * A model path: dot-separated keys and array indices into the config (`presets.0.looks`).
 * Answers whether it names something that exists in this config.
 */
export function modelPathExists(config: unknown, path: string): boolean {
  if (!/^[A-Za-z0-9_-]+(\.[A-Za-z0-9_-]+)*$/.test(path) || path.length > 300) return false;
  let at: unknown = config;
  for (const key of path.split(".")) {
    if (Array.isArray(at)) {
      if (!/^\d+$/.test(key) || Number(key) >= at.length) return false;
      at = at[Number(key)];
    } else if (at !== null && typeof at === "object" && Object.hasOwn(at, key)) {
      at = (at as Record<string, unknown>)[key];
    } else return false;
  }
  return true;
}
