// Template saves are checked in the render workers (decision 011): while ten hostile saves of
// about 250 KB, each with thousands of errors, are being checked, /healthz keeps answering
// quickly, and every refused save answers a capped error list (the first 50, the total, the kinds).
import type { APIRequestContext } from "@playwright/test";
import { test, expect, BASE_URL, signInRequest } from "./fixtures";
import { insertTemplate, replaceSource, uniq } from "./template-helpers";

const LINE = "@( config.nope )@ @( x |> nofilter )@\n";
/** About 250 KB (under the 256 K character limit of a template) of two kinds of error. */
const HOSTILE = LINE.repeat(Math.floor(250_000 / LINE.length));

async function timedHealth(request: APIRequestContext): Promise<number> {
  const t0 = performance.now();
  const r = await request.get("/healthz");
  await r.body();
  expect(r.status()).toBe(200);
  return performance.now() - t0;
}

test("ten hostile template saves at once: /healthz is not held (median under 100 ms) and each answer is capped", async ({ playwright, sql }) => {
  test.setTimeout(120_000);
  const name = `hostile-save-${uniq()}`;
  const id = await insertTemplate(sql, name, ["one"]);
  const owner = await playwright.request.newContext({ baseURL: BASE_URL, extraHTTPHeaders: { Origin: BASE_URL } });
  const probe = await playwright.request.newContext({ baseURL: BASE_URL });
  try {
    await signInRequest(owner, "demo-owner");
    // Warm the workers and the page module.
    expect((await owner.post(`/templates/${id}`, { form: { intent: "save", source: "@( config.nope )@", latest: "1" } })).status()).toBe(422);
    const baseline: number[] = [];
    for (let i = 0; i < 5; i++) baseline.push(await timedHealth(probe));

    const t0 = performance.now();
    let running = 10;
    const saves = Array.from({ length: 10 }, () =>
      owner.post(`/templates/${id}`, { form: { intent: "save", source: HOSTILE, latest: "1" } }).then(async (r) => {
        running--;
        return { status: r.status(), body: await r.body() };
      }),
    );
    const during: number[] = [];
    while (running > 0) {
      during.push(await timedHealth(probe));
      await new Promise((r) => setTimeout(r, 20));
    }
    const answers = await Promise.all(saves);
    const allMs = performance.now() - t0;
    const sorted = [...during].sort((a, b) => a - b);
    const p = (q: number) => sorted[Math.min(sorted.length - 1, Math.floor(q * sorted.length))];
    console.log(
      `healthz alone: median ${[...baseline].sort((a, b) => a - b)[2].toFixed(1)} ms; during ten ${(HOSTILE.length / 1024).toFixed(0)} KB hostile saves (${allMs.toFixed(0)} ms in all): ` +
        `${during.length} probes, median ${p(0.5).toFixed(1)} ms, p95 ${p(0.95).toFixed(1)} ms, max ${sorted[sorted.length - 1].toFixed(1)} ms; answers ${answers.map((a) => `${a.status}/${(a.body.byteLength / 1024).toFixed(1)} KB`).join(", ")}`,
    );
    expect(during.length).toBeGreaterThan(5);
    // Timings are measured, not asserted (they belong to `npm run bench`), except for what tells
    // an event-loop compile from a worker one: on the event loop each 244 KB save held /healthz
    // about 1.5 s, so most probes would wait that long; in the workers the median probe is not held
    // at all. The median is asserted (under 100 ms) only when /healthz alone is quick (under 30 ms
    // median), since other test runs on the same 2 cores slow every probe. The maximum is logged:
    // one probe can meet a garbage collection or the workers' start (decision 011).
    const quiet = [...baseline].sort((a, b) => a - b)[2] < 30;
    if (quiet) expect(p(0.5)).toBeLessThan(100);
    else console.log("healthz bound not asserted: the machine is busy (healthz alone ≥ 30 ms median)");
    for (const a of answers) {
      expect(a.status).toBe(422);
      expect(a.body.byteLength).toBeLessThan(64 * 1024);
    }
    // The save's answer (a data request, as the editor's fetcher makes it) lists 50 of the total.
    const r = await owner.post(`/templates/${id}.data`, { form: { intent: "save", source: HOSTILE, latest: "1" } });
    const text = await r.text();
    expect(text).toMatch(/The template has \d{4,} errors; nothing was saved/);
    expect(text).toContain("unknown filter");
    expect((await sql.query("SELECT count(*)::int AS n FROM template_versions WHERE template_id = $1", [id])).rows[0].n).toBe(1);
  } finally {
    await owner.dispose();
    await probe.dispose();
    await sql.query("DELETE FROM templates WHERE id = $1", [id]);
  }
});

test("the editor shows the first 50 problems of a refused save with the total", async ({ page, signIn, sql }) => {
  test.setTimeout(90_000);
  const id = await insertTemplate(sql, `capped-${uniq()}`, ["one"]);
  try {
    await signIn("demo-owner");
    await page.goto(`/templates/${id}`);
    const source = "@( config.nope )@\n".repeat(120);
    await replaceSource(page, source);
    await expect(page.getByTestId("problems-capped")).toContainText("The first 50 of 120 errors are listed");
    await expect(page.getByTestId("problem")).toHaveCount(50);
    await page.getByRole("button", { name: /^Save/ }).click();
    await expect(page.getByTestId("save-errors-capped")).toContainText("The first 50 of 120 errors are listed");
    await expect(page.getByTestId("save-error")).toHaveCount(50);
  } finally {
    await sql.query("DELETE FROM templates WHERE id = $1", [id]);
  }
});
