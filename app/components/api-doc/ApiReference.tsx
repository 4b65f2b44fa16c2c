// The API reference page, drawn from the OpenAPI document itself (never a second copy): the
// introduction with what stays the same, a contents list by tag, then each operation with its
// permission, parameters, body, answers (error shape included) and its curl example.
import { Markdown, inline, slugify } from "~/components/Markdown";
import { SchemaField, SchemaView, type Components, type JsonSchema } from "./SchemaView";

type Media = Record<string, { schema?: JsonSchema }>;
type Parameter = { in: "path" | "query" | "header"; name: string; required?: boolean; description?: string; schema?: JsonSchema };
type Response = { description: string; content?: Media; headers?: Record<string, { description?: string }> };
export type DocOperation = {
  operationId?: string;
  tags?: string[];
  summary?: string;
  description?: string;
  security?: unknown[];
  parameters?: Parameter[];
  requestBody?: { description?: string; content: Media };
  responses: Record<string, Response>;
  "x-codeSamples"?: { lang: string; label: string; source: string }[];
};
export type ApiDoc = {
  info: { title: string; version: string; description?: string };
  tags?: { name: string; description?: string }[];
  paths: Record<string, Record<string, DocOperation>>;
  components?: { schemas?: Components };
};

const METHODS = ["get", "post", "put", "patch", "delete"] as const;

function operationsOf(doc: ApiDoc) {
  const out: { method: string; path: string; op: DocOperation; id: string }[] = [];
  for (const [path, item] of Object.entries(doc.paths))
    for (const m of METHODS) if (item[m]) out.push({ method: m, path, op: item[m], id: slugify(`${m} ${path}`) });
  return out;
}

function Code({ text, label }: { text: string; label: string }) {
  return (
    <pre tabIndex={0} aria-label={label} className="overflow-x-auto rounded-md border border-soot-700 bg-soot-900 p-3 font-mono text-sm text-iron-100">
      <code>{text}</code>
    </pre>
  );
}

function Body({ content, components }: { content: Media; components: Components }) {
  return (
    <>
      {Object.entries(content).map(([media, m]) => (
        <div key={media} className="mt-1">
          <p className="text-xs text-iron-300">
            <code className="font-mono">{media}</code>
          </p>
          {m.schema && !(m.schema.type === "string" && !m.schema.properties && media !== "application/json") ? <SchemaView schema={m.schema} components={components} /> : null}
        </div>
      ))}
    </>
  );
}

function Operation({ method, path, op, id, components }: { method: string; path: string; op: DocOperation; id: string; components: Components }) {
  const params = op.parameters ?? [];
  const curl = op["x-codeSamples"]?.find((s) => s.label === "curl");
  return (
    <section aria-labelledby={id} className="border-t border-soot-700 pt-6">
      <h3 id={id} className="font-mono text-lg">
        <span className="mr-2 rounded bg-soot-800 px-2 py-0.5 text-sm uppercase text-ember-400">{method}</span>
        {path}
      </h3>
      {op.summary ? <p className="mt-1 font-semibold">{op.summary}</p> : null}
      {op.description ? (
        <div className="mt-2">
          <Markdown source={op.description} />
        </div>
      ) : null}
      {params.length ? (
        <>
          <h4 className="mt-4 text-base">Parameters</h4>
          <ul className="mt-1 space-y-1">
            {params.map((p) => (
              <li key={`${p.in}-${p.name}`} className="flex flex-wrap items-baseline gap-2">
                <span className="text-xs text-iron-300">{p.in}</span>
                <SchemaField name={p.name} schema={{ ...(p.schema ?? {}), description: p.description ?? p.schema?.description }} required={!!p.required} />
              </li>
            ))}
          </ul>
        </>
      ) : null}
      {op.requestBody ? (
        <>
          <h4 className="mt-4 text-base">Body</h4>
          {op.requestBody.description ? <p className="text-sm text-iron-300">{inline(op.requestBody.description)}</p> : null}
          <Body content={op.requestBody.content} components={components} />
        </>
      ) : null}
      <h4 className="mt-4 text-base">Answers</h4>
      <dl className="mt-1 space-y-3">
        {Object.entries(op.responses).map(([status, r]) => (
          <div key={status}>
            <dt className="font-mono text-sm">
              <span className={status.startsWith("2") || status.startsWith("3") ? "text-signal-ok" : "text-signal-warning"}>{status}</span>
            </dt>
            <dd className="ml-4">
              <p className="text-sm">{inline(r.description)}</p>
              {r.headers ? (
                <ul className="text-xs text-iron-300">
                  {Object.entries(r.headers).map(([h, v]) => (
                    <li key={h}>
                      header <code className="font-mono">{h}</code>: {v.description}
                    </li>
                  ))}
                </ul>
              ) : null}
              {r.content && !(Object.keys(r.content).length === 1 && r.content["application/json"]?.schema?.$ref === "#/components/schemas/ApiError") ? (
                <Body content={r.content} components={components} />
              ) : r.content ? (
                <p className="text-xs text-iron-300">
                  JSON, the <a href="#api-error">ApiError</a> shape.
                </p>
              ) : null}
            </dd>
          </div>
        ))}
      </dl>
      {curl ? (
        <>
          <h4 className="mt-4 text-base">Example</h4>
          <Code text={curl.source} label={`curl example for ${method.toUpperCase()} ${path}`} />
        </>
      ) : null}
    </section>
  );
}

