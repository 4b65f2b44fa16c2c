// The OpenAPI 3.1 document, generated with zod-openapi from the operations list and the same zod
// schemas the routes answer with. Built once per process; served at /api/openapi.json and read by
// the reference page /api/docs (decision 020).
import { createDocument, type ZodOpenApiOperationObject, type ZodOpenApiPathsObject, type ZodOpenApiResponsesObject } from "zod-openapi";
import { can } from "../auth/permissions";
import { ROLES } from "../db/types";
import { OPERATIONS, type Operation } from "./operations";
import { apiErrorSchema } from "./shapes";

/**
 * The API's version. Major: a change a client must adapt to (a field removed or renamed, a
 * status or meaning changed). Minor: additions (a route, an optional field, a query value).
 */
export const API_VERSION = "2.0.0";

export const SETUP = `export HB=http://127.0.0.1:5173          # where Hiltbench runs (npm start prints it)
export HB_TOKEN=hbt_...                     # Account → API tokens (or: npm run api-token -- demo-builder)
KESTREL=$(curl -s -H "Authorization: Bearer $HB_TOKEN" "$HB/api/builds?q=Kestrel" | jq -r '.builds[0].id')
ASHFALL=$(curl -s -H "Authorization: Bearer $HB_TOKEN" "$HB/api/presets?q=Ashfall" | jq -r '.presets[0].id')`;

export const STABILITY = [
  "Within one major version (1.x) nothing is removed or renamed: routes, methods, query parameters, body fields, answer fields and their types stay as documented here.",
  "New things arrive in minor versions: routes, optional query parameters and body fields, answer fields, error details, diagnostic codes. A client should ignore fields it does not know.",
  "Every JSON error has the ApiError shape: status, error (a message for a person; its wording may change) and, where they apply, field, diagnostics, errors with total and kinds, findings, currentVersion, latestVersion, conflicts, builds. Match on the status and on codes, never on message text.",
  "Diagnostic codes are stable: a code is never renamed or given another meaning. Messages and hints may be reworded.",
  "The config exchange form is named by its format field (hiltbench.config/2); an older form is still accepted and upgraded as it is read.",
  "The same stored revision rendered through the same template version gives the same bytes; so does the bundle for the same inputs.",
  "Rate limits (429 with Retry-After) and the render time limit may change with the server's settings.",
];

const ERROR_DESCRIPTIONS: Record<number, string> = {
  401: "No session and no valid bearer token (or a malformed Authorization header).",
  403: "Your role does not allow this, or a cross-site request was refused.",
  429: "Too many requests for this token or address; Retry-After says when to try again.",
  503: "The database is not answering, or renders are queued past their limit; Retry-After says when to try again.",
};

const errorAnswer = (description: string) => ({ description, content: { "application/json": { schema: apiErrorSchema } } });

type ResponseEntry = { description: string; content?: Record<string, { schema: unknown }>; headers?: Record<string, unknown> };

function responses(op: Operation): ZodOpenApiResponsesObject {
  const out: Record<string, ResponseEntry> = {};
  for (const [status, a] of Object.entries(op.answers)) {
    const content: Record<string, { schema: unknown }> = {};
    if (a.json) content["application/json"] = { schema: a.json };
    if (a.media) content[a.media] = { schema: a.media.startsWith("text/") || a.media === "image/svg+xml" ? { type: "string" } : { type: "string", format: "binary" } };
    out[status] = {
      description: a.description,
      ...(Object.keys(content).length ? { content } : {}),
      ...(a.headers ? { headers: Object.fromEntries(Object.entries(a.headers).map(([h, d]) => [h, { description: d, schema: { type: "string" } }])) } : {}),
    };
  }
  const errors: Record<number, string> = { ...op.errors };
  if (op.permission) {
    errors[401] ??= ERROR_DESCRIPTIONS[401];
    errors[403] ??= ERROR_DESCRIPTIONS[403];
    errors[429] ??= ERROR_DESCRIPTIONS[429];
  }
  errors[503] ??= ERROR_DESCRIPTIONS[503];
  for (const [status, description] of Object.entries(errors)) {
    const existing = out[status];
    if (existing) existing.content = { ...(existing.content ?? {}), "application/json": { schema: apiErrorSchema } };
    else out[status] = errorAnswer(description);
  }
  out.default = errorAnswer("Any other failure (500: an unexpected problem; nothing was changed).");
  return out as ZodOpenApiResponsesObject;
}

