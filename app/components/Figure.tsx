// One labelled figure (value with its unit and a short note) inside a <dl>; the power card on
// the Checks page and the power panel on the Looks page show their numbers this way.
export function Figure({ label, value, note, tone = "" }: { label: string; value: string; note?: string; tone?: string }) {
  return (
    <div>
      <dt className="text-xs uppercase tracking-wide text-iron-400">{label}</dt>
      <dd className={`font-mono text-lg tabular-nums ${tone}`}>{value}</dd>
      {note ? <dd className="text-xs text-iron-400">{note}</dd> : null}
    </div>
  );
}
