// The machine's C and C++ compilers as outside judges of a generated header (test helper): which
// ones are here, the strict flags each language is held to, and building the table-walking
// consumer program (testdata/walk-tables.c) against a header. Tests skip what is not installed.
import { execFileSync, spawnSync } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import walkSource from "./testdata/walk-tables.c?raw";

export interface Toolchain {
  /** e.g. "g++ -std=c++20" */
  name: string;
  lang: "c" | "c++";
  cmd: string;
  flags: string[];
}

const present = (cmd: string) => {
  try {
    execFileSync(cmd, ["--version"], { stdio: "ignore" });
    return true;
  } catch {
    return false;
  }
};

const C_FLAGS = ["-Wall", "-Wextra", "-Werror", "-pedantic"];
// C++17 has no designated initializers at all; g++ and clang take them there as an extension,
// which -pedantic would refuse, so C++17 is held to everything but -pedantic.
const CXX17_FLAGS = ["-Wall", "-Wextra", "-Werror"];
const CXX20_FLAGS = ["-Wall", "-Wextra", "-Werror", "-pedantic-errors"];

function chains(cc: string, cxx: string): Toolchain[] {
  const out: Toolchain[] = [];
  if (present(cc))
    for (const std of ["c11", "c17"]) out.push({ name: `${cc} -std=${std}`, lang: "c", cmd: cc, flags: [`-std=${std}`, ...C_FLAGS] });
  if (present(cxx)) {
    out.push({ name: `${cxx} -std=c++20`, lang: "c++", cmd: cxx, flags: ["-std=c++20", ...CXX20_FLAGS] });
    out.push({ name: `${cxx} -std=c++17 (no -pedantic)`, lang: "c++", cmd: cxx, flags: ["-std=c++17", ...CXX17_FLAGS] });
  }
  return out;
}

/** gcc and g++ always when installed; clang and clang++ when installed (the tests do not install them). */
export const TOOLCHAINS: Toolchain[] = [...chains("gcc", "g++"), ...chains("clang", "clang++")];
export const hasClang = TOOLCHAINS.some((t) => t.cmd.startsWith("clang"));
export const hasCxx = TOOLCHAINS.some((t) => t.lang === "c++");
export const hasC = TOOLCHAINS.some((t) => t.lang === "c");
/** What version 1 of the generic header was held to (C11, -Wall): the reference reading for comparisons. */
export const C_REFERENCE: Toolchain | undefined = present("gcc") ? { name: "gcc -std=c11 -Wall (v1's flags)", lang: "c", cmd: "gcc", flags: ["-std=c11", "-Wall", "-Werror"] } : undefined;

/** Compiles the header on its own; throws with the compiler's messages when it is refused. */
export function syntaxCheck(header: string, tc: Toolchain): void {
  const r = spawnSync(tc.cmd, [...tc.flags, "-fsyntax-only", "-x", tc.lang, "-"], { input: header, encoding: "utf8" });
  if (r.status !== 0) throw new Error(`${tc.name} refuses the header:\n${r.stderr.slice(0, 4000)}`);
}

/**
 * Builds the consumer program against the header and runs it: `code` 0 when every table was
 * walked with every index in range; `stdout` lists every value read (same header, same lines,
 * whatever the language). Throws when the program does not compile.
 */
export function walkTables(header: string, tc: Toolchain): { code: number; stdout: string; stderr: string } {
  const dir = mkdtempSync(join(tmpdir(), "hb-walk-"));
  try {
    writeFileSync(join(dir, "hb_config.h"), header);
    writeFileSync(join(dir, "walk.c"), walkSource);
    const exe = join(dir, "walk");
    const built = spawnSync(tc.cmd, [...tc.flags, "-x", tc.lang, join(dir, "walk.c"), "-o", exe], { encoding: "utf8", cwd: dir });
    if (built.status !== 0) throw new Error(`${tc.name} does not build the consumer:\n${built.stderr.slice(0, 4000)}`);
    const ran = spawnSync(exe, [], { encoding: "utf8", timeout: 10_000, maxBuffer: 64 * 1024 * 1024 });
    return { code: ran.status ?? -1, stdout: ran.stdout, stderr: ran.stderr };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
