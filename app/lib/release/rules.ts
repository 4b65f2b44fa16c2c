// The release's rules that need no database: what a revision's bench check looks like with its
// ticks, and why a revision cannot be released yet.
import type { BenchGroup, BenchItem } from "./checklist";

export type Tick = { by: string | null; at: string };
export type CheckedItem = BenchItem & { tick: Tick | null };
export type BenchCheck = {
  revision: number;
  groups: (Omit<BenchGroup, "items"> & { items: CheckedItem[] })[];
  ticked: number;
  total: number;
};

/** Why revision `n` cannot be released yet (not approved, items unticked), or null. Bundle errors are checked apart. */
export function releaseBlocker(approved: boolean, check: BenchCheck): { status: number; message: string } | null {
  if (!approved) return { status: 409, message: `Revision ${check.revision} is not approved: ask for a review on the Reviews tab, and release it once a reviewer approves it.` };
  const open = check.groups.flatMap((g) => g.items).filter((i) => !i.tick);
  if (open.length) {
    const first = open.slice(0, 3).map((i) => `"${i.label}"`).join(", ");
    return {
      status: 409,
      message: `${open.length} of ${check.total} bench-check item${check.total === 1 ? "" : "s"} ${open.length === 1 ? "is" : "are"} not ticked yet (${first}${open.length > 3 ? ", …" : ""}); tick every item on the bench first.`,
    };
  }
  return null;
}

