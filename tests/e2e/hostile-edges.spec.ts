// Hostile input at every edge (decision 011), against the built server `npm test` starts:
// 1. every action route refuses a cross-site request (a foreign Origin, or a browser's
//    Sec-Fetch-Site: cross-site with no Origin), logout included, while scripts with a bearer
//    token and no cookie still work without any Origin;
// 2. a fast-check property over random text (NUL and lone surrogates included) and numbers
//    (2^31 and beyond included) sent to every API route and form action: no answer is a 500,
//    every API error is JSON, and what /api/validate accepts the PUT stores.
import fs from "node:fs";
import type { APIRequestContext } from "@playwright/test";
import fc from "fast-check";
import type pg from "pg";
import { test, expect, buildIdByName, BASE_URL, signInRequest, tokenFor } from "./fixtures";
import { insertTemplate, uniq } from "./template-helpers";

type Ids = { build: string; template: string; token: string; lib: string };
type Action = { route: string; method: "POST" | "PUT" | "DELETE"; path: (i: Ids) => string; form?: Record<string, string>; json?: unknown };

/** One state-changing request per action route of app/routes.ts (the last test checks the list is whole). */
const ACTIONS: Action[] = [
  { route: "routes/logout.ts", method: "POST", path: () => "/logout", form: {} },
  { route: "routes/auth.github.ts", method: "POST", path: () => "/auth/github", form: { next: "/builds" } },
  { route: "routes/login.code.tsx", method: "POST", path: () => "/login/code", form: { intent: "send", email: "client-one@example.test" } },
  { route: "routes/builds.new.tsx", method: "POST", path: () => "/builds/new", form: { name: "Cross-site build", status: "intake" } },
  { route: "routes/builds.$buildId._index.tsx", method: "POST", path: (i) => `/builds/${i.build}?index`, form: { intent: "archive" } },
  { route: "routes/builds.$buildId.rig.tsx", method: "POST", path: (i) => `/builds/${i.build}/rig`, form: { version: "0" } },
  { route: "routes/builds.$buildId.checks.tsx", method: "POST", path: (i) => `/builds/${i.build}/checks`, form: { version: "0" } },
  { route: "routes/builds.$buildId.revisions.tsx", method: "POST", path: (i) => `/builds/${i.build}/revisions`, form: { intent: "restore", n: "1", version: "0" } },
  { route: "routes/builds.$buildId.reviews._index.tsx", method: "POST", path: (i) => `/builds/${i.build}/reviews`, form: { intent: "request", note: "cross-site" } },
  { route: "routes/builds.$buildId.reviews.$requestId.tsx", method: "POST", path: (i) => `/builds/${i.build}/reviews/00000000-0000-0000-0000-000000000000`, form: { intent: "comment", body: "cross-site" } },
  { route: "routes/builds.$buildId.fonts.tsx", method: "POST", path: (i) => `/builds/${i.build}/fonts`, form: { intent: "add-font", name: "Cross-site font" } },
  { route: "routes/api.builds.$buildId.fonts.$fontId.files.ts", method: "POST", path: (i) => `/api/builds/${i.build}/fonts/any-font/files`, form: {} },
  { route: "routes/builds.$buildId.render.tsx", method: "POST", path: (i) => `/builds/${i.build}/render`, form: { intent: "pin", template: "generic-header" } },
  { route: "routes/workshop.tsx", method: "POST", path: () => "/workshop", form: { intent: "invite", target: "cross-site@example.test", role: "builder" } },
  { route: "routes/account.tsx", method: "POST", path: () => "/account", form: { intent: "create", name: "cross-site token" } },
  { route: "routes/templates._index.tsx", method: "POST", path: () => "/templates", form: { name: "cross-site-template" } },
  { route: "routes/templates.$templateId.tsx", method: "POST", path: (i) => `/templates/${i.template}`, form: { source: "changed", latest: "1" } },
  { route: "routes/api.validate.ts", method: "POST", path: () => "/api/validate", json: { config: {} } },
  { route: "routes/api.render.ts", method: "POST", path: () => "/api/render", json: { config: {}, template: { builtin: "generic-header" } } },
  { route: "routes/api.builds.$buildId.config.ts", method: "PUT", path: (i) => `/api/builds/${i.build}/config`, json: { config: {}, version: 0 } },
  { route: "routes/api.builds.$buildId.render.ts", method: "POST", path: (i) => `/api/builds/${i.build}/render`, json: {} },
  { route: "routes/builds.$buildId.looks.tsx", method: "POST", path: (i) => `/builds/${i.build}/looks`, form: { intent: "add-from-library", choice: "", fontId: "ashfall", configVersion: "0" } },
  { route: "routes/library._index.tsx", method: "POST", path: () => "/library", form: {} },
  { route: "routes/library.$presetId.tsx", method: "POST", path: (i) => `/library/${i.lib}`, form: { intent: "dry-run" } },
  { route: "routes/api.presets.ts", method: "POST", path: () => "/api/presets", json: { changelog: "cross-site", preset: {} } },
  { route: "routes/api.presets.$presetId.versions.ts", method: "POST", path: (i) => `/api/presets/${i.lib}/versions`, json: { baseVersion: 2, changelog: "cross-site", preset: {} } },
  { route: "routes/api.presets.$presetId.versions.$v.ts", method: "DELETE", path: (i) => `/api/presets/${i.lib}/versions/2` },
  { route: "routes/api.presets.$presetId.rollout.ts", method: "POST", path: (i) => `/api/presets/${i.lib}/rollout`, json: { apply: false } },
  { route: "routes/api.builds.$buildId.presets.ts", method: "POST", path: (i) => `/api/builds/${i.build}/presets`, json: { libraryPresetId: "00000000-0000-0000-0000-000000000000", fontId: "ashfall", configVersion: 0 } },
  { route: "routes/api.builds.$buildId.preset-updates.ts", method: "POST", path: (i) => `/api/builds/${i.build}/preset-updates`, json: { presetId: "ashfall", configVersion: 0 } },
  { route: "routes/builds.$buildId.release.tsx", method: "POST", path: (i) => `/builds/${i.build}/release`, form: { intent: "tick", revision: "1", item: "card:matches", ticked: "1" } },
  { route: "routes/api.builds.$buildId.releases.ts", method: "POST", path: (i) => `/api/builds/${i.build}/releases`, json: { revision: 1, note: "cross-site" } },
  { route: "routes/api.builds.$buildId.revisions.$n.bench-check.ts", method: "PUT", path: (i) => `/api/builds/${i.build}/revisions/1/bench-check`, json: { item: "card:matches", ticked: true } },
  { route: "routes/builds.$buildId.requests.tsx", method: "POST", path: (i) => `/builds/${i.build}/requests`, form: { intent: "ask", kind: "font", message: "cross-site" } },
  { route: "routes/api.builds.$buildId.requests.ts", method: "POST", path: (i) => `/api/builds/${i.build}/requests`, json: { kind: "font", message: "cross-site" } },
  { route: "routes/api.builds.$buildId.requests.$requestId.ts", method: "PUT", path: (i) => `/api/builds/${i.build}/requests/00000000-0000-0000-0000-000000000000`, json: { status: "done", version: 1 } },
  { route: "routes/api.not-found.ts", method: "POST", path: () => "/api/no-such-route", json: {} },
];

