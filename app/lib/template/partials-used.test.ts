import { describe, expect, it } from "vitest";
import { partialsUsed } from "./partials-used";

describe("partialsUsed", () => {
  it("finds workshop templates used anywhere: top level, branches, loops, pieces", () => {
    const src = [
      '@[ use "banner"(title = meta.buildName) ]@',
      '@[ when meta.revision > 1 ]@@[ use "notes" ]@@[ otherwise ]@@[ use "fallback" ]@@[ /when ]@',
      '@[ over config.rig.channels as ch ]@@[ use "row"(c = ch.name) ]@@[ none ]@@[ use "empty" ]@@[ /over ]@',
      '@[ piece p ]@@[ use "in-piece" ]@@[ /piece ]@@[ use p ]@',
    ].join("\n");
    expect([...partialsUsed(src)].sort()).toEqual(["banner", "empty", "fallback", "in-piece", "notes", "row"]);
  });

  it("does not count pieces, comments or verbatim text", () => {
    const src = '@# use "commented" #@@[ verbatim ]@@[ use "quoted" ]@@[ /verbatim ]@@[ piece a ]@x@[ /piece ]@@[ use a ]@';
    expect([...partialsUsed(src)]).toEqual([]);
  });

  it("scans the text of a source that does not parse, so no dependency is missed", () => {
    expect([...partialsUsed('@[ use "half-done" ]@ @[ when ]@')]).toEqual(["half-done"]);
  });
});
