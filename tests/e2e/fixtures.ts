// Shared Playwright fixtures: sign-in through the local fake GitHub as a fixture (the same
// HTTP steps the browser makes, without repeated clicks), a database handle for arranging data
// the UI cannot reach (another workshop), a guard that fails a test on unexpected errors
// in the page, and the accessibility check on every page a test visits (a11y.ts, decision 016).
import { test as base, expect, type APIRequestContext, type Page, type TestInfo } from "@playwright/test";
import { A11yError, a11yViolations, expectAccessible, showsHtml } from "./a11y";
import { createHash, randomBytes } from "node:crypto";
import pg from "pg";

export const BASE_URL = process.env.BASE_URL ?? "http://127.0.0.1:5178";
/** The accessibility check runs in every e2e run (decision 016); HB_A11Y=0 turns it off for a quick local run only. */
export const A11Y_CHECK = process.env.HB_A11Y !== "0";
/**
 * A test annotation: this test's pages are checked for accessibility as it ends, not right after
 * each page.goto (for a test that must catch a brief state right after the page loads).
 */
export const A11Y_AT_END = "a11y-at-end";

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
  // Then check the page for accessibility (once per address in a test); pages reached by links
  // and forms, and the page as the test leaves it, are checked at the end. Time spent checking
  // is added to the test's timeout (the checks at the end have the fixture's own), so a slow machine never fails a test for it.
  page: [async ({ page }, use, testInfo) => {
    const goto = page.goto.bind(page);
    const visited = new Set<string>();
    const checkedHere = new Set<string>();
    page.on("framenavigated", (frame) => {
      if (frame === page.mainFrame()) visited.add(frame.url());
    });
    page.goto = async (url, options) => {
      const response = await goto(url, options);
      if (response && (response.headers()["content-type"] ?? "").startsWith("text/html")) {
        await page.locator("html[data-hydrated]").waitFor({ state: "attached", timeout: 15_000 });
        const key = urlKey(page.url());
        if (A11Y_CHECK && !checkedHere.has(key) && !testInfo.annotations.some((a) => a.type === A11Y_AT_END)) {
          await timed(testInfo, () => expectAccessible(page, `after page.goto(${JSON.stringify(url)}) on ${page.url()}`));
          checkedHere.add(key);
          if (response.status() < 400) checkedThisRun.add(key);
        }
      }
      return response;
    };
    await use(page);
    if (A11Y_CHECK && testInfo.status === testInfo.expectedStatus) await checkAtTestEnd(page, visited);
  }, { scope: "test", timeout: 300_000 }], // its own time for the checks at the end, apart from the test's
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

/** Pages (path and query) found clean in this run: a page reached by a link is opened again at a test's end only if no test has checked it. */
const checkedThisRun = new Set<string>();
const urlKey = (url: string) => {
  const u = new URL(url);
  return u.pathname + u.search;
};

/** Runs `f` with room to finish (a scan can take tens of seconds on a loaded machine), then gives the test the time it took on top of its timeout. */
const CHECK_ROOM_MS = 120_000;
async function timed<T>(testInfo: TestInfo, f: () => Promise<T>): Promise<T> {
  const started = Date.now();
  testInfo.setTimeout(testInfo.timeout + CHECK_ROOM_MS);
  try {
    return await f();
  } finally {
    testInfo.setTimeout(testInfo.timeout - CHECK_ROOM_MS + (Date.now() - started));
  }
}

/** The page as the test left it, then each page of the app it navigated to that no check has seen yet, opened afresh. */
async function checkAtTestEnd(page: Page, visited: Set<string>) {
  const failures: A11yError[] = [];
  const origin = new URL(BASE_URL).origin;
  const unchecked = [...visited].filter((u) => u.startsWith(origin) && !checkedThisRun.has(urlKey(u)));

  if (!page.isClosed()) {
    await (async () => {
      await page.waitForLoadState("load").catch(() => {});
      if (!(await showsHtml(page))) return;
      await page.locator("html[data-hydrated]").waitFor({ state: "attached", timeout: 5_000 }).catch(() => {});
      // A navigation the test started last may still replace the document; check what it lands on.
      const violations = await a11yViolations(page).catch(async () => {
        await page.waitForLoadState("load");
        return a11yViolations(page);
      });
      if (violations.length > 0) failures.push(new A11yError(`at the end of the test on ${page.url()}`, violations));
    })();
  }

  for (const url of unchecked) {
    await (async () => {
      const fresh = await page.context().newPage();
      try {
        const response = await fresh.goto(url);
        if (!response || !(response.headers()["content-type"] ?? "").startsWith("text/html")) return;
        await fresh.locator("html[data-hydrated]").waitFor({ state: "attached", timeout: 15_000 });
        const violations = await a11yViolations(fresh);
        if (violations.length > 0) failures.push(new A11yError(`on ${url} (reached during the test, opened again at its end)`, violations));
        else if (response.status() < 400) checkedThisRun.add(urlKey(url));
      } finally {
        await fresh.close();
      }
    })();
  }
  if (failures.length > 0) throw new Error(failures.map((f) => f.message).join("\n\n"));
}

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
