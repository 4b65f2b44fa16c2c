// The look editor's inputs: each knows the JSON path of the value it edits, shows the checks'
// diagnostics for that path beside itself, and keeps what a person typed until it makes sense
// (a half-typed number or colour never reaches the draft, and never the preview).
import { createContext, useContext, useEffect, useId, useState, type ReactNode } from "react";
import type { Diagnostic } from "~/lib/checks/diagnostics";
import { EMPTY_INDEX, type DiagnosticIndex } from "~/lib/looks/diagnostic-index";

/** onePreset: the editor holds exactly one preset (the library's stand-in rig): no add, duplicate or delete. */
export const EditorContext = createContext<{ checks: DiagnosticIndex; readOnly: boolean; onePreset?: boolean }>({ checks: EMPTY_INDEX, readOnly: true });

const TONE: Record<Diagnostic["severity"], string> = {
  error: "text-signal-error",
  warning: "text-signal-warning",
  info: "text-signal-info",
};

export function DiagnosticList({ items, id, className = "" }: { items: readonly Diagnostic[]; id?: string; className?: string }) {
  if (items.length === 0) return null;
  return (
    <ul id={id} className={`mt-1 space-y-0.5 text-xs ${className}`} data-testid="diagnostics">
      {items.map((d, i) => (
        <li key={`${d.code}-${i}`} className={TONE[d.severity]} data-code={d.code} data-path={d.path}>
          <span className="font-medium">{d.severity === "error" ? "Error" : d.severity === "warning" ? "Warning" : "Note"}:</span> {d.message}{" "}
          <span className="text-iron-400">{d.hint}</span>
        </li>
      ))}
    </ul>
  );
}

/** Diagnostics at `path` plus a local complaint; wires aria-invalid and aria-describedby. */
function useFieldChecks(path: string, local: string | null) {
  const { checks } = useContext(EditorContext);
  const id = useId();
  const items = checks.at(path);
  const invalid = local !== null || items.some((d) => d.severity === "error");
  const flagged = local !== null || items.length > 0;
  const describedBy = flagged ? `${id}-msg` : undefined;
  const message = flagged ? (
    <div id={`${id}-msg`} aria-live="polite">
      {local ? <p className="field-error">{local}</p> : null}
      <DiagnosticList items={items} />
    </div>
  ) : null;
  return { id, invalid, describedBy, message, warned: items.length > 0 };
}

function Label({ htmlFor, children, unit }: { htmlFor: string; children: ReactNode; unit?: string }) {
  return (
    <label className="label" htmlFor={htmlFor}>
      {children}
      {unit ? <span className="normal-case text-iron-400"> ({unit})</span> : null}
    </label>
  );
}

const HEX = /^#[0-9a-fA-F]{6}$/;

/** A colour as a picker and as #rrggbb text; the text accepts "ff8800" and "#FF8800" alike. */
export function ColourInput({ label, value, path, onChange }: { label: string; value: string; path: string; onChange: (hex: string) => void }) {
  const { readOnly } = useContext(EditorContext);
  const [text, setText] = useState(value);
  useEffect(() => setText(value), [value]);
  const typed = text.trim().startsWith("#") ? text.trim() : `#${text.trim()}`;
  const local = HEX.test(typed) ? null : "A colour is written #rrggbb, e.g. #ff8800.";
  const f = useFieldChecks(path, local);
  return (
    <div data-path={path}>
      <Label htmlFor={f.id}>{label}</Label>
      <div className="flex items-center gap-2">
        <input
          type="color"
          aria-label={`${label} picker`}
          value={HEX.test(value) ? value.toLowerCase() : "#000000"}
          disabled={readOnly}
          onChange={(e) => onChange(e.currentTarget.value)}
          className="h-8 w-10 shrink-0 cursor-pointer rounded border border-soot-600 bg-soot-900 p-0.5"
        />
        <input
          id={f.id}
          type="text"
          inputMode="text"
          spellCheck={false}
          value={text}
          readOnly={readOnly}
          aria-invalid={f.invalid || undefined}
          aria-describedby={f.describedBy}
          onChange={(e) => {
            const t = e.currentTarget.value;
            setText(t);
            const hex = t.trim().startsWith("#") ? t.trim() : `#${t.trim()}`;
            if (HEX.test(hex)) onChange(hex.toLowerCase());
          }}
          className="field w-28 font-mono"
        />
      </div>
      {f.message}
    </div>
  );
}

