// Under `target c` the generated header stays C whatever the names hold (decision 011): hostile
// text in every free-text field of the model and the render metadata goes through the built-in
// generic header, and the machine's C compiler is the outside judge (cc -std=c11 -Wall -Werror).
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { demoConfig } from "../config/demo";
import { configSchema, type Config } from "../config/schema";
import { isStorableText } from "../input/edges";
import { BUILTIN_NAMES, BUILTIN_TEMPLATES, BUILTIN_VERSION, builtinSource } from "./builtins";
import { compileTemplate, render, type RenderMeta } from "./compile";
import { ccCheck, hasCC, META } from "./test-helpers";

const HOSTILE = [
  'x */ #include "/etc/passwd" /* \\',
  '"; system("rm -rf /"); "',
  "\\",
  "line one\nline two\r\n#define EVIL 1",
  "??/ ??= ??' ??( ??) ??! ??< ??> ??-",
  "// not a comment */ /* nor this",
  "tab\there\vvertical\fform\u0007bell\u001b[31m",
  "’quotes’ “double” 🔥 Ünïcødé",
  "#endif\n#if 0",
  "*/",
];

/** Every free-text field of the model (ids are slugs and never free text) set to `text`. */
function withText(config: Config, pick: (i: number) => string): Config {
  const c = structuredClone(config);
  let i = 0;
  const next = () => pick(i++).slice(0, 60);
  c.rig.board.profile = next();
  for (const ch of c.rig.channels) ch.name = next();
  for (const b of c.rig.buttons) b.name = next();
  for (const f of c.fonts) {
    f.name = next();
    f.folder = next();
  }
  for (const p of c.presets) p.name = next();
  return c;
}

function header(config: Config, meta: RenderMeta): string {
  const r = render(BUILTIN_TEMPLATES["generic-header"], config, meta);
  if (!r.ok) throw new Error(r.errors.map((e) => `${e.line}:${e.column} ${e.message}`).join("\n"));
  return r.output;
}

describe("C output is safe by default", () => {
  it("the built-in header prints every model text through a C filter (it compiles under the rule)", () => {
    const c = compileTemplate(BUILTIN_TEMPLATES["generic-header"]);
    expect(c.ok).toBe(true);
  });

  it("every released built-in, at every version still served (v1 and v2), compiles under the rule", () => {
    for (const name of BUILTIN_NAMES)
      for (let version = 1; version <= BUILTIN_VERSION; version++) {
        const c = compileTemplate(builtinSource(name, version)!);
        expect(c.ok ? [] : c.errors.filter((e) => e.severity === "error").map((e) => `${name}@${version} ${e.line}:${e.column} ${e.message}`)).toEqual([]);
      }
  });

  it("a template that prints a name raw into a comment is refused at the tag", () => {
    const src = "@[ target c ]@\n/* @( config.presets[0].name )@ */\n";
    const c = compileTemplate(src);
    expect(c.ok).toBe(false);
    if (!c.ok) {
      expect(c.errors[0]).toMatchObject({ severity: "error", line: 2, column: 4 });
      expect(c.errors[0].message).toMatch(/ccomment/);
    }
  });

  it("hostile names in every text field leave no directive and no broken comment in the header", () => {
    const config = withText(demoConfig(), (i) => HOSTILE[i % HOSTILE.length]);
    expect(configSchema.safeParse(config).success).toBe(true);
    const out = header(config, { ...META, buildName: HOSTILE[0], clientName: HOSTILE[3], templateName: HOSTILE[1] });
    expect(out).not.toMatch(/^\s*#\s*include\s+"\/etc\/passwd"/m);
    expect(out).not.toMatch(/^\s*#define EVIL/m);
    expect(out).not.toMatch(/^\s*#if 0/m);
  });

  it.skipIf(!hasCC)("hostile names in every text field: cc -std=c11 -Wall -Werror accepts the header", () => {
    for (let shift = 0; shift < HOSTILE.length; shift++) {
      const config = withText(demoConfig(), (i) => HOSTILE[(i + shift) % HOSTILE.length]);
      ccCheck(header(config, { ...META, buildName: HOSTILE[shift], clientName: HOSTILE[(shift + 1) % HOSTILE.length], templateName: HOSTILE[(shift + 2) % HOSTILE.length] }));
    }
  }, 60_000);

  it.skipIf(!hasCC)("random text (controls, quotes, backslashes, trigraphs, astral characters) in every field: cc accepts it", () => {
    const piece = fc.constantFrom("*/", "/*", "//", "\\", '"', "'", "??/", "??=", "\n", "\r", "#include <x>", "\t", "\u0001", "é", "🔥", "a", " ");
    const text = fc
      .array(fc.oneof(piece, fc.string({ unit: "binary", maxLength: 4 })), { minLength: 1, maxLength: 12 })
      .map((parts) => parts.join("").slice(0, 60))
      .filter((s) => s.length > 0 && isStorableText(s));
    fc.assert(
      fc.property(fc.array(text, { minLength: 40, maxLength: 40 }), text, (texts, name) => {
        const config = withText(demoConfig(), (i) => texts[i % texts.length]);
        ccCheck(header(config, { ...META, buildName: name, clientName: texts[0] }));
      }),
      { numRuns: 12 },
    );
  }, 120_000);
});
