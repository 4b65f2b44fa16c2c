// A labelled input with its unit and its error, used across the rig and workshop forms.
export function Field({
  name,
  label,
  defaultValue,
  error,
  unit,
  type = "text",
  step,
  className = "",
  readOnly,
}: {
  name: string;
  label: string;
  defaultValue?: string | number;
  error?: string;
  unit?: string;
  type?: "text" | "number";
  step?: string;
  className?: string;
  readOnly?: boolean;
}) {
  const id = `f-${name.replace(/\./g, "-")}`;
  return (
    <div className={className}>
      <label className="label" htmlFor={id}>
        {label}
        {unit ? <span className="normal-case text-iron-400"> ({unit})</span> : null}
      </label>
      <input
        id={id}
        name={name}
        type={type}
        step={step ?? (type === "number" ? "any" : undefined)}
        defaultValue={defaultValue}
        readOnly={readOnly}
        disabled={readOnly}
        className="field"
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? `${id}-err` : undefined}
      />
      {error ? (
        <p id={`${id}-err`} className="field-error">
          {error}
        </p>
      ) : null}
    </div>
  );
}

export function Select({
  name,
  label,
  options,
  defaultValue,
  error,
  readOnly,
}: {
  name: string;
  label: string;
  options: readonly string[];
  defaultValue?: string;
  error?: string;
  readOnly?: boolean;
}) {
  const id = `f-${name.replace(/\./g, "-")}`;
  return (
    <div>
      <label className="label" htmlFor={id}>
        {label}
      </label>
      <select id={id} name={name} defaultValue={defaultValue} className="field" disabled={readOnly} aria-invalid={error ? true : undefined}>
        {options.map((o) => (
          <option key={o} value={o}>
            {o}
          </option>
        ))}
      </select>
      {error ? <p className="field-error">{error}</p> : null}
    </div>
  );
}
