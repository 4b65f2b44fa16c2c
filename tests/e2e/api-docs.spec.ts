// The API reference as a script writer meets it: public, readable without signing in, every
// route with a curl example against the demo workshop, and the JSON document behind it; an
// unknown API address answers a JSON 404 in the one error shape.
import { test, expect, tokenFor, BASE_URL } from "./fixtures";

test("the API reference is public and readable, with a curl example per route and the error shape", async ({ page, pageErrors }) => {
  void pageErrors;
  const res = await page.goto("/api/docs");
  expect(res?.status()).toBe(200);
  await expect(page).toHaveTitle("API reference · Hiltbench");
  await expect(page.getByRole("heading", { level: 1, name: "Hiltbench API" })).toBeVisible();
  await expect(page.getByText(/Reference · version \d+\.\d+\.\d+/)).toBeVisible();
  await expect(page.getByRole("heading", { name: "What stays the same" })).toBeVisible();
  await expect(page.getByText("Authorization: Bearer <token>", { exact: false }).first()).toBeVisible();

  // Every operation has a section with a curl example; the contents list links to each.
  const doc = (await (await page.request.get("/api/openapi.json")).json()) as { paths: Record<string, Record<string, unknown>> };
  const operations = Object.entries(doc.paths).flatMap(([path, item]) => Object.keys(item).map((m) => `${m.toUpperCase()} ${path}`));
  expect(operations.length).toBeGreaterThan(15);
  for (const op of operations) await expect(page.getByRole("region", { name: `curl example for ${op}`, exact: true })).toHaveCount(1);

  // Reading one route as a person would: from the contents to its section.
  await page.getByRole("navigation", { name: "Operations" }).getByRole("link", { name: "PUT /api/builds/{buildId}/config", exact: true }).click();
  const put = page.getByRole("region", { name: "PUT /api/builds/{buildId}/config", exact: true });
  await expect(put).toBeInViewport();
  await expect(put.getByText("Permission: edit:build")).toBeVisible();
  await expect(put.getByRole("region", { name: /curl example/ })).toContainText('-X PUT -H "Content-Type: application/json"');
  await expect(put.getByRole("region", { name: /curl example/ })).toContainText("$KESTREL");
  await expect(put.getByText("409", { exact: true })).toBeVisible();

  // The library has its own section; a DELETE reads like the rest, and types are named, never generated ids.
  const library = page.getByRole("region", { name: "Library", exact: true });
  await expect(library).toContainText("The workshop's preset library");
  const del = library.getByRole("region", { name: "DELETE /api/presets/{presetId}/versions/{v}", exact: true });
  await expect(del.getByText("Permission: publish:library")).toBeVisible();
  await expect(del.getByRole("region", { name: /curl example/ })).toContainText('-X DELETE "$HB/api/presets/$ASHFALL/versions/1"');
  await expect(page.getByRole("region", { name: "GET /api/builds/{buildId}/preset-updates", exact: true })).toContainText("array of MergeConflict");
  await expect(page.locator("main, body").first()).not.toContainText("__schema");

  // The error shape is documented once, and the introduction sets up the demo workshop.
  const errors = page.getByRole("region", { name: "Errors" });
  await expect(errors).toContainText("status");
  await expect(errors).toContainText("diagnostics");
  await expect(page.getByRole("region", { name: "Introduction" })).toContainText("Ember & Anvil Props");
  await expect(page.getByRole("region", { name: "Introduction" })).toContainText("/api/builds?q=Kestrel");
  await expect(page.getByRole("region", { name: "Introduction" })).toContainText("/api/presets?q=Ashfall");
});

test("the document is served as OpenAPI 3.1 JSON without sign-in; an unknown API address is a JSON 404, an unoffered method a JSON 405", async ({ request, sql }) => {
  const doc = await request.get(`${BASE_URL}/api/openapi.json`, { headers: { Cookie: "" } });
  expect(doc.status()).toBe(200);
  expect(doc.headers()["content-type"]).toContain("application/json");
  const body = await doc.json();
  expect(body.openapi).toBe("3.1.0");
  expect(body.info.version).toMatch(/^\d+\.\d+\.\d+$/);
  expect(body.components.securitySchemes.bearerToken).toMatchObject({ type: "http", scheme: "bearer" });

  for (const [method, path] of [["GET", "/api/no/such/route"], ["POST", "/api/nothing-here"], ["GET", "/api/builds/x/no-such-part"]] as const) {
    const r = await request.fetch(`${BASE_URL}${path}`, { method, headers: { Cookie: "" }, ...(method === "POST" ? { data: {} } : {}) });
    expect(r.status(), path).toBe(404);
    expect(r.headers()["content-type"]).toContain("application/json");
    expect(await r.json()).toEqual({ status: 404, error: expect.stringContaining("/api/docs") });
  }

  // A method a route does not offer: 405 in the same shape, pointing at the reference.
  for (const [method, path] of [["PUT", "/api/me"], ["POST", "/api/builds"], ["POST", "/api/openapi.json"]] as const) {
    const r = await request.fetch(`${BASE_URL}${path}`, { method, headers: { Cookie: "" }, data: {} });
    expect(r.status(), `${method} ${path}`).toBe(405);
    expect(await r.json()).toEqual({ status: 405, error: `${method} is not offered at ${path}; the methods each route takes are listed at /api/docs.` });
  }

  // With a token: the same one shape for a refusal the route makes.
  const token = await tokenFor(sql, "demo-builder");
  const bad = await request.put(`${BASE_URL}/api/builds/00000000-0000-4000-8000-000000000000/config`, { headers: { Authorization: `Bearer ${token}` }, data: { config: {}, version: 0 } });
  expect(bad.status()).toBe(404);
  expect(await bad.json()).toEqual({ status: 404, error: expect.any(String) });
});

test("an unknown API address in a browser shows the JSON not-found answer, not a page", async ({ page }) => {
  const res = await page.goto("/api/builds/x/no-such-part");
  expect(res?.status()).toBe(404);
  await expect(page.locator("body")).toContainText('"status":404');
  await expect(page.locator("body")).toContainText("There is no API route");
});

test("a builder finds the reference from the Account page, next to their tokens", async ({ page, signIn }) => {
  await signIn("demo-builder");
  await page.goto("/account");
  await page.getByRole("link", { name: "API reference" }).click();
  await expect(page).toHaveURL(/\/api\/docs$/);
  await expect(page.getByRole("heading", { level: 1, name: "Hiltbench API" })).toBeVisible();
});