export function ApiReference({ doc }: { doc: ApiDoc }) {
  const components = doc.components?.schemas ?? {};
  const ops = operationsOf(doc);
  const tags = (doc.tags ?? []).filter((t) => ops.some((o) => o.op.tags?.includes(t.name)));
  return (
    <div className="mx-auto max-w-5xl px-6 py-10">
      <header>
        <p className="text-sm text-iron-300">Reference · version {doc.info.version}</p>
        <h1>{doc.info.title}</h1>
        <p className="mt-2 text-sm">
          The same document as JSON: <a href="/api/openapi.json">/api/openapi.json</a> (OpenAPI 3.1).
        </p>
      </header>
      <nav aria-label="Operations" className="mt-6 rounded-md border border-soot-700 p-4">
        <h2 className="text-base">Contents</h2>
        <ul className="mt-2 grid gap-x-6 gap-y-1 text-sm sm:grid-cols-2">
          <li>
            <a href="#introduction">Introduction and what stays the same</a>
          </li>
          <li>
            <a href="#api-error">Errors: the ApiError shape</a>
          </li>
          {ops.map((o) => (
            <li key={o.id}>
              <a href={`#${o.id}`}>
                <span className="font-mono uppercase">{o.method}</span> <span className="font-mono">{o.path}</span>
              </a>
            </li>
          ))}
        </ul>
      </nav>
      <section aria-labelledby="introduction" className="mt-8">
        <h2 id="introduction">Introduction</h2>
        <div className="mt-3">{doc.info.description ? <Markdown source={doc.info.description} /> : null}</div>
      </section>
      <section aria-labelledby="api-error" className="mt-8">
        <h2 id="api-error">Errors</h2>
        <p className="mt-2 max-w-3xl">Every JSON error answer, on every route, has this shape:</p>
        {components.ApiError ? <SchemaView schema={components.ApiError} components={components} /> : null}
      </section>
      {tags.map((t) => (
        <section key={t.name} aria-labelledby={`tag-${slugify(t.name)}`} className="mt-10">
          <h2 id={`tag-${slugify(t.name)}`}>{t.name}</h2>
          {t.description ? <p className="mt-1 text-iron-300">{t.description}</p> : null}
          <div className="mt-4 space-y-8">
            {ops
              .filter((o) => o.op.tags?.includes(t.name))
              .map((o) => (
                <Operation key={o.id} {...o} components={components} />
              ))}
          </div>
        </section>
      ))}
    </div>
  );
}
