// Shared Playwright fixtures: sign-in through the local fake GitHub as a fixture (the same
// HTTP steps the browser makes, without repeated clicks), a database handle for arranging data
// the UI cannot reach (another workshop), and a guard that fails a test on unexpected errors
// in the page.
import { test as base, expect, type APIRequestContext, type Page } from "@playwright/test";
import { createHash, randomBytes } from "node:crypto";
import pg from "pg";

export const BASE_URL = process.env.BASE_URL ?? "http://127.0.0.1:5178";

export async function signInAs(page: Page, login: string, next = "/builds") {
  await signInRequest(page.request, login, next);
}

/** Sign an API request context in (its cookie jar then holds the session). */
export async function signInRequest(request: APIRequestContext, login: string, next = "/builds") {
  const start = await request.post("/auth/github", { form: { next }, headers: { Origin: BASE_URL }, maxRedirects: 0 });
  expect(start.status()).toBe(302);
  const authorize = new URL(start.headers()["location"]);
  const approve = new URL("/login/oauth/approve", authorize.origin);
  for (const k of ["redirect_uri", "state", "code_challenge", "code_challenge_method", "client_id"])
    approve.searchParams.set(k, authorize.searchParams.get(k) ?? "");
  approve.searchParams.set("login", login);
  const granted = await request.get(approve.toString(), { maxRedirects: 0 });
  expect(granted.status()).toBe(302);
  const done = await request.get(granted.headers()["location"], { maxRedirects: 0 });
  expect(done.status(), await done.text()).toBe(302);
}

type Fixtures = { signIn: (login: string) => Promise<void>; sql: pg.Pool; pageErrors: string[] };

export const test = base.extend<Fixtures>({
  // After a full page load, wait until React has hydrated (the root layout sets
  // html[data-hydrated]); a click that lands before then would hit a button with no handler yet.
  page: async ({ page }, use) => {
    const goto = page.goto.bind(page);
    page.goto = async (url, options) => {
      const response = await goto(url, options);
      if (response && (response.headers()["content-type"] ?? "").startsWith("text/html"))
        await page.locator("html[data-hydrated]").waitFor({ state: "attached", timeout: 15_000 });
      return response;
    };
    await use(page);
  },
  pageErrors: async ({ page }, use) => {
    const errors: string[] = [];
    page.on("pageerror", (e) => errors.push(`pageerror: ${e.message}`));
    page.on("console", (m) => {
      // A 4xx document is expected in some tests; the browser logs it as a failed load.
      if (m.type() === "error" && !m.text().startsWith("Failed to load resource")) errors.push(`console: ${m.text()}`);
    });
    await use(errors);
    expect(errors, "unexpected errors in the page").toEqual([]);
  },
  signIn: async ({ page, pageErrors }, use) => {
    void pageErrors;
    await use((login) => signInAs(page, login));
  },
  sql: async ({}, use) => {
    const pool = new pg.Pool({ connectionString: process.env.DATABASE_URL, max: 2 });
    await use(pool);
    await pool.end();
  },
});

export { expect };

/** A personal API token for `login`, stored as the app stores them (hash and prefix), as a script would hold it. */
export async function tokenFor(sql: pg.Pool, login: string, name = "e2e"): Promise<string> {
  const token = `hbt_${randomBytes(32).toString("base64url")}`;
  const user = await sql.query("SELECT id FROM users WHERE github_login = $1", [login]);
  await sql.query("INSERT INTO api_tokens (user_id, name, token_hash, prefix) VALUES ($1, $2, $3, $4)", [
    user.rows[0].id,
    name,
    createHash("sha256").update(token).digest("hex"),
    token.slice(0, 10),
  ]);
  return token;
}

export async function buildIdByName(sql: pg.Pool, name: string): Promise<string> {
  const r = await sql.query("SELECT id FROM builds WHERE name = $1 ORDER BY created_at LIMIT 1", [name]);
  if (!r.rows[0]) throw new Error(`no build named ${name}`);
  return r.rows[0].id;
}
