import { StringStream } from "@codemirror/language";
import { describe, expect, it } from "vitest";
import { hbTemplateLanguage, hbTemplateStreamParser, type HbTemplateState } from "./codemirror";

function classify(lines: string[]): [string, string | null][] {
  const p = hbTemplateStreamParser;
  const state = p.startState!(2) as HbTemplateState;
  const out: [string, string | null][] = [];
  for (const line of lines) {
    const stream = new StringStream(line, 2, 2);
    while (!stream.eol()) {
      const style = p.token(stream, state);
      const text = stream.current();
      if (text.trim()) out.push([text, style]);
      stream.start = stream.pos;
    }
  }
  return out;
}

describe("editor highlighting", () => {
  it("classifies delimiters, keywords, filters, strings and numbers", () => {
    const toks = classify(['int x = @( ch.pixels |> pad(4, "right") )@;', "@[ over config.presets as p ]@", "@[ /over ]@ @# note #@"]);
    expect(toks).toEqual([
      ["int x = ", null],
      ["@(", "meta"],
      ["ch", "variableName"],
      [".", "punctuation"],
      ["pixels", "propertyName"],
      ["|>", "operator"],
      ["pad", "variableName.function"],
      ["(", "punctuation"],
      ["4", "number"],
      [",", "punctuation"],
      ['"right"', "string"],
      [")", "punctuation"],
      [")@", "meta"],
      [";", null],
      ["@[", "meta"],
      ["over", "keyword"],
      ["config", "variableName"],
      [".", "punctuation"],
      ["presets", "propertyName"],
      ["as", "keyword"],
      ["p", "variableName"],
      ["]@", "meta"],
      ["@[", "meta"],
      ["/over", "keyword"],
      ["]@", "meta"],
      ["@#", "comment"],
      [" note #@", "comment"],
    ]);
  });

  it("keeps comment state across lines and builds a language", () => {
    const toks = classify(["@# a", "still comment #@ text"]);
    expect(toks.map((t) => t[1])).toEqual(["comment", "comment", "comment", null]);
    expect(hbTemplateLanguage().name).toBe("hiltbench-template");
  });
});
