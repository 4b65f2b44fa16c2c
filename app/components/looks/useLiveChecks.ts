// Live checks while editing: the draft goes to POST /api/validate once edits settle (~300 ms),
// a newer draft cancels an older request, and a draft the schema rejects is reported at once
// from the same structural rules the server runs, so a bad value is flagged before any fetch.
import { useEffect, useMemo, useRef, useState } from "react";
import type { Diagnostic } from "~/lib/checks/diagnostics";
import { configSchema, type Config } from "~/lib/config/schema";
import { structureDiagnostics } from "~/lib/checks/structure";

export const CHECK_DELAY_MS = 300;

export type CheckStatus = "checking" | "done" | "failed";

export interface LiveChecks {
  diagnostics: Diagnostic[];
  status: CheckStatus;
  /** Why the server's checks could not run, when they could not. */
  problem: string | null;
  /** The latest draft the schema accepts: what the preview and the power panel show. */
  lastValid: Config;
  /** The draft itself parses. */
  valid: boolean;
  /** Replace the server's answer (a refused save carries its own diagnostics). */
  accept(config: Config, diagnostics: Diagnostic[]): void;
}

export function useLiveChecks(config: Config): LiveChecks {
  const parsed = useMemo(() => configSchema.safeParse(config), [config]);
  const lastValid = useRef(config);
  if (parsed.success) lastValid.current = config;
  const local = useMemo(() => (parsed.success ? null : structureDiagnostics(parsed.error.issues, config)), [parsed, config]);

  const [server, setServer] = useState<{ for: Config | null; diagnostics: Diagnostic[] }>({ for: null, diagnostics: [] });
  const [status, setStatus] = useState<CheckStatus>("checking");
  const [problem, setProblem] = useState<string | null>(null);
  const first = useRef(true);

  useEffect(() => {
    const ctrl = new AbortController();
    setStatus("checking");
    const timer = setTimeout(
      async () => {
        try {
          const res = await fetch("/api/validate", {
            method: "POST",
            headers: { "Content-Type": "application/json", Accept: "application/json" },
            body: JSON.stringify({ config }),
            signal: ctrl.signal,
          });
          const body = (await res.json().catch(() => null)) as { diagnostics?: Diagnostic[]; error?: string } | null;
          if (!res.ok || !Array.isArray(body?.diagnostics)) {
            setProblem(body?.error ?? (res.status === 404 ? "The checking service is not available on this server." : `The checks did not answer (status ${res.status}).`));
            setStatus("failed");
            return;
          }
          setServer({ for: config, diagnostics: body.diagnostics });
          setProblem(null);
          setStatus("done");
        } catch (e) {
          if (ctrl.signal.aborted) return;
          setProblem(`The checks could not be reached (${e instanceof Error ? e.message : String(e)}).`);
          setStatus("failed");
        }
      },
      first.current ? 0 : CHECK_DELAY_MS,
    );
    first.current = false;
    return () => {
      clearTimeout(timer);
      ctrl.abort();
    };
  }, [config]);

  return {
    diagnostics: local ?? server.diagnostics,
    status,
    problem,
    lastValid: lastValid.current,
    valid: parsed.success,
    accept: (c, diagnostics) => setServer({ for: c, diagnostics }),
  };
}