const EVIL = "http://evil.test";

async function arrange(sql: pg.Pool): Promise<Ids> {
  const kestrel = await buildIdByName(sql, "Kestrel");
  // A build of its own (a copy of Kestrel), so random saves never disturb other specs' data.
  const name = `Merlin-edges-${uniq()}`;
  const build = (
    await sql.query(
      `INSERT INTO builds (workshop_id, name, client_name, status, config, config_version, config_saved_at)
       SELECT workshop_id, $2, client_name, status, config, 0, now() FROM builds WHERE id = $1 RETURNING id`,
      [kestrel, name],
    )
  ).rows[0].id;
  const template = await insertTemplate(sql, `edges-${uniq()}`, ["one"]);
  const token = await tokenFor(sql, "demo-owner", `edges ${uniq()}`);
  const lib = (await sql.query("SELECT id FROM library_presets WHERE name = 'Ashfall embers'")).rows[0].id as string;
  return { build, template, token, lib };
}

async function cleanUp(sql: pg.Pool, ids: Ids, since: Date) {
  // Random names include "Kestrel": the seeded builds are older than `since`, so only this run's go.
  await sql.query("DELETE FROM builds WHERE id = $1 OR created_at >= $2", [ids.build, since]);
  await sql.query("DELETE FROM templates WHERE id = $1 OR created_at >= $2", [ids.template, since]);
  await sql.query("DELETE FROM invitations WHERE created_at >= $1", [since]);
  await sql.query("DELETE FROM library_presets WHERE created_at >= $1", [since]);
  await sql.query("DELETE FROM api_tokens WHERE created_at >= $1 AND name <> 'e2e'", [since]);
}

