// Shared fixtures for the template tests.
import { execFileSync } from "node:child_process";
import { demoConfig } from "../config/demo";
import type { RenderMeta } from "./compile";
import { compileTemplate, renderTemplate, type CompileOptions } from "./compile";
import type { TemplateError } from "./errors";

export const META: RenderMeta = {
  buildName: "Kestrel",
  clientName: "client-one@example.test",
  savedAt: "2026-03-14T09:30:00Z",
  revision: 7,
  templateName: "test",
  templateVersion: 1,
};

/** Renders or returns the errors (compile or render) of a template against the demo config. */
export function run(source: string, opts: CompileOptions = {}, config = demoConfig()): { output?: string; errors: TemplateError[]; warnings: TemplateError[] } {
  const c = compileTemplate(source, opts);
  if (!c.ok) return { errors: c.errors, warnings: [] };
  const r = renderTemplate(c.template, config, META);
  return r.ok ? { output: r.output, errors: [], warnings: c.warnings } : { errors: r.errors, warnings: c.warnings };
}

export function out(source: string, opts: CompileOptions = {}): string {
  const r = run(source, opts);
  if (r.output === undefined) throw new Error(r.errors.map((e) => `${e.stage} ${e.line}:${e.column} ${e.message}`).join("\n"));
  return r.output;
}

/** The machine's C compiler is the outside judge of generated C; tests that need it skip without it. */
export const hasCC = (() => {
  try {
    execFileSync("cc", ["--version"], { stdio: "ignore" });
    return true;
  } catch {
    return false;
  }
})();

export function ccCheck(header: string) {
  execFileSync("cc", ["-std=c11", "-Wall", "-Werror", "-fsyntax-only", "-x", "c", "-"], { input: header, stdio: ["pipe", "pipe", "pipe"] });
}
