// A JSON Schema (as the OpenAPI document holds it) drawn as a nested list a person reads: each
// field with its type, whether it is required, its limits and its description. References to
// the document's components are followed once and named, so a recursive schema cannot loop.
import type { ReactNode } from "react";
import { inline } from "~/components/Markdown";

export type JsonSchema = {
  $ref?: string;
  type?: string | string[];
  properties?: Record<string, JsonSchema>;
  required?: string[];
  items?: JsonSchema;
  anyOf?: JsonSchema[];
  oneOf?: JsonSchema[];
  allOf?: JsonSchema[];
  enum?: unknown[];
  const?: unknown;
  description?: string;
  default?: unknown;
  format?: string;
  pattern?: string;
  minimum?: number;
  maximum?: number;
  minLength?: number;
  maxLength?: number;
  minItems?: number;
  maxItems?: number;
  additionalProperties?: boolean | JsonSchema;
  example?: unknown;
};

export type Components = Record<string, JsonSchema>;

const refName = (ref: string) => ref.replace(/^#\/components\/schemas\//, "");
const SAFE = 9007199254740991;

function typeLabel(s: JsonSchema): string {
  if (s.$ref) return refName(s.$ref);
  if (s.const !== undefined) return JSON.stringify(s.const);
  if (s.enum) return s.enum.map((v) => JSON.stringify(v)).join(" | ");
  const t = Array.isArray(s.type) ? s.type.join(" | ") : s.type;
  if (t === "array" && s.items) return `array of ${typeLabel(s.items)}`;
  if (s.anyOf || s.oneOf) return "one of";
  if (!t) return "any JSON";
  return s.format ? `${t} (${s.format})` : t;
}

function limits(s: JsonSchema): string[] {
  const out: string[] = [];
  if (s.minimum !== undefined && s.minimum > -SAFE) out.push(`≥ ${s.minimum}`);
  if (s.maximum !== undefined && s.maximum < SAFE) out.push(`≤ ${s.maximum}`);
  if (s.minLength !== undefined) out.push(`at least ${s.minLength} characters`);
  if (s.maxLength !== undefined) out.push(`at most ${s.maxLength} characters`);
  if (s.minItems !== undefined) out.push(`at least ${s.minItems} items`);
  if (s.maxItems !== undefined) out.push(`at most ${s.maxItems} items`);
  if (s.pattern) out.push(`matches ${s.pattern}`);
  if (s.default !== undefined) out.push(`default ${JSON.stringify(s.default)}`);
  return out;
}

function Children({ schema, components, seen }: { schema: JsonSchema; components: Components; seen: string[] }): ReactNode {
  let s = schema;
  if (s.$ref) {
    const name = refName(s.$ref);
    if (seen.includes(name) || !components[name]) return null;
    seen = [...seen, name];
    s = components[name];
  }
  if (s.type === "array" && s.items) return <Children schema={s.items} components={components} seen={seen} />;
  const alternatives = s.anyOf ?? s.oneOf;
  if (alternatives) {
    return (
      <ol className="ml-4 list-decimal space-y-1 border-l border-soot-700 pl-4">
        {alternatives.map((alt, i) => (
          <li key={i}>
            <span className="font-mono text-sm text-brass-300">{typeLabel(alt)}</span>
            {alt.description ? <span className="ml-2 text-sm text-iron-300">{inline(alt.description)}</span> : null}
            <Children schema={alt} components={components} seen={seen} />
          </li>
        ))}
      </ol>
    );
  }
  if (!s.properties) return null;
  const required = new Set(s.required ?? []);
  return (
    <ul className="ml-2 space-y-1 border-l border-soot-700 pl-4">
      {Object.entries(s.properties).map(([name, p]) => (
        <li key={name}>
          <Field name={name} schema={p} required={required.has(name)} />
          <Children schema={p} components={components} seen={seen} />
        </li>
      ))}
    </ul>
  );
}

function Field({ name, schema, required }: { name: string; schema: JsonSchema; required: boolean }) {
  const extra = limits(schema);
  return (
    <div className="text-sm">
      <code className="font-mono text-iron-100">{name}</code>
      <span className="ml-2 font-mono text-brass-300">{typeLabel(schema)}</span>
      <span className="ml-2 text-xs text-iron-300">{required ? "required" : "optional"}</span>
      {extra.length ? <span className="ml-2 text-xs text-iron-300">{extra.join(", ")}</span> : null}
      {schema.description ? <span className="ml-2 text-iron-300">— {inline(schema.description)}</span> : null}
    </div>
  );
}

/** The whole schema: its type on the first line, then its fields. */
export function SchemaView({ schema, components }: { schema: JsonSchema; components: Components }) {
  return (
    <div className="mt-1">
      <p className="text-sm">
        <span className="font-mono text-brass-300">{typeLabel(schema)}</span>
        {schema.description ? <span className="ml-2 text-iron-300">{inline(schema.description)}</span> : null}
      </p>
      <Children schema={schema} components={components} seen={[]} />
    </div>
  );
}

export { Field as SchemaField, typeLabel, limits };
