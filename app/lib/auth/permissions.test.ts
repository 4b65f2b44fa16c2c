import { describe, expect, it } from "vitest";
import { can, isRenderViewAction, mayGiveVerdict, PERMISSIONS, RENDER_VIEW_ACTIONS } from "./permissions";

describe("role table", () => {
  it("gives the owner everything and the client only viewing, the API, their handoff and their own requests", () => {
    for (const p of PERMISSIONS) expect(can("owner", p)).toBe(true);
    expect(PERMISSIONS.filter((p) => can("client", p))).toEqual(["view:builds", "use:api", "view:requests", "ask:request", "view:handoff"]);
  });
  it("clients and the workshop ask; only owners and builders answer; reviewers read", () => {
    const roles = ["owner", "builder", "reviewer", "client"] as const;
    expect(roles.filter((r) => can(r, "ask:request"))).toEqual(["owner", "builder", "client"]);
    expect(roles.filter((r) => can(r, "answer:request"))).toEqual(["owner", "builder"]);
    expect(roles.filter((r) => can(r, "view:requests"))).toEqual(["owner", "builder", "reviewer", "client"]);
  });
  it("sends clients to their handoff: no build list, no bundles of their own choosing; everyone may open a handoff sheet", () => {
    const roles = ["owner", "builder", "reviewer", "client"] as const;
    expect(roles.filter((r) => can(r, "view:build-list"))).toEqual(["owner", "builder", "reviewer"]);
    expect(roles.filter((r) => can(r, "make:bundle"))).toEqual(["owner", "builder", "reviewer"]);
    expect(roles.filter((r) => can(r, "view:handoff"))).toEqual([...roles]);
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

describe("reviews", () => {
  it("reviewers comment and give verdicts but edit nothing; builders ask and resolve but give no verdict; clients see no reviews", () => {
    expect(can("reviewer", "comment:review") && can("reviewer", "give:verdict")).toBe(true);
    expect(can("reviewer", "edit:build")).toBe(false);
    expect(can("builder", "request:review") && can("builder", "resolve:comment")).toBe(true);
    expect(can("builder", "give:verdict")).toBe(false);
    expect(PERMISSIONS.filter((p) => can("client", p) && p.includes("review"))).toEqual([]);
  });
  it("nobody gives a verdict on a revision they saved or a review they asked for", () => {
    expect(mayGiveVerdict("reviewer", "r", { authorId: "b", requestedBy: "b" })).toBe(true);
    expect(mayGiveVerdict("owner", "o", { authorId: "o", requestedBy: "b" })).toBe(false);
    expect(mayGiveVerdict("owner", "o", { authorId: "b", requestedBy: "o" })).toBe(false);
    expect(mayGiveVerdict("builder", "x", { authorId: "b", requestedBy: "b" })).toBe(false);
    expect(mayGiveVerdict("client", "x", { authorId: null, requestedBy: null })).toBe(false);
  });
  it("lets owners and builders tick the bench check and release; reviewers only look; clients get nothing there", () => {
    const roles = ["owner", "builder", "reviewer", "client"] as const;
    for (const p of ["check:bench", "release:build"] as const) expect(roles.filter((r) => can(r, p))).toEqual(["owner", "builder"]);
    expect(roles.filter((r) => can(r, "view:release"))).toEqual(["owner", "builder", "reviewer"]);
  });
});