/** The roles that hold a permission, in words, from the one policy module. */
const rolesWith = (p: NonNullable<Operation["permission"]>) => ROLES.filter((r) => can(r, p)).join(", ");

function operation(op: Operation): ZodOpenApiOperationObject {
  return {
    operationId: `${op.method}${op.path.replace(/^\/api/, "").replace(/[{}]/g, "").replace(/[^a-zA-Z0-9]+(.)?/g, (_, c: string | undefined) => (c ?? "").toUpperCase())}`,
    tags: [op.tag],
    summary: op.summary,
    description: `${op.description}${op.permission ? `\n\nPermission: \`${op.permission}\` (${rolesWith(op.permission)}).` : "\n\nPublic: no sign-in."}`,
    ...(op.permission ? {} : { security: [] }),
    ...(op.pathParams || op.query ? { requestParams: { ...(op.pathParams ? { path: op.pathParams } : {}), ...(op.query ? { query: op.query } : {}) } } : {}),
    ...(op.body ? { requestBody: { required: true, ...(op.body.description ? { description: op.body.description } : {}), content: { [op.body.media]: { schema: op.body.schema } } } } : {}),
    responses: responses(op),
    "x-codeSamples": [{ lang: "Shell", label: "curl", source: op.curl }],
  } as ZodOpenApiOperationObject;
}

function build() {
  const paths: ZodOpenApiPathsObject = {};
  for (const op of OPERATIONS) (paths[op.path] ??= {})[op.method] = operation(op);
  return createDocument(
    {
      openapi: "3.1.0",
      info: {
        title: "Hiltbench API",
        version: API_VERSION,
        description: [
          "JSON routes for scripts and for the app's own pages: builds, configs, validation, rendering, revisions and diffs, font uploads, the SD card bundle, pictures and the preset library.",
          "Authenticate with a personal API token (Account → API tokens) as `Authorization: Bearer <token>`; the app's own pages use their session cookie. What you may do follows your role in the workshop.",
          "The examples use the demo workshop, Ember & Anvil Props, and its build Kestrel. Set up once:",
          "```sh\n" + SETUP + "\n```",
          "An address under /api that no route serves answers 404 in the ApiError shape.",
          "## What stays the same\n" + STABILITY.map((s) => `- ${s}`).join("\n"),
        ].join("\n\n"),
      },
      servers: [{ url: "/", description: "This server" }],
      security: [{ bearerToken: [] }, { session: [] }],
      tags: [
        { name: "Account", description: "Who you are." },
        { name: "Builds", description: "The workshop's commissions." },
        { name: "Config", description: "A build's config: read, replace, validate." },
        { name: "Rendering", description: "Configs through templates." },
        { name: "Revisions", description: "Saved revisions and their diffs." },
        { name: "Fonts", description: "Sound font uploads." },
        { name: "Bundle", description: "The SD card zip." },
        { name: "Release", description: "The bench check of a revision and the releases of a build." },
        { name: "Pictures", description: "Look timelines and the wiring picture." },
        { name: "Library", description: "The workshop's preset library: versions, adding to builds, updates by merge, roll-out, preset files." },
        { name: "Requests", description: "What clients ask for after handoff, and the workshop's answers." },
        { name: "Reference", description: "This document." },
      ],
      components: {
        securitySchemes: {
          bearerToken: { type: "http", scheme: "bearer", description: "A personal API token (hbt_…), made on the Account page; it acts with its owner's role." },
          session: { type: "apiKey", in: "cookie", name: "__session", description: "The app's own session cookie (signed-in pages)." },
        },
      },
      paths,
    },
    { reused: "inline" },
  );
}

let cached: ReturnType<typeof createDocument> | null = null;

/** The OpenAPI document (the same object every call). */
export function apiDocument(): ReturnType<typeof createDocument> {
  cached ??= build();
  return cached;
}
