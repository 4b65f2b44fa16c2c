// The document cannot drift from the routes: every route under /api in app/routes.ts has an
// operation (and every operation a route), every operation has its answers, error shape and a
// curl example; and the answer checker the tests use (tests/api-contract.ts) accepts the
// document's own shapes and refuses others.
import { readFileSync } from "node:fs";
import type { RouteConfigEntry } from "@react-router/dev/routes";
import { describe, expect, it } from "vitest";
import routes from "../../routes";
import { ApiContract } from "../../../tests/api-contract";
import { API_VERSION, apiDocument } from "./document";
import { OPERATIONS } from "./operations";

/** Every route path under /api with its module, in the document's form (`{buildId}`), the catch-all left out. */
function apiRoutes(): { path: string; file: string }[] {
  const out: { path: string; file: string }[] = [];
  const walk = (entries: RouteConfigEntry[], parent: string) => {
    for (const e of entries) {
      const here = e.path ? `${parent.replace(/\/$/, "")}/${e.path}` : parent;
      if (e.children) walk(e.children, here);
      else if (here.startsWith("/api/") && !here.endsWith("*")) out.push({ path: here.replace(/:([A-Za-z0-9_]+)/g, "{$1}"), file: e.file });
    }
  };
  walk(routes as RouteConfigEntry[], "");
  return out;
}

const doc = apiDocument() as unknown as { openapi: string; info: { version: string; description: string }; paths: Record<string, Record<string, { responses: Record<string, unknown>; "x-codeSamples"?: { source: string }[]; security?: unknown[] }>>; components: { schemas: Record<string, unknown>; securitySchemes: Record<string, { scheme?: string }> } };

describe("the API document", () => {
  it("has every route under /api in app/routes.ts, and nothing else", () => {
    const inRoutes = apiRoutes();
    expect(inRoutes.length).toBeGreaterThan(10);
    expect(inRoutes.filter((r) => !doc.paths[r.path]).map((r) => `${r.path} (${r.file}) is missing from app/lib/api-doc/operations.ts`)).toEqual([]);
    const known = new Set(inRoutes.map((r) => r.path));
    expect(Object.keys(doc.paths).filter((p) => !known.has(p))).toEqual([]);
  });

  it("documents each route module's methods: a loader answers GET, an action a non-GET (except those that only answer 405)", () => {
    // Route modules whose loader or action only refuses with a 405 naming the method to use.
    const onlyRefuses = new Set(["GET /api/validate", "GET /api/render", "action /api/builds/{buildId}/render"]);
    for (const r of apiRoutes()) {
      const source = readFileSync(`app/${r.file}`, "utf8");
      const methods = Object.keys(doc.paths[r.path] ?? {});
      if (/export (async )?function loader\b/.test(source) && !onlyRefuses.has(`GET ${r.path}`)) expect(methods, r.path).toContain("get");
      if (/export (async )?function action\b/.test(source) && !onlyRefuses.has(`action ${r.path}`)) expect(methods.some((m) => m !== "get"), r.path).toBe(true);
    }
  });

  it("is OpenAPI 3.1 with a version, bearer tokens, the error shape, answers and a curl example for every operation", () => {
    expect(doc.openapi).toBe("3.1.0");
    expect(doc.info.version).toBe(API_VERSION);
    expect(doc.info.description).toContain("What stays the same");
    expect(doc.components.securitySchemes.bearerToken.scheme).toBe("bearer");
    expect(doc.components.schemas.ApiError).toBeTruthy();
    for (const op of OPERATIONS) {
      const d = doc.paths[op.path][op.method];
      expect(d["x-codeSamples"]?.[0].source, `${op.method} ${op.path}`).toMatch(/^(curl|jq) /);
      if (op.permission) expect(op.curl, `${op.method} ${op.path}`).toContain("Bearer $HB_TOKEN");
      else expect(d.security).toEqual([]);
      if (op.path.includes("{buildId}")) expect(op.curl).toContain("$KESTREL");
      expect(Object.keys(d.responses)).toContain("default");
      expect(Object.keys(d.responses).some((s) => s.startsWith("2"))).toBe(true);
    }
  });

  it("the answer checker accepts what the document says and names what it does not", () => {
    const c = new ApiContract(doc as never);
    const answer = (method: string, path: string, status: number, body: unknown, contentType = "application/json; charset=utf-8") => ({ method, url: `http://x.test${path}`, status, contentType, body: Buffer.from(typeof body === "string" ? body : JSON.stringify(body)) });
    expect(c.check(answer("GET", "/api/builds/abc", 404, { status: 404, error: "No such build." }))).toBeNull();
    expect(c.check(answer("GET", "/api/builds/abc", 404, { error: "No such build." }))).toMatch(/must have required property 'status'/);
    expect(c.check(answer("GET", "/api/me", 200, { user: { id: "u", name: "n", githubLogin: null, email: null }, role: "owner", workshop: { id: "w", name: "Ember & Anvil Props" } }))).toBeNull();
    expect(c.check(answer("GET", "/api/me", 200, { user: { id: "u" }, role: "boss", workshop: {} }))).toMatch(/does not match/);
    expect(c.check(answer("GET", "/api/builds/abc/render", 200, "#define X 1\n", "text/plain; charset=utf-8"))).toBeNull();
    expect(c.check(answer("GET", "/api/builds/abc/render", 200, "<p>", "text/html"))).toMatch(/answered text\/html/);
    expect(c.check(answer("GET", "/api/no/such/route", 404, { status: 404, error: "There is no API route." }))).toBeNull();
    expect(c.check(answer("GET", "/api/validate", 405, { status: 405, error: "Send the config with POST." }))).toBeNull();
    expect(c.check(answer("GET", "/api/no/such/route", 200, {}))).toMatch(/no documented operation/);
    expect(c.check(answer("GET", "/builds", 200, "<html>", "text/html"))).toBeNull();
  });
});