async function snapshot(sql: pg.Pool, ids: Ids) {
  const q = async (text: string, params: unknown[] = []) => (await sql.query(text, params)).rows;
  return JSON.stringify({
    build: await q("SELECT name, config_version, archived_at, pinned_template_id FROM builds WHERE id = $1", [ids.build]),
    builds: await q("SELECT count(*)::int AS n FROM builds"),
    templates: await q("SELECT count(*)::int AS n FROM template_versions"),
    invitations: await q("SELECT count(*)::int AS n FROM invitations"),
    signInCodes: await q("SELECT count(*)::int AS n FROM sign_in_codes"),
    tokens: await q("SELECT count(*)::int AS n FROM api_tokens WHERE revoked_at IS NULL"),
    reviews: await q("SELECT (SELECT count(*)::int FROM review_requests) AS requests, (SELECT count(*)::int FROM review_comments) AS comments"),
    release: await q("SELECT (SELECT count(*)::int FROM bench_check_ticks) AS ticks, (SELECT count(*)::int FROM releases) AS releases"),
    clientRequests: await q("SELECT count(*)::int AS n FROM client_requests"),
    library: await q("SELECT (SELECT count(*)::int FROM library_presets) AS presets, (SELECT count(*)::int FROM library_versions) AS versions, (SELECT count(*)::int FROM build_preset_origins) AS origins"),
  });
}

function send(api: APIRequestContext, a: Action, ids: Ids, headers: Record<string, string>) {
  return api.fetch(a.path(ids), { method: a.method, headers, ...(a.json !== undefined ? { data: a.json } : { form: a.form }), maxRedirects: 0 });
}

