// Every API answer a test sees, checked against the OpenAPI document (decision 020): the
// operation is found by method and path, the status by its entry (or `default`), the media type
// must be one the document names, and a JSON body must validate (ajv, JSON Schema 2020-12, as
// OpenAPI 3.1 uses) against the schema the document gives for that route and status.
// Wired once: the e2e fixtures check every APIRequestContext answer and every /api answer a page
// fetches; Vitest tests call `checkApiAnswer` on what they fetch.
import Ajv2020 from "ajv/dist/2020.js";

type Media = Record<string, { schema?: unknown }>;
type Doc = { paths: Record<string, Record<string, { responses: Record<string, { content?: Media }> }>>; components?: { schemas?: Record<string, unknown> } };

export type Answer = { method: string; url: string; status: number; contentType: string; body: Buffer };

const pointer = (...parts: string[]) => parts.map((p) => encodeURIComponent(p.replace(/~/g, "~0").replace(/\//g, "~1"))).join("/");

/** `/api/builds/{buildId}/looks.png` → a pattern matching one segment per parameter. */
const pathPattern = (path: string) =>
  new RegExp(`^${path.split("/").map((seg) => (/^\{[^}]+\}$/.test(seg) ? "[^/]+" : seg.replace(/[.*+?^$()|[\]\\{}]/g, "\\$&"))).join("/")}$`);

const decodes = (path: string) => {
  try {
    decodeURIComponent(path);
    return true;
  } catch {
    return false;
  }
};

export class ApiContract {
  private ajv = new Ajv2020({ strict: false, validateFormats: false, allErrors: true });
  private routes: { path: string; re: RegExp; literal: number }[];

  constructor(private doc: Doc) {
    this.ajv.addSchema(doc as object, "openapi");
    this.routes = Object.keys(doc.paths)
      .map((path) => ({ path, re: pathPattern(path), literal: path.replace(/\{[^}]+\}/g, "").length }))
      .sort((a, b) => b.literal - a.literal);
  }

  /** What is wrong with this answer by the document, or null. */
  check(a: Answer): string | null {
    const url = new URL(a.url);
    if (!url.pathname.startsWith("/api/") && url.pathname !== "/api") return null;
    const method = a.method.toLowerCase();
    if (method === "head" || method === "options" || (a.status >= 300 && a.status < 400 && a.status !== 304)) return null;
    const where = `${a.method.toUpperCase()} ${url.pathname} → ${a.status}`;
    // An address that is not valid percent-encoded UTF-8 is refused by the HTTP server itself
    // (react-router-serve's Express, with its own small HTML page) before the app sees it.
    if (a.status === 400 && !decodes(url.pathname)) return null;
    // The router serves /api/builds/ as /api/builds.
    const path = url.pathname.length > 1 ? url.pathname.replace(/\/+$/, "") : url.pathname;
    const route = this.routes.find((r) => r.re.test(path));
    const op = route ? this.doc.paths[route.path][method] : undefined;
    if (!route || !op) {
      // An unknown address or a method the route does not offer: a 4xx in the one error shape.
      if (a.status < 400 || a.status >= 500) return `${where}: no documented operation, and the answer is not a 4xx error`;
      return this.validate(a, "#/components/schemas/ApiError", `${where} (undocumented address or method)`);
    }
    const statusKey = op.responses[String(a.status)] ? String(a.status) : op.responses.default ? "default" : null;
    if (!statusKey) return `${where}: status not in the document for ${method.toUpperCase()} ${route.path}`;
    const content = op.responses[statusKey].content;
    const media = a.contentType.split(";")[0].trim().toLowerCase();
    if (!content) return a.body.length === 0 || a.status === 304 ? null : `${where}: the document says no body, the answer has ${a.body.length} bytes (${media})`;
    if (!content[media]) return `${where}: answered ${media || "no type"}, the document names ${Object.keys(content).join(", ")}`;
    if (media !== "application/json") return null;
    return this.validate(a, `#/${pointer("paths", route.path, method, "responses", statusKey, "content", media, "schema")}`, where);
  }

  private validate(a: Answer, ref: string, where: string): string | null {
    let body: unknown;
    try {
      body = JSON.parse(a.body.toString("utf8"));
    } catch {
      return `${where}: the body is not JSON`;
    }
    const validate = this.ajv.getSchema(`openapi${ref}`);
    if (!validate) return `${where}: no schema at ${ref}`;
    if (validate(body)) return null;
    const errs = (validate.errors ?? []).slice(0, 5).map((e) => `${e.instancePath || "(body)"} ${e.message}${e.params ? ` ${JSON.stringify(e.params)}` : ""}`);
    return `${where}: the body does not match the document: ${errs.join("; ")}`;
  }
}

const contracts = new Map<string, Promise<ApiContract>>();

/** The contract of the server at `baseUrl`, read once from its /api/openapi.json. */
export function contractOf(baseUrl: string): Promise<ApiContract> {
  let c = contracts.get(baseUrl);
  if (!c) {
    c = fetch(new URL("/api/openapi.json", baseUrl)).then(async (r) => {
      if (!r.ok) throw new Error(`GET /api/openapi.json answered ${r.status}`);
      return new ApiContract((await r.json()) as Doc);
    });
    contracts.set(baseUrl, c);
  }
  return c;
}

/** For Vitest tests: check a fetched answer (its body is read from a clone) and fail with the mismatch. */
export async function checkApiAnswer(baseUrl: string, method: string, response: Response): Promise<void> {
  const contract = await contractOf(baseUrl);
  const body = Buffer.from(await response.clone().arrayBuffer());
  const problem = contract.check({ method, url: response.url, status: response.status, contentType: response.headers.get("content-type") ?? "", body });
  if (problem) throw new Error(`API answer not as documented: ${problem}`);
}
