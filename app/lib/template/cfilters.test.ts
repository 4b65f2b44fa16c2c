import { execFileSync } from "node:child_process";
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { C11_KEYWORDS, toCComment, toCIdentifier, toCString } from "./cfilters";
import { hasCC, out, run } from "./test-helpers";

const SAMPLES = ["plain", 'quote " and \\ backslash', "tab\tnew\nline\r", "what??/ trigraph??=", "??", "???/ and ????= in a row", "?\\??/", "é ü 火 🔥", "\u0001\u007f bell", "*/ end /* start", "x\\", "0\u00001"];

describe("C identifiers (C11 §6.4.1 keywords, §6.4.2 identifiers)", () => {
  it("produces valid identifiers that are never keywords", () => {
    for (const s of ["int", "_Bool", "while", "9-lives", "main-blade", "", "__x", "-", "a b c", "火"]) {
      const id = toCIdentifier(s);
      expect(id).toMatch(/^[A-Za-z][A-Za-z0-9_]*$|^[a-z][A-Za-z0-9_]*_$/);
      expect(C11_KEYWORDS.has(id)).toBe(false);
      // C11 §7.1.3: leading underscore + capital, or two underscores, are reserved.
      expect(id).not.toMatch(/^_[A-Z_]/);
    }
    expect(toCIdentifier("int")).toBe("int_");
    expect(toCIdentifier("9-lives")).toBe("n9_lives");
  });

  it("keeps identifiers unique within a scope and stable for the same input", () => {
    expect(out("@( 'a-b' |> cident )@ @( 'a_b' |> cident )@ @( 'a-b' |> cident )@ @( 'a b' |> cident('other') )@")).toBe("a_b a_b_2 a_b a_b");
    // Long names stay within the 63 significant characters C11 §5.2.4.1 guarantees, suffix included.
    const long = "x".repeat(80);
    const [first, second] = out(`@( '${long}' |> cident )@ @( '${long}-' |> cident )@`).split(" ");
    expect(first).toHaveLength(63);
    expect(second).toBe(`${"x".repeat(61)}_2`);
  });

  it.skipIf(!hasCC)("compiles identifiers made from awkward input (outside judge: cc)", () => {
    const names = ["int", "_Bool", "9-lives", "", "a-b", "a_b", "for", "return"].map((s, i) => `@( "${s}" |> cident("x") )@ = ${i}`);
    const src = `enum { ${names.join(", ")} };\n`;
    execFileSync("cc", ["-std=c11", "-Wall", "-Werror", "-fsyntax-only", "-x", "c", "-"], { input: out(src) });
  });
});

describe("C string literals (C11 §6.4.5) and comments", () => {
  it("escapes quotes, backslashes, controls, non-ASCII bytes and trigraph starts", () => {
    expect(toCString('say "hi"\\')).toBe('"say \\"hi\\"\\\\"');
    expect(toCString("a??/b")).toBe('"a?\\?/b"');
    expect(toCString("é")).toBe('"\\303\\251"');
    expect(toCString("\u00001")).toBe('"\\0001"');
  });

  it.skipIf(!hasCC)("round-trips through the C compiler byte for byte (outside judge: cc)", () => {
    const dir = mkdtempSync(join(tmpdir(), "hb-cstr-"));
    const lits = SAMPLES.map((s) => `  { ${toCString(s)}, sizeof ${toCString(s)} - 1 },`).join("\n");
    const comments = SAMPLES.map((s) => `/* ${toCComment(s)} */\n// ${toCComment(s)}\nint probe_${SAMPLES.indexOf(s)};`).join("\n");
    const prog = `#include <stdio.h>\n${comments}\nstatic const struct { const char *s; unsigned long n; } t[] = {\n${lits}\n};\nint main(void) {\n  for (unsigned i = 0; i < sizeof t / sizeof t[0]; i++) {\n    for (unsigned long j = 0; j < t[i].n; j++) printf("%02x", (unsigned char)t[i].s[j]);\n    printf("\\n");\n  }\n  return 0;\n}\n`;
    writeFileSync(join(dir, "p.c"), prog);
    execFileSync("cc", ["-std=c11", "-Wall", "-Werror", "-o", join(dir, "p"), join(dir, "p.c")]);
    const lines = execFileSync(join(dir, "p")).toString().trim().split("\n");
    expect(lines).toEqual(SAMPLES.map((s) => Buffer.from(s, "utf8").toString("hex")));
  });

  it("keeps comment text from ending or extending the comment", () => {
    expect(toCComment("a */ b /* c")).toBe("a * / b / * c");
    expect(toCComment("ends with \\")).toBe("ends with \\.");
    expect(toCComment("two\nlines")).toBe("two lines");
    expect(toCComment("x??/")).toBe("x? ?/");
    // A run of three left a pair behind before ("? ??/" is still a trigraph).
    expect(toCComment("x???/")).toBe("x? ? ?/");
    expect(toCString("x???/")).toBe('"x?\\?\\?/"');
  });
});

describe("numbers, colours and units", () => {
  it("prints colours as 0xRRGGBB and as bytes", () => {
    expect(out("@( '#ff8800' |> hex )@ @( '#Ff8800' |> hex('upper') )@ @( '#ff8800' |> bytes |> join(', ') )@")).toBe("0xff8800 0xFF8800 0xFF, 0x88, 0x00");
    expect(run("@( 'red' |> hex )@").errors[0].message).toBe("filter 'hex': expected a colour written #rrggbb, not text \"red\"");
  });

  it("prints fixed-point numbers, doubles and units", () => {
    expect(out("@( 3.14159 |> fixed(2) )@ @( 0.5 |> q(8) )@ @( 2 |> cdouble )@ @( 0.1 |> cdouble )@ @( 1.25 |> round(1) )@")).toBe("3.14 128 2.0 0.1 1.3");
    expect(out("@( 340 |> ms )@ @( 1500 |> seconds )@ @( 132 |> px )@ @( 0.6 |> percent )@")).toBe("340 ms 1.5 s 132 px 60 %");
  });

  it("pads, aligns and changes case", () => {
    expect(out("[@( 'ab' |> pad(5) )@][@( 'ab' |> pad(5, 'right') )@][@( 'ab' |> pad(6, 'center', '.') )@]")).toBe("[ab   ][   ab][..ab..]");
    expect(out("@( 'speedPixelsPerSecond' |> snake )@ @( 'ease-in-out' |> snake |> upper )@ @( 'MiXed' |> lower )@")).toBe("speed_pixels_per_second EASE_IN_OUT mixed");
    expect(out("@( config.rig.board.dataPins |> join(' | ') )@ @( meta.revision |> default(0) )@ @( '' |> default('none') )@")).toBe("2 | 3 | 4 | 5 7 none");
  });
});
