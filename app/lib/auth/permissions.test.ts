import { describe, expect, it } from "vitest";
import { can, PERMISSIONS } from "./permissions";

describe("role table", () => {
  it("gives the owner everything and the client only viewing and the API", () => {
    for (const p of PERMISSIONS) expect(can("owner", p)).toBe(true);
    expect(PERMISSIONS.filter((p) => can("client", p))).toEqual(["view:builds", "use:api"]);
  });
  it("lets builders edit builds but not manage members; reviewers edit nothing", () => {
    expect(can("builder", "edit:build")).toBe(true);
    expect(can("builder", "manage:members")).toBe(false);
    expect(PERMISSIONS.filter((p) => can("reviewer", p) && /edit|create|archive|manage/.test(p))).toEqual([]);
  });
});
