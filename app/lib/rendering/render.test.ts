import { describe, expect, it } from "vitest";
import { demoConfig } from "../config/demo";
import { compileAndRender, downloadName, metaForBuild, partialsFrom } from "./render";

const build = { name: "Kestrel", client_name: "Client One", config_saved_at: new Date("2026-03-14T09:30:00Z"), config_version: 7 };

describe("rendering with the workshop's templates", () => {
  it("resolves workshop templates first, then the built-ins", () => {
    const resolve = partialsFrom({ banner: "B", "readable-copy": "mine" });
    expect(resolve("banner")).toBe("B");
    expect(resolve("readable-copy")).toBe("mine");
    expect(resolve("config-json")).toContain("json");
    expect(resolve("toString")).toBeUndefined();
  });

  it("renders a template that uses another workshop template, deterministically from the build", () => {
    const meta = metaForBuild(build, { name: "shop", version: 3 });
    expect(meta).toEqual({ buildName: "Kestrel", clientName: "Client One", savedAt: "2026-03-14T09:30:00.000Z", revision: 7, templateName: "shop", templateVersion: 3 });
    const partials = { banner: "/* @( title |> ccomment )@ */" };
    const r = compileAndRender('@[ use "banner"(title = meta.buildName) ]@ saved @( meta.savedAt )@', demoConfig(), meta, { partials, cache: false });
    expect(r).toMatchObject({ ok: true, output: "/* Kestrel */ saved 2026-03-14T09:30:00.000Z" });
  });

  it("answers compile errors and warnings apart, and render errors with the compile warnings", () => {
    const bad = compileAndRender("@( config.rig.chanels )@", demoConfig(), metaForBuild(build, { name: "x", version: 1 }));
    expect(bad.ok).toBe(false);
    if (!bad.ok) expect(bad.errors[0].message).toContain("did you mean 'channels'?");
    const missing = compileAndRender('@[ use "nope"() ]@', demoConfig(), metaForBuild(build, { name: "x", version: 1 }), { partials: {} });
    expect(missing.ok).toBe(false);
  });

  it("names downloads from the build and template, by output kind", () => {
    expect(downloadName("Kestrel", "generic-header", "c")).toBe("kestrel-generic-header.h");
    expect(downloadName("Harrier Mk 2", "readable-copy", "text")).toBe("harrier-mk-2-readable-copy.txt");
    expect(downloadName("Kestrel", "config-json", "text")).toBe("kestrel-config-json.json");
    expect(downloadName("***", "***", "c")).toBe("build-build.h");
  });
});
