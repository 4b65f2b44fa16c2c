// Making a pasted header a build's config: it must read back cleanly, then it is stored through
// the checked save like any whole config (no errors, over the version the page was read at).
import type { Viewer } from "../auth/auth.server";
import { storeCheckedConfig } from "../checks/save.server";
import type { Diagnostic } from "../checks/validate";
import { readHeader } from "./readback";

export type ApplyOutcome = { ok: boolean; status: 200 | 409 | 422; message: string; diagnostics: Diagnostic[] };

export async function applyHeader(v: Viewer, buildId: string, text: string, expectedVersion: number, message?: string | null): Promise<ApplyOutcome> {
  const read = readHeader(text);
  if (!read.config || read.errors.length) return { ok: false, status: 422, message: "The header does not read back; nothing was stored.", diagnostics: [] };
  const r = await storeCheckedConfig(v, buildId, read.config, expectedVersion, { message });
  if (r.kind === "invalid") return { ok: false, status: 422, message: r.message, diagnostics: r.diagnostics };
  if (r.kind === "stale") return { ok: false, status: 409, message: r.message, diagnostics: [] };
  return { ok: true, status: 200, message: `The header is now the build's config (version ${r.version}).`, diagnostics: [] };
}
