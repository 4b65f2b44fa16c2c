import { describe, expect, it } from "vitest";
import { demoConfig } from "../config/demo";
import { buildStatusFor, manualStatusError, modelPathExists, requestStateFrom } from "./rules";

describe("review rules", () => {
  it("a request is approved when every reviewer approved, turned back by any request for changes", () => {
    expect(requestStateFrom([null, "approved"])).toBe("open");
    expect(requestStateFrom(["approved", "approved"])).toBe("approved");
    expect(requestStateFrom(["approved", "changes-requested"])).toBe("changes-requested");
    expect(requestStateFrom([])).toBe("open");
    expect(["open", "approved", "changes-requested"].map((s) => buildStatusFor(s as never))).toEqual(["in-review", "approved", "configuring"]);
  });

  it("in review and approved are never set by hand; released only after approval", () => {
    expect(manualStatusError("configuring", "approved")).toMatch(/reviewers/);
    expect(manualStatusError("configuring", "in-review")).toMatch(/Reviews tab/);
    expect(manualStatusError("configuring", "released")).toMatch(/Release tab, after the bench check/);
    expect(manualStatusError("approved", "released")).toMatch(/Release tab, after the bench check/);
    expect(manualStatusError("released", "released")).toBeNull();
    expect(manualStatusError("approved", "approved")).toBeNull();
    expect(manualStatusError("in-review", "configuring")).toBeNull();
  });

  it("model paths must exist in the config", () => {
    const c = demoConfig();
    expect(modelPathExists(c, "presets.0.name")).toBe(true);
    expect(modelPathExists(c, "rig.channels")).toBe(true);
    expect(modelPathExists(c, `presets.${c.presets.length}`)).toBe(false);
    expect(modelPathExists(c, "presets.x")).toBe(false);
    expect(modelPathExists(c, "nothing.here")).toBe(false);
    expect(modelPathExists(c, "presets..0")).toBe(false);
    expect(modelPathExists(c, "__proto__")).toBe(false);
  });
});
