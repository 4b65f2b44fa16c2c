// Checking a template's source the way a save does (compile with the workshop's templates as
// partials, nothing rendered), with the answer's error lists already capped (decision 011).
// Pure: the render workers run it for saves (pool.server.ts `checkOffThread`), so a hostile
// save never compiles on the event loop, and only the capped list crosses between threads.
import { compileTemplate, type Limits, type TemplateError } from "../template";
import { capErrors, type CappedList } from "../template/error-list";
import { partialsFrom } from "./render";

export type CheckOutcome =
  | { ok: true; warnings: CappedList<TemplateError> }
  | { ok: false; errors: CappedList<TemplateError>; warnings: CappedList<TemplateError> };

export function checkTemplateSource(source: string, partials: Record<string, string>, limits?: Partial<Limits>): CheckOutcome {
  const compiled = compileTemplate(source, { partials: partialsFrom(partials), limits, cache: false });
  if (compiled.ok) return { ok: true, warnings: capErrors(compiled.warnings) };
  return {
    ok: false,
    errors: capErrors(compiled.errors.filter((e) => e.severity === "error")),
    warnings: capErrors(compiled.errors.filter((e) => e.severity === "warning")),
  };
}

/** A check stopped from outside (its worker ran past the time limit or out of memory). */
export function stoppedCheck(message: string): CheckOutcome {
  const e: TemplateError = { stage: "check", severity: "error", message, line: 1, column: 1, from: 0, to: 0 };
  return { ok: false, errors: capErrors([e]), warnings: capErrors([]) };
}
