// Every API operation, once: what it reads (path, query, body), what it answers for each status,
// who may call it, and a curl example against the demo workshop. The OpenAPI document
// (document.ts) is generated from this list; a test fails when a route under /api in
// app/routes.ts has no entry here. Adding a route = one entry in OPERATIONS (see DEVELOPERS.md).
import { z } from "zod";
import type { Permission } from "../auth/permissions";
import { bundleQuerySchema } from "../bundle/query";
import { buildQuerySchema } from "../forms/build-forms";
import { renderBodyDoc } from "../rendering/request";
import { revisionListQuerySchema } from "../revisions/params";
import {
  buildAnswer,
  buildListAnswer,
  bundlePlanAnswer,
  configAnswer,
  configPutBody,
  configSavedAnswer,
  diffAnswer,
  fontUploadAnswer,
  meAnswer,
  revisionAnswer,
  revisionListAnswer,
  validateAnswer,
  validateBody,
} from "./shapes";

/** What one status of an operation answers: JSON with a schema, or another media type. */
export type Answer = { description: string; json?: z.ZodType; media?: "text/plain" | "text/x-diff" | "image/png" | "image/svg+xml" | "application/zip" | "text/html"; headers?: Record<string, string> };

export type Operation = {
  method: "get" | "post" | "put";
  /** The OpenAPI path: `/api/builds/{buildId}` for the route `builds/:buildId` under the api prefix. */
  path: string;
  summary: string;
  description: string;
  /** The permission the route asks for (app/lib/auth/permissions.ts); null for a public operation. */
  permission: Permission | null;
  tag: "Account" | "Builds" | "Config" | "Rendering" | "Revisions" | "Fonts" | "Bundle" | "Pictures" | "Reference";
  pathParams?: z.ZodObject;
  query?: z.ZodObject;
  body?: { media: "application/json" | "multipart/form-data"; schema: z.ZodType; description?: string };
  /** Answers other than errors, by status. */
  answers: Record<number, Answer>;
  /** Statuses answered with the one error shape (ApiError); 401, 429 and 503 are added for every signed-in operation. */
  errors: Record<number, string>;
  /** A shell example using the demo workshop (see the document's introduction for $HB, $HB_TOKEN, $KESTREL). */
  curl: string;
};

const buildId = z.object({ buildId: z.string().meta({ description: "The build's id (GET /api/builds answers it).", example: "$KESTREL" }) });
const AUTH = '-H "Authorization: Bearer $HB_TOKEN"';
const NOT_YOURS = "No such build in your workshop (or, for a client, not their build).";

