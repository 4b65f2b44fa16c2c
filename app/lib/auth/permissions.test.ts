import { describe, expect, it } from "vitest";
import { can, isRenderViewAction, PERMISSIONS, RENDER_VIEW_ACTIONS } from "./permissions";

describe("role table", () => {
  it("gives the owner everything and the client only viewing and the API", () => {
    for (const p of PERMISSIONS) expect(can("owner", p)).toBe(true);
    expect(PERMISSIONS.filter((p) => can("client", p))).toEqual(["view:builds", "use:api"]);
  });
  it("lets builders edit builds but not manage members; reviewers edit nothing", () => {
    expect(can("builder", "edit:build")).toBe(true);
    expect(can("builder", "manage:members")).toBe(false);
    expect(PERMISSIONS.filter((p) => can("reviewer", p) && /edit|create|archive|manage|upload/.test(p))).toEqual([]);
  });
  it("lets owners and builders upload fonts, never reviewers or clients", () => {
    expect((["owner", "builder", "reviewer", "client"] as const).filter((r) => can(r, "upload:font"))).toEqual(["owner", "builder"]);
  });
  it("lets anyone who sees a build read a header back on its Render view, and only editors apply or pin", () => {
    expect((["owner", "builder", "reviewer", "client"] as const).filter((r) => can(r, RENDER_VIEW_ACTIONS.read))).toEqual(["owner", "builder", "reviewer", "client"]);
    for (const a of ["apply", "pin"] as const) expect((["owner", "builder", "reviewer", "client"] as const).filter((r) => can(r, RENDER_VIEW_ACTIONS[a]))).toEqual(["owner", "builder"]);
    expect(isRenderViewAction("pin")).toBe(true);
    expect(isRenderViewAction("toString")).toBe(false);
    expect(isRenderViewAction(null)).toBe(false);
  });
});
