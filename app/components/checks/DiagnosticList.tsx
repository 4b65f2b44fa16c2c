// Diagnostics grouped by severity, each with its message, hint, code and path, and a link to
// the place it concerns when there is one. Used for the stored config and for refused imports.
import { Link } from "react-router";
import type { Diagnostic, Severity } from "~/lib/checks/diagnostics";

export type LinkedDiagnostic = Diagnostic & { href?: string | null };

const GROUPS: { severity: Severity; title: string; tone: string; empty: string }[] = [
  { severity: "error", title: "Errors", tone: "border-l-signal-error", empty: "No errors." },
  { severity: "warning", title: "Warnings", tone: "border-l-signal-warning", empty: "No warnings." },
  { severity: "info", title: "Notes", tone: "border-l-signal-info", empty: "No notes." },
];

const BADGE: Record<Severity, string> = { error: "text-signal-error", warning: "text-signal-warning", info: "text-signal-info" };

export function DiagnosticList({ diagnostics, idPrefix = "checks", headingLevel = 2 }: { diagnostics: LinkedDiagnostic[]; idPrefix?: string; headingLevel?: 2 | 3 }) {
  const H = headingLevel === 2 ? "h2" : "h3";
  return (
    <div className="space-y-4">
      {GROUPS.map((g) => {
        const items = diagnostics.filter((d) => d.severity === g.severity);
        const id = `${idPrefix}-${g.severity}`;
        return (
          <section key={g.severity} aria-labelledby={id} className={`card border-l-4 ${g.tone}`} data-testid={id}>
            <H id={id} className="text-base">
              {g.title} <span className="text-iron-400">({items.length})</span>
            </H>
            {items.length === 0 ? (
              <p className="mt-1 text-sm text-iron-400">{g.empty}</p>
            ) : (
              <ul className="mt-2 divide-y divide-soot-700">
                {items.map((d, i) => (
                  <li key={`${d.code}-${d.path}-${i}`} className="py-2">
                    <p className="text-sm">
                      <span className={`mr-2 font-mono text-xs uppercase ${BADGE[d.severity]}`}>{d.severity}</span>
                      {d.message}
                    </p>
                    {d.hint ? <p className="mt-0.5 text-sm text-iron-300">{d.hint}</p> : null}
                    <p className="mt-0.5 flex flex-wrap gap-x-3 font-mono text-xs text-iron-400">
                      <span>
                        code <code>{d.code}</code>
                      </span>
                      <span>
                        at{" "}
                        {d.href ? (
                          <Link to={d.href} className="text-brass-300">
                            {d.path || "(whole config)"}
                          </Link>
                        ) : (
                          <code>{d.path || "(whole config)"}</code>
                        )}
                      </span>
                    </p>
                  </li>
                ))}
              </ul>
            )}
          </section>
        );
      })}
    </div>
  );
}