export const OPERATIONS: Operation[] = [
  {
    method: "get",
    path: "/api/me",
    tag: "Account",
    summary: "Who the token belongs to",
    description: "The signed-in person (or the token's owner), their role and their workshop. A cheap way for a script to check its token.",
    permission: "use:api",
    answers: { 200: { description: "The person, role and workshop.", json: meAnswer } },
    errors: {},
    curl: `curl ${AUTH} "$HB/api/me"`,
  },
  {
    method: "get",
    path: "/api/builds",
    tag: "Builds",
    summary: "List the workshop's builds",
    description: "Searchable, sortable and paged on the server; a client sees only their own builds. Unknown query values fall back to the defaults.",
    permission: "view:builds",
    query: buildQuerySchema,
    answers: { 200: { description: "One page of builds.", json: buildListAnswer } },
    errors: {},
    curl: `curl ${AUTH} "$HB/api/builds?q=Kestrel&sort=name&dir=asc"`,
  },
  {
    method: "get",
    path: "/api/builds/{buildId}",
    tag: "Builds",
    summary: "One build and its rig",
    description: "The build's details and its rig (the hardware sheet of its current config).",
    permission: "view:builds",
    pathParams: buildId,
    answers: { 200: { description: "The build.", json: buildAnswer } },
    errors: { 404: NOT_YOURS },
    curl: `curl ${AUTH} "$HB/api/builds/$KESTREL"`,
  },
  {
    method: "get",
    path: "/api/builds/{buildId}/config",
    tag: "Config",
    summary: "Read a build's config",
    description: "The current config in the hiltbench.config/2 form and its version; send the version back with PUT.",
    permission: "view:builds",
    pathParams: buildId,
    answers: { 200: { description: "The config and its version.", json: configAnswer } },
    errors: { 404: NOT_YOURS },
    curl: `curl ${AUTH} "$HB/api/builds/$KESTREL/config" > kestrel.json`,
  },
  {
    method: "put",
    path: "/api/builds/{buildId}/config",
    tag: "Config",
    summary: "Replace a build's config",
    description:
      "Validates the config and stores it as a new revision, only from the version it was read at. A config with errors is refused (422, with every diagnostic) and nothing is stored; warnings are stored and answered.",
    permission: "edit:build",
    pathParams: buildId,
    body: { media: "application/json", schema: configPutBody },
    answers: { 200: { description: "Stored: the new version and revision, with the remaining warnings.", json: configSavedAnswer } },
    errors: { 400: "The body is not JSON, too large or deep, lacks config or version, or message is not text.", 404: NOT_YOURS, 405: "Not a PUT.", 409: "The config changed since that version (currentVersion says which to read).", 413: "The body is larger than 2 MB.", 422: "The validator refused the config (diagnostics)." },
    curl: `jq '{config: .config, version: .version, message: "Brighter chamber"}' kestrel.json |\n  curl ${AUTH} -X PUT -H "Content-Type: application/json" --data-binary @- "$HB/api/builds/$KESTREL/config"`,
  },
  {
    method: "post",
    path: "/api/validate",
    tag: "Config",
    summary: "Validate a config",
    description: "Runs the validator and the power figures over any posted config. A config with errors is still a 200: the diagnostics are the answer. GET answers 405.",
    permission: "use:api",
    body: { media: "application/json", schema: validateBody },
    answers: { 200: { description: "Every diagnostic, and the power figures when the config has the model's shape.", json: validateAnswer } },
    errors: { 400: "The body is not JSON, too large or deep, or has no config field.", 405: "Not a POST.", 413: "The body is larger than 2 MB." },
    curl: `jq '{config: .config}' kestrel.json |\n  curl ${AUTH} -H "Content-Type: application/json" --data-binary @- "$HB/api/validate"`,
  },
  {
    method: "post",
    path: "/api/render",
    tag: "Rendering",
    summary: "Render a config or a build through a template",
    description:
      "Renders a posted config, or a build's current config, through a built-in template, a workshop template version or posted template source, within a 500 ms limit. GET answers 405.",
    permission: "use:api",
    body: { media: "application/json", schema: renderBodyDoc, description: 'Exactly one of "config" and "buildId", and a template reference.' },
    answers: { 200: { description: "The rendered text.", media: "text/plain", headers: { "X-Template": "The template used, as name@version." } } },
    errors: { 400: "Not a JSON object, both or neither of config and buildId, or a bad template reference.", 404: "No such build or template in your workshop.", 405: "Not a POST.", 413: "The body is larger than 1 MB.", 422: "The config has no model shape, or the template did not render (errors with line and column)." },
    curl: `curl ${AUTH} -H "Content-Type: application/json" \\\n  -d "{\\"buildId\\": \\"$KESTREL\\", \\"template\\": {\\"builtin\\": \\"generic-header\\"}}" "$HB/api/render"`,
  },
  {
    method: "get",
    path: "/api/builds/{buildId}/render",
    tag: "Rendering",
    summary: "Render a build (or one of its revisions)",
    description:
      "The build's current config rendered through its pinned template, or the one named; revision=n renders that saved revision (staff and reviewers), always the same bytes. download=1 adds a file name.",
    permission: "view:builds",
    pathParams: buildId,
    query: z.object({
      template: z.string().optional().meta({ description: "A template id or built-in name (generic-header, readable-copy)." }),
      version: z.string().optional().meta({ description: "That template's version (a whole number from 1); a built-in's earlier version too." }),
      revision: z.string().optional().meta({ description: "Render this revision number instead of the current config (view:revisions)." }),
      download: z.string().optional().meta({ description: "Any value: answer with Content-Disposition: attachment." }),
    }),
    answers: { 200: { description: "The rendered text.", media: "text/plain", headers: { "X-Template": "The template used, as name@version." } } },
    errors: { 400: "A version or revision that is not a whole number.", 403: "A client asked for a revision.", 404: "No such build, template, version or revision.", 422: "The template did not render (errors with line and column)." },
    curl: `curl ${AUTH} "$HB/api/builds/$KESTREL/render?template=generic-header" -o kestrel.h`,
  },
  {
    method: "get",
    path: "/api/builds/{buildId}/looks.png",
    tag: "Pictures",
    summary: "A channel's look over time, as a picture",
    description: "One channel's look in one preset through the demonstration sequence: one row per frame at 60 fps, base on the left. The ETag follows the config version.",
    permission: "view:builds",
    pathParams: buildId,
    query: z.object({ preset: z.string().meta({ description: "A preset id of the build.", example: "ashfall" }), channel: z.string().meta({ description: "A channel id of the build's rig.", example: "crystal" }) }),
    answers: { 200: { description: "A PNG.", media: "image/png" }, 304: { description: "Not modified (If-None-Match matched the ETag)." } },
    errors: { 400: "No such preset or channel (the message lists the build's).", 404: NOT_YOURS },
    curl: `curl ${AUTH} "$HB/api/builds/$KESTREL/looks.png?preset=ashfall&channel=crystal" -o ashfall-crystal.png`,
  },
  {
    method: "get",
    path: "/api/builds/{buildId}/wiring.svg",
    tag: "Pictures",
    summary: "The rig's wiring picture",
    description: "The board, pins, strips, buttons, cell and leads of the build's rig as a deterministic SVG. A rig the validator refuses answers 422 with a picture that says why (not JSON).",
    permission: "view:builds",
    pathParams: buildId,
    answers: {
      200: { description: "The wiring picture.", media: "image/svg+xml" },
      304: { description: "Not modified (If-None-Match matched the ETag)." },
      422: { description: "A picture naming why the rig cannot be drawn.", media: "image/svg+xml" },
    },
    errors: { 404: NOT_YOURS },
    curl: `curl ${AUTH} "$HB/api/builds/$KESTREL/wiring.svg" -o kestrel-wiring.svg`,
  },
  {
    method: "get",
    path: "/api/builds/{buildId}/revisions",
    tag: "Revisions",
    summary: "List a build's revisions",
    description: "Every saved revision's metadata, newest first by default, paged on the server (one revision's config is at /revisions/{n}).",
    permission: "view:revisions",
    pathParams: buildId,
    query: revisionListQuerySchema,
    answers: { 200: { description: "One page of revisions.", json: revisionListAnswer } },
    errors: { 400: "A query value out of range.", 403: "Clients see no revisions.", 404: NOT_YOURS },
    curl: `curl ${AUTH} "$HB/api/builds/$KESTREL/revisions?perPage=10"`,
  },
  {
    method: "get",
    path: "/api/builds/{buildId}/revisions/{n}",
    tag: "Revisions",
    summary: "One revision and its config",
    description: "A saved revision: who saved it and when, its message, its validator counts and its config.",
    permission: "view:revisions",
    pathParams: buildId.extend({ n: z.string().meta({ description: "The revision number, from 1.", example: "1" }) }),
    answers: { 200: { description: "The revision.", json: revisionAnswer } },
    errors: { 400: "n is not a revision number.", 403: "Clients see no revisions.", 404: "No such build or revision." },
    curl: `curl ${AUTH} "$HB/api/builds/$KESTREL/revisions/1"`,
  },
  {
    method: "get",
    path: "/api/builds/{buildId}/diff",
    tag: "Revisions",
    summary: "Compare two revisions",
    description: "The model diff in words and the text diff of the two revisions rendered through one template. With Accept: text/x-diff, the unified diff alone (patch applies it to the from render).",
    permission: "view:revisions",
    pathParams: buildId,
    query: z.object({
      from: z.string().meta({ description: "A revision number.", example: "1" }),
      to: z.string().meta({ description: "A revision number; from after to reads backwards.", example: "2" }),
      template: z.string().optional().meta({ description: "The template to render both with (the later revision's by default)." }),
    }),
    answers: { 200: { description: "The comparison (JSON), or the unified diff with Accept: text/x-diff.", json: diffAnswer, media: "text/x-diff" } },
    errors: { 400: "from or to missing or not a revision number.", 403: "Clients see no revisions.", 404: "No such build, revision or template.", 422: "The text diff is too large for text/x-diff." },
    curl: `curl ${AUTH} "$HB/api/builds/$KESTREL/diff?from=1&to=2"\ncurl ${AUTH} -H "Accept: text/x-diff" "$HB/api/builds/$KESTREL/diff?from=1&to=2" > kestrel-1-2.patch`,
  },
  {
    method: "post",
    path: "/api/builds/{buildId}/fonts/{fontId}/files",
    tag: "Fonts",
    summary: "Upload a font's files",
    description: "WAV files and/or zips for one font of the build, streamed; every WAV is checked. All or nothing: a refused upload changes nothing.",
    permission: "upload:font",
    pathParams: buildId.extend({ fontId: z.string().meta({ description: "A font id of the build's config.", example: "northlight" }) }),
    body: { media: "multipart/form-data", schema: z.object({ files: z.array(z.string().meta({ format: "binary" })).meta({ description: "WAV files and/or zips of them." }) }) },
    answers: { 200: { description: "The font report after the upload.", json: fontUploadAnswer } },
    errors: { 400: "A file that is not a WAV or zip, or a bad name.", 404: "No such build, or no such font in its config.", 405: "Not a POST.", 413: "Over the upload caps.", 415: "Not multipart/form-data.", 422: "The files were refused (the message says which and why)." },
    curl: `curl ${AUTH} -F "files=@northlight.zip" "$HB/api/builds/$KESTREL/fonts/northlight/files"`,
  },
  {
    method: "get",
    path: "/api/builds/{buildId}/bundle",
    tag: "Bundle",
    summary: "The SD card bundle",
    description: "One zip for the card: rendered config, fonts in folders, a readable copy, the handoff sheet and a checksum manifest; byte-identical for the same inputs. check=1 answers the plan as JSON.",
    permission: "view:builds",
    pathParams: buildId,
    query: bundleQuerySchema,
    answers: { 200: { description: "The zip (or, with check=1, its plan as JSON).", media: "application/zip", json: bundlePlanAnswer } },
    errors: { 400: "A query value that is not allowed (field names it).", 404: NOT_YOURS, 422: "The card cannot be built: a name clash, a file too large, or a card too small (findings)." },
    curl: `curl ${AUTH} "$HB/api/builds/$KESTREL/bundle?check=1"\ncurl ${AUTH} -OJ "$HB/api/builds/$KESTREL/bundle?names=8.3&card=16"`,
  },
  {
    method: "get",
    path: "/api/openapi.json",
    tag: "Reference",
    summary: "This document",
    description: "The OpenAPI 3.1 document of the API, public. The same document is shown, readable, at /api/docs.",
    permission: null,
    answers: { 200: { description: "The OpenAPI document.", json: z.looseObject({ openapi: z.string(), info: z.looseObject({ version: z.string() }), paths: z.record(z.string(), z.unknown()) }) } },
    errors: {},
    curl: `curl "$HB/api/openapi.json" -o hiltbench-openapi.json`,
  },
  {
    method: "get",
    path: "/api/docs",
    tag: "Reference",
    summary: "The API reference page",
    description: "This document as a readable page, public, with no sign-in.",
    permission: null,
    answers: { 200: { description: "An HTML page.", media: "text/html" } },
    errors: {},
    curl: `curl "$HB/api/docs"`,
  },
];
