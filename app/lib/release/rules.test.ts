import { describe, expect, it } from "vitest";
import { demoConfig } from "../config/demo";
import { benchChecklist } from "./checklist";
import { releaseBlocker, type BenchCheck } from "./rules";

function checkWith(ticked: number): BenchCheck {
  let k = 0;
  const groups = benchChecklist(demoConfig()).map((g) => ({ ...g, items: g.items.map((i) => ({ ...i, tick: k++ < ticked ? { by: "Demo Builder", at: "2026-12-03T10:00:00.000Z" } : null })) }));
  const total = groups.flatMap((g) => g.items).length;
  return { revision: 4, groups, ticked: Math.min(ticked, total), total };
}

describe("what blocks a release", () => {
  it("an unapproved revision, whatever is ticked", () => {
    expect(releaseBlocker(false, checkWith(1000))?.message).toMatch(/^Revision 4 is not approved: ask for a review on the Reviews tab/);
  });

  it("unticked items: how many of how many, and the first three by label", () => {
    const c = checkWith(0);
    const b = releaseBlocker(true, c)!;
    expect(b.status).toBe(409);
    expect(b.message).toContain(`${c.total} of ${c.total} bench-check items are not ticked yet ("Select Ashfall", `);
    expect(b.message).toContain(", …); tick every item on the bench first.");
    const last = checkWith(c.total - 1);
    expect(releaseBlocker(true, last)!.message).toBe(`1 of ${c.total} bench-check items is not ticked yet ("The SD card matches the bundle: Check a card reports no differences"); tick every item on the bench first.`);
  });

  it("nothing once approved and every item is ticked", () => {
    expect(releaseBlocker(true, checkWith(1000))).toBeNull();
  });
});