test.describe("every state-changing request checks its origin", () => {
  test("a foreign Origin, or a cross-site browser request with none, is refused on every action route; nothing changes", async ({ playwright, sql }) => {
    const since = new Date();
    const ids = await arrange(sql);
    const owner = await playwright.request.newContext({ baseURL: BASE_URL });
    await signInRequest(owner, "demo-owner");
    try {
      const before = await snapshot(sql, ids);
      const failures: string[] = [];
      for (const a of ACTIONS) {
        const variants: Record<string, string>[] = [{ Origin: EVIL }, { "Sec-Fetch-Site": "cross-site" }, { Origin: EVIL, "Sec-Fetch-Site": "cross-site" }, { Origin: "null" }];
        for (const headers of variants) {
          const r = await send(owner, a, ids, headers);
          // 403 from our request guard; a page's document POST with a foreign Origin is refused
          // even earlier, with a 400, by React Router's own check (before any middleware runs).
          const refused = r.status() === 403 || (r.status() === 400 && !a.path(ids).startsWith("/api/") && "Origin" in headers);
          if (!refused) failures.push(`${a.method} ${a.path(ids)} with ${JSON.stringify(headers)}: ${r.status()}`);
          else if (a.path(ids).startsWith("/api/")) expect((await r.json()).error).toMatch(/Cross-site request refused/);
        }
      }
      expect(failures).toEqual([]);
      expect(await snapshot(sql, ids)).toBe(before);
      // Still signed in: the cross-site logout did nothing.
      expect((await owner.get("/api/me")).status()).toBe(200);
      // The same logout from our own page signs out.
      expect((await owner.post("/logout", { headers: { Origin: BASE_URL, "Sec-Fetch-Site": "same-origin" }, maxRedirects: 0 })).status()).toBe(302);
      expect((await owner.get("/api/me")).status()).toBe(401);
    } finally {
      await owner.dispose();
      await cleanUp(sql, ids, since);
    }
  });

  test("scripts with a bearer token and no cookie need no Origin", async ({ playwright, sql }) => {
    const since = new Date();
    const ids = await arrange(sql);
    const script = await playwright.request.newContext({ baseURL: BASE_URL, extraHTTPHeaders: { Authorization: `Bearer ${ids.token}` } });
    try {
      const got = await (await script.get(`/api/builds/${ids.build}/config`)).json();
      expect((await script.post("/api/validate", { data: { config: got.config } })).status()).toBe(200);
      expect((await script.post("/api/render", { data: { buildId: ids.build, template: { builtin: "generic-header" } } })).status()).toBe(200);
      const put = await script.put(`/api/builds/${ids.build}/config`, { data: { config: got.config, version: got.version } });
      expect(put.status(), await put.text()).toBe(200);
    } finally {
      await script.dispose();
      await cleanUp(sql, ids, since);
    }
  });

  test("the table names every route module with an action", () => {
    const withAction = fs
      .readdirSync("app/routes")
      .filter((f) => /export (async )?function action\b/.test(fs.readFileSync(`app/routes/${f}`, "utf8")))
      .map((f) => `routes/${f}`);
    expect(withAction.filter((r) => !ACTIONS.some((a) => a.route === r))).toEqual([]);
  });
});

// ------------------------------------------------------------------ random input, no 500s

/** Percent-encodes every UTF-16 unit as (generalised) UTF-8, so lone surrogates go out as bytes. */
function wtf8(s: string): string {
  let out = "";
  for (let i = 0; i < s.length; i++) {
    const c = s.charCodeAt(i);
    let cp = c;
    if (c >= 0xd800 && c <= 0xdbff && i + 1 < s.length) {
      const d = s.charCodeAt(i + 1);
      if (d >= 0xdc00 && d <= 0xdfff) {
        cp = 0x10000 + ((c - 0xd800) << 10) + (d - 0xdc00);
        i++;
      }
    }
    const bytes =
      cp < 0x80 ? [cp] : cp < 0x800 ? [0xc0 | (cp >> 6), 0x80 | (cp & 63)] : cp < 0x10000 ? [0xe0 | (cp >> 12), 0x80 | ((cp >> 6) & 63), 0x80 | (cp & 63)] : [0xf0 | (cp >> 18), 0x80 | ((cp >> 12) & 63), 0x80 | ((cp >> 6) & 63), 0x80 | (cp & 63)];
    out += bytes.map((b) => "%" + b.toString(16).toUpperCase().padStart(2, "0")).join("");
  }
  return out;
}
const formBody = (fields: Record<string, string>) =>
  Object.entries(fields)
    .map(([k, v]) => `${wtf8(k)}=${wtf8(v)}`)
    .join("&");

const hostileText = fc.oneof(
  fc.constantFrom("\u0000", "a\u0000b", "\ud800x", "x\udc00", "\ud83d", "x */ #include \"/etc/passwd\" /* \\", "", " ", "Kestrel", "2147483648", "-1", "1e999", "NaN"),
  fc.string({ unit: "binary", maxLength: 12 }),
  fc.string({ maxLength: 12 }).map((s) => s + "\u0000"),
  fc.string({ maxLength: 12 }).map((s) => s + "\ud800"),
);
const hostileNumber = fc.oneof(
  fc.constantFrom(2 ** 31, 2 ** 31 - 1, 2 ** 32, -(2 ** 31) - 1, Number.MAX_SAFE_INTEGER, 1e308, -1, 0, 0.5, 1),
  fc.integer(),
  fc.double({ noNaN: true, noDefaultInfinity: true }),
);
const hostileValue = fc.oneof(hostileText, hostileNumber, fc.constant(null), fc.boolean());
const numberText = fc.oneof(hostileNumber.map(String), hostileText);

