// The parts of choosing and rendering that need no database: posted source, built-ins, an
// unpinned build's own template, refusals, and a posted config without the model's shape.
import { describe, expect, it } from "vitest";
import type { Viewer } from "../auth/auth.server";
import { failureOf } from "../web/http.server";
import { BUILTIN_TEMPLATES, BUILTIN_VERSION, builtinSource } from "../template";
import { chooseTemplate, chooseTemplateForBuild, renderBuildOrSource } from "./service.server";

const v = { user: { id: "u" }, workshop: { id: "w", name: "Ember & Anvil Props" }, role: "builder", via: "session" } as unknown as Viewer;
const unpinned = { pinned_template_id: null, pinned_template_version: null };

async function failure(p: Promise<unknown>) {
  try {
    await p;
  } catch (e) {
    return failureOf(e);
  }
  throw new Error("expected a failure");
}

describe("which template a render means", () => {
  it("posted source renders as 'posted' version 1; a built-in by name; an unknown built-in is a 404", async () => {
    expect(await chooseTemplate(v, { source: "x" })).toEqual({ kind: "source", id: null, name: "posted", version: 1, source: "x" });
    expect(await chooseTemplate(v, { builtin: "readable-copy" })).toMatchObject({ kind: "builtin", name: "readable-copy", source: BUILTIN_TEMPLATES["readable-copy"] });
    expect(await failure(chooseTemplate(v, { builtin: "toString" }))).toMatchObject({ status: 404, message: "No built-in template 'toString'." });
    expect(await failure(chooseTemplate(v, null))).toMatchObject({ status: 400 });
  });

  it("a build without a pin renders with the generic header, asked for or not; a ref that is no id is a 404 naming the built-ins", async () => {
    expect(await chooseTemplateForBuild(v, unpinned, null)).toMatchObject({ kind: "builtin", name: "generic-header", version: BUILTIN_VERSION, source: BUILTIN_TEMPLATES["generic-header"] });
    // A built-in at an earlier version is that version's source (decision 015); one never released is a 404.
    expect(await chooseTemplateForBuild(v, unpinned, "generic-header", 1)).toMatchObject({ kind: "builtin", name: "generic-header", version: 1, source: builtinSource("generic-header", 1) });
    expect(await failure(chooseTemplateForBuild(v, unpinned, "generic-header", BUILTIN_VERSION + 1))).toMatchObject({ status: 404, message: `The built-in 'generic-header' has versions 1 to ${BUILTIN_VERSION}.` });
    expect(await chooseTemplateForBuild(v, unpinned, "generic-header")).toMatchObject({ kind: "builtin", name: "generic-header" });
    expect(await chooseTemplateForBuild(v, unpinned, "config-json")).toMatchObject({ kind: "builtin", name: "config-json" });
    expect(await failure(chooseTemplateForBuild(v, unpinned, "shop-header"))).toEqual({
      status: 404,
      message: "No template 'shop-header': use a built-in (generic-header, readable-copy, config-json) or a template id of your workshop.",
      headers: undefined,
    });
  });

  it("a posted config without the model's shape is answered with its fields, before any render", async () => {
    const r = await renderBuildOrSource(v, { config: { rig: "nope" } }, await chooseTemplate(v, { source: "x" }));
    expect(r.kind).toBe("bad-config");
    if (r.kind !== "bad-config") return;
    expect(r.message).toBe("The config does not have the model's shape; fix it before rendering.");
    expect(r.errors.length).toBeGreaterThan(0);
    expect(r.errors[0]).toMatchObject({ stage: "config", line: null, column: null });
  });
});
