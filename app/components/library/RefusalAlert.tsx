// A refused library action as a person reads it: the message, then the validator's findings by
// path (at most `limit` of them). Used by the Library page's import and the Looks page's panel.
export function RefusalAlert({ error, diagnostics, limit, testId }: { error: string; diagnostics?: { path: string; message: string }[]; limit?: number; testId: string }) {
  const shown = diagnostics?.slice(0, limit ?? diagnostics.length) ?? [];
  return (
    <div role="alert" className="rounded-md border border-signal-error px-3 py-2 text-sm" data-testid={testId}>
      <p>{error}</p>
      {shown.length ? (
        <ul className="mt-1 list-disc pl-5">
          {shown.map((d, i) => (
            <li key={i}>
              <code>{d.path}</code> {d.message}
            </li>
          ))}
        </ul>
      ) : null}
    </div>
  );
}