/**
 * An idle keep-alive socket can be closed by the server just as the client reuses it
 * (ECONNRESET); a GET is retried once then, anything else is a failure.
 */
async function get(ctx: APIRequestContext, path: string) {
  try {
    return await ctx.get(path, { maxRedirects: 0 });
  } catch (e) {
    if (!String(e).includes("ECONNRESET")) throw e;
    return ctx.get(path, { maxRedirects: 0 });
  }
}

/**
 * A path that is not valid percent-encoded UTF-8 is refused by Express (inside
 * react-router-serve) with a plain-text 400 before the app runs: a 4xx, but not our JSON
 * (decision 011, "Not done").
 */
type Probe = { what: string; status: number; json: boolean; api: boolean; badPath?: boolean };

test.describe("random input at every edge never answers 500", () => {
  test.setTimeout(240_000);

  test("API routes and form actions: no 500, API errors are JSON, validate agrees with the save", async ({ playwright, sql }) => {
    const since = new Date();
    const ids = await arrange(sql);
    const api = await playwright.request.newContext({ baseURL: BASE_URL, extraHTTPHeaders: { Authorization: `Bearer ${ids.token}` } });
    const page = await playwright.request.newContext({ baseURL: BASE_URL, extraHTTPHeaders: { Origin: BASE_URL } });
    await signInRequest(page, "demo-owner");
    const base = (await (await get(api, `/api/builds/${ids.build}/config`)).json()).config;
    const probes: Probe[] = [];
    let agreements = 0;
    const record = async (what: string, api: boolean, r: Awaited<ReturnType<APIRequestContext["get"]>>) => {
      const type = r.headers()["content-type"] ?? "";
      let badPath = false;
      try {
        decodeURIComponent(new URL(r.url()).pathname);
      } catch {
        badPath = true;
      }
      probes.push({ what, status: r.status(), json: type.startsWith("application/json"), api, badPath });
      return r;
    };
    const form = (path: string, fields: Record<string, string>) =>
      page.fetch(path, { method: "POST", headers: { "Content-Type": "application/x-www-form-urlencoded" }, data: formBody(fields), maxRedirects: 0 });
    const rawJson = (method: string, path: string, body: unknown) =>
      // JSON.stringify writes lone surrogates as \ud800 escapes, which JSON.parse turns back into them.
      api.fetch(path, { method, headers: { "Content-Type": "application/json" }, data: JSON.stringify(body), maxRedirects: 0 });

    try {
      await fc.assert(
        fc.asyncProperty(hostileText, hostileText, hostileValue, numberText, fc.nat(6), async (t1, t2, v, n, pick) => {
          // ---- the config: one field set to a random value, validated, then PUT
          const config = structuredClone(base) as any; // eslint-disable-line @typescript-eslint/no-explicit-any
          const where = [
            () => (config.presets[0].name = v),
            () => (config.rig.board.profile = v),
            () => (config.rig.channels[0].pixels = v),
            () => (config.fonts[0].folder = v),
            () => (config.rig.power.cellCapacityMah = v),
            () => (config.presets[0].looks = { [String(t1)]: { layers: [] } }),
            () => (config.rig.channels[0].name = t1),
          ][pick];
          where();
          const current = (await (await get(api, `/api/builds/${ids.build}/config`)).json()).version;
          const validated = await record("POST /api/validate", true, await rawJson("POST", "/api/validate", { config }));
          const put = await record("PUT config", true, await rawJson("PUT", `/api/builds/${ids.build}/config`, { config, version: current }));
          if (validated.status() === 200) {
            const errors = (((await validated.json()) as { diagnostics: { severity: string }[] }).diagnostics).filter((d) => d.severity === "error");
            if (errors.length === 0) {
              expect(put.status(), `validate accepted ${JSON.stringify(config).slice(0, 200)}, the PUT answered ${await put.text()}`).toBe(200);
              agreements++;
            } else expect(put.status()).toBe(422);
          } else expect(put.status(), "validate refused the body; so must the PUT").toBe(validated.status());
          // Any version: stored only over the current one, else a 4xx.
          await record("PUT config version", true, await rawJson("PUT", `/api/builds/${ids.build}/config`, { config: base, version: typeof v === "number" ? v : n }));

          // ---- other API routes with random text and numbers in bodies, paths and queries
          await record("POST /api/render source", true, await rawJson("POST", "/api/render", { config: base, template: { source: `${t1}@( config.presets |> count )@` } }));
          await record("POST /api/render id", true, await rawJson("POST", "/api/render", { buildId: t1, template: { id: ids.template, version: v } }));
          await record("POST /api/render builtin", true, await rawJson("POST", "/api/render", { buildId: ids.build, template: { builtin: t2 } }));
          await record("GET /api/builds/:id", true, await get(api, `/api/builds/${wtf8(t1)}`));
          await record("GET render ?template&version", true, await get(api, `/api/builds/${ids.build}/render?template=${wtf8(t2)}&version=${wtf8(n)}`));
          await record("GET render ?version", true, await get(api, `/api/builds/${ids.build}/render?template=${ids.template}&version=${wtf8(n)}`));
          await record("GET looks.png", true, await get(api, `/api/builds/${ids.build}/looks.png?preset=${wtf8(t1)}&channel=${wtf8(t2)}`));
          await record("GET /api/builds ?q", true, await get(api, `/api/builds?q=${wtf8(t1)}&page=${wtf8(n)}`));
          await record("GET /api/presets ?q&tag", true, await get(api, `/api/presets?q=${wtf8(t1)}&tag=${wtf8(t2)}&page=${wtf8(n)}`));
          await record("GET /api/presets/:id", true, await get(api, `/api/presets/${wtf8(t1)}`));
          await record("GET /api/presets/:id/versions/:v", true, await get(api, `/api/presets/${ids.lib}/versions/${wtf8(n)}`));
          await record("POST /api/presets", true, await rawJson("POST", "/api/presets", { changelog: t2, preset: { name: t1, tags: [t2], notes: t1, looks: { "main-blade": { pixels: v, layers: [] } } } }));
          await record("PUT bench-check", true, await rawJson("PUT", `/api/builds/${ids.build}/revisions/${wtf8(n)}/bench-check`, { item: t1, ticked: v }));
          await record("POST releases", true, await rawJson("POST", `/api/builds/${ids.build}/releases`, { revision: v, note: t1, template: t2 }));
          await record("POST /api/builds/:id/presets", true, await rawJson("POST", `/api/builds/${ids.build}/presets`, { libraryPresetId: ids.lib, version: v, fontId: t1, configVersion: n, name: t2 }));

          // ---- form actions and page parameters, signed in as the owner from our own origin
          await record("POST /builds/new", false, await form("/builds/new", { name: t1, clientName: t2, status: "intake" }));
          await record("POST /builds/:id save", false, await form(`/builds/${ids.build}?index`, { intent: "save", name: t1 || "x", clientName: t2, hiltNotes: t1, status: "intake", clientUserId: "" }));
          await record("POST rig", false, await form(`/builds/${ids.build}/rig`, { version: n, "board.profile": t1, "channels.0.name": t2, "channels.0.pixels": n }));
          await record("POST render pin", false, await form(`/builds/${ids.build}/render`, { intent: "pin", template: ids.template, version: n }));
          await record("POST render apply", false, await form(`/builds/${ids.build}/render`, { intent: "apply", header: t1 || "x", configVersion: n }));
          await record("POST templates new", false, await form("/templates", { name: t1, from: t2 }));
          await record("POST template save", false, await form(`/templates/${ids.template}`, { intent: "save", source: t1, latest: n }));
          await record("POST template delete", false, await form(`/templates/${ids.template}`, { intent: "delete", confirm: t1 }));
          await record("POST account", false, await form("/account", { intent: "create", name: t1 }));
          await record("POST workshop", false, await form("/workshop", { intent: "invite", target: t1, role: t2 }));
          await record("GET template ?version", false, await get(page, `/templates/${ids.template}?version=${wtf8(n)}&compare=${wtf8(t1)}`));
          await record("GET template :id", false, await get(page, `/templates/${wtf8(t1)}`));
          await record("GET build :id", false, await get(page, `/builds/${wtf8(t1)}/render?template=${wtf8(t2)}&version=${wtf8(n)}`));
          await record("GET builds ?q", false, await get(page, `/builds?q=${wtf8(t1)}&status=${wtf8(t2)}&page=${wtf8(n)}`));
        }),
        { numRuns: 40, seed: Number(process.env.FC_SEED ?? Date.now() % 1_000_000), endOnFailure: true },
      );
      const fivehundreds = probes.filter((p) => p.status >= 500);
      const nonJson = probes.filter((p) => p.api && p.status >= 400 && !p.json && !(p.badPath && p.status === 400));
      console.log(`hostile edges: ${probes.length} requests, ${agreements} configs validate accepted and the PUT stored; statuses ${JSON.stringify(probes.reduce<Record<number, number>>((m, p) => ((m[p.status] = (m[p.status] ?? 0) + 1), m), {}))}`);
      expect(fivehundreds.map((p) => `${p.what}: ${p.status}`)).toEqual([]);
      expect(nonJson.map((p) => `${p.what}: ${p.status}`)).toEqual([]);
      expect(probes.some((p) => p.status === 400)).toBe(true);
    } finally {
      await api.dispose();
      await page.dispose();
      await cleanUp(sql, ids, since);
    }
  });

  test("the named cases: NUL, a lone surrogate and 2^31 answer 4xx naming the field", async ({ playwright, sql }) => {
    const since = new Date();
    const ids = await arrange(sql);
    const api = await playwright.request.newContext({ baseURL: BASE_URL, extraHTTPHeaders: { Authorization: `Bearer ${ids.token}` } });
    const page = await playwright.request.newContext({ baseURL: BASE_URL, extraHTTPHeaders: { Origin: BASE_URL } });
    await signInRequest(page, "demo-owner");
    try {
      const got = await (await get(api, `/api/builds/${ids.build}/config`)).json();
      for (const bad of ["a\u0000b", "\ud800x"]) {
        const config = structuredClone(got.config);
        config.presets[0].name = bad;
        const body = JSON.stringify({ config, version: got.version });
        const v = await api.post("/api/validate", { headers: { "Content-Type": "application/json" }, data: body });
        const p = await api.put(`/api/builds/${ids.build}/config`, { headers: { "Content-Type": "application/json" }, data: body });
        expect(v.status()).toBe(400);
        expect(p.status()).toBe(400);
        expect((await p.json()).error).toMatch(/presets\[0\]\.name/);
        expect((await v.json()).error).toMatch(/presets\[0\]\.name/);
      }
      const big = await api.put(`/api/builds/${ids.build}/config`, { data: { config: got.config, version: 2 ** 31 } });
      expect(big.status()).toBe(400);
      expect((await big.json()).error).toMatch(/"version"/);
      const q = await api.get(`/api/builds/${ids.build}/render?template=${ids.template}&version=${2 ** 31}`);
      expect(q.status()).toBe(400);
      expect((await q.json()).error).toMatch(/'version'/);
      const nul = await page.post("/builds/new", { headers: { "Content-Type": "application/x-www-form-urlencoded" }, data: "name=Kite%00&status=intake", maxRedirects: 0 });
      expect(nul.status()).toBe(400);
      expect(await nul.text()).toMatch(/field &#x27;name&#x27;|field 'name'/);
      const tv = await page.get(`/templates/${ids.template}?version=${2 ** 31}`);
      expect(tv.status()).toBe(400);
      expect((await api.get("/api/builds/%ED%A0%80")).status()).toBe(400);
      expect((await api.get("/api/builds/%00")).status()).toBe(400);
      expect((await (await api.get("/api/builds/%00")).json()).error).toMatch(/NUL/);
    } finally {
      await api.dispose();
      await page.dispose();
      await cleanUp(sql, ids, since);
    }
  });
});