function formatNumber(v: number): string {
  return Number.isFinite(v) ? String(Math.round(v * 10000) / 10000) : "";
}

/**
 * A number as a slider and as typed text with its unit. The slider spans the usual range; the
 * text takes any number, so an out-of-range value reaches the checks and they say why.
 */
export function NumberInput({
  label,
  value,
  path,
  unit,
  min,
  max,
  step = 1,
  integer = false,
  slider = true,
  onChange,
}: {
  label: string;
  value: number;
  path: string;
  unit?: string;
  min: number;
  max: number;
  step?: number;
  integer?: boolean;
  slider?: boolean;
  onChange: (v: number) => void;
}) {
  const { readOnly } = useContext(EditorContext);
  const [text, setText] = useState(formatNumber(value));
  useEffect(() => {
    setText((t) => (Number(t) === value && t.trim() !== "" ? t : formatNumber(value)));
  }, [value]);
  const parsed = text.trim() === "" ? NaN : Number(text);
  const local = !Number.isFinite(parsed) ? "Enter a number." : integer && !Number.isInteger(parsed) ? "Enter a whole number." : null;
  const f = useFieldChecks(path, local);
  return (
    <div data-path={path}>
      <Label htmlFor={f.id} unit={unit}>
        {label}
      </Label>
      <div className="flex items-center gap-2">
        {slider ? (
          <input
            type="range"
            aria-label={`${label} slider`}
            min={min}
            max={max}
            step={step}
            value={Number.isFinite(value) ? Math.min(max, Math.max(min, value)) : min}
            disabled={readOnly}
            onChange={(e) => {
              const v = Number(e.currentTarget.value);
              setText(formatNumber(v));
              onChange(v);
            }}
            className="min-w-0 flex-1 accent-ember-500"
          />
        ) : null}
        <input
          id={f.id}
          type="text"
          inputMode="decimal"
          value={text}
          readOnly={readOnly}
          aria-invalid={f.invalid || undefined}
          aria-describedby={f.describedBy}
          onChange={(e) => {
            const t = e.currentTarget.value;
            setText(t);
            const v = t.trim() === "" ? NaN : Number(t);
            if (Number.isFinite(v) && (!integer || Number.isInteger(v))) onChange(v);
          }}
          className={`field font-mono tabular-nums ${slider ? "w-24" : "w-full"}`}
        />
      </div>
      {f.message}
    </div>
  );
}

export function ChoiceInput<T extends string>({
  label,
  value,
  path,
  options,
  labels,
  onChange,
}: {
  label: string;
  value: T;
  path: string;
  options: readonly T[];
  labels?: Partial<Record<T, string>>;
  onChange: (v: T) => void;
}) {
  const { readOnly } = useContext(EditorContext);
  const f = useFieldChecks(path, null);
  const known = options.includes(value);
  return (
    <div data-path={path}>
      <Label htmlFor={f.id}>{label}</Label>
      <select
        id={f.id}
        value={value}
        disabled={readOnly}
        aria-invalid={f.invalid || undefined}
        aria-describedby={f.describedBy}
        onChange={(e) => onChange(e.currentTarget.value as T)}
        className="field"
      >
        {known ? null : <option value={value}>{value} (unknown)</option>}
        {options.map((o) => (
          <option key={o} value={o}>
            {labels?.[o] ?? o}
          </option>
        ))}
      </select>
      {f.message}
    </div>
  );
}

export function CheckInput({ label, checked, path, onChange }: { label: string; checked: boolean; path: string; onChange: (v: boolean) => void }) {
  const { readOnly } = useContext(EditorContext);
  const f = useFieldChecks(path, null);
  return (
    <div data-path={path}>
      <label className="inline-flex items-center gap-2 text-sm" htmlFor={f.id}>
        <input id={f.id} type="checkbox" checked={checked} disabled={readOnly} onChange={(e) => onChange(e.currentTarget.checked)} className="accent-ember-500" aria-describedby={f.describedBy} />
        {label}
      </label>
      {f.message}
    </div>
  );
}
