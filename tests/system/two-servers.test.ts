// Two app servers on one database, as behind a load balancer: a session made on one works on
// the other, rate limits count across both (stored in PostgreSQL), and a save on one is read at
// once by the other. Low limits for these servers only; the defaults are generous.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { checkApiAnswer } from "../api-contract";
import { Browser, startSystem, tokenFor, type Server, type System } from "./harness";

let sys: System;
let a: Server;
let b: Server;
const limits = { HB_RATE_WINDOW_SECONDS: "60", HB_RATE_API_PER_TOKEN: "40", HB_RATE_API_PER_ADDRESS: "1000", HB_RATE_SIGNIN_PER_ADDRESS: "12" };

beforeAll(async () => {
  sys = await startSystem();
  [a, b] = await Promise.all([sys.startServer(limits), sys.startServer(limits)]);
});
afterAll(async () => sys?.close());

const bearer = (token: string) => ({ Authorization: `Bearer ${token}`, "Content-Type": "application/json" });

describe("two app servers on one database", () => {
  it("a session cookie made on one server works on the other, and signing out on the other ends it", async () => {
    const onA = new Browser(a.url);
    await onA.signIn("demo-owner");
    const onB = new Browser(b.url);
    onB.cookies = new Map(onA.cookies);
    const me = await onB.fetch("/api/me");
    expect(me.status).toBe(200);
    await checkApiAnswer(b.url, "GET", me);
    expect(JSON.stringify(await me.json())).toContain("demo-owner");
    const page = await onB.fetch("/builds");
    expect(page.status).toBe(200);
    expect(await page.text()).toContain("Demo Owner");

    const out = await onB.fetch("/logout", { method: "POST", headers: { Origin: b.url } });
    expect(out.status).toBe(302);
    const after = await new Browser(a.url).fetch("/api/me", { headers: { Cookie: onA.cookieHeader() } });
    expect(after.status).toBe(401);
  });

  it("a client's e-mailed sign-in code asked for on one server is typed on the other, and its link works there too (decision 023)", async () => {
    const ask = async (server: Server) => {
      const browser = new Browser(server.url);
      const asked = await browser.fetch("/login/code", { method: "POST", body: new URLSearchParams({ intent: "send", email: "client-one@example.test" }), headers: { Origin: server.url } });
      expect(asked.status).toBe(302);
      const mail = (await sys.sql.query("SELECT subject, text_body FROM mail_outbox WHERE to_address = $1 ORDER BY created_at DESC LIMIT 1", ["client-one@example.test"])).rows[0];
      return { browser, code: /sign-in code: (\d{6})/.exec(mail.subject)![1], link: new URL(/(http\S+\/login\/link\?t=\S+)/.exec(mail.text_body)![1]) };
    };
    const first = await ask(a);
    const onB = new Browser(b.url);
    onB.cookies = new Map(first.browser.cookies);
    const typed = await onB.fetch("/login/code", { method: "POST", body: new URLSearchParams({ intent: "verify", code: first.code }), headers: { Origin: b.url } });
    expect(typed.status).toBe(302);
    expect(typed.headers.get("location")).toMatch(/\/handoff$/);
    const list = await onB.fetch("/handoff");
    expect(list.status).toBe(200);
    expect(await list.text()).toContain("Kestrel");

    const second = await ask(b);
    const linkOnA = new Browser(a.url);
    linkOnA.cookies = new Map(second.browser.cookies);
    const opened = await linkOnA.fetch(second.link.pathname + second.link.search);
    expect(opened.status).toBe(302);
    expect(linkOnA.cookies.has("__hb_session")).toBe(true);
    // Used once, on either server.
    const again = new Browser(b.url);
    again.cookies = new Map(second.browser.cookies);
    expect((await again.fetch(second.link.pathname + second.link.search)).status).toBe(410);
  });

  it("a save on one server is read at once by the other", async () => {
    const token = await tokenFor(sys.sql, "demo-builder");
    const builds = (await (await fetch(`${a.url}/api/builds`, { headers: bearer(token) })).json()) as { builds: { id: string }[] };
    const id = builds.builds[0].id;
    for (let i = 0; i < 5; i++) {
      const [writer, reader] = i % 2 ? [b, a] : [a, b];
      const got = (await (await fetch(`${writer.url}/api/builds/${id}/config`, { headers: bearer(token) })).json()) as { config: { presets: { name: string }[] }; version: number };
      got.config.presets[0].name = `Saved on ${writer === a ? "A" : "B"} (${i})`;
      const put = await fetch(`${writer.url}/api/builds/${id}/config`, { method: "PUT", headers: bearer(token), body: JSON.stringify(got) });
      expect(put.status, await put.clone().text()).toBe(200);
      await checkApiAnswer(writer.url, "PUT", put);
      const saved = (await put.json()) as { version: number };
      const read = (await (await fetch(`${reader.url}/api/builds/${id}/config`, { headers: bearer(token) })).json()) as { config: { presets: { name: string }[] }; version: number };
      expect(read.version).toBe(saved.version);
      expect(read.config.presets[0].name).toBe(got.config.presets[0].name);
    }
  });

  it("an API token's limit counts across both servers: 429 with Retry-After and a JSON error", async () => {
    const token = await tokenFor(sys.sql, "demo-reviewer");
    const statuses: number[] = [];
    let limited: Response | undefined;
    for (let i = 0; i < 40; i++) {
      const r = await fetch(`${(i % 2 ? b : a).url}/api/builds`, { headers: bearer(token) });
      statuses.push(r.status);
      await r.text();
    }
    expect(statuses.every((s) => s === 200)).toBe(true); // 20 on each server: under 40 on either alone
    for (const s of [a, b]) {
      limited = await fetch(`${s.url}/api/builds`, { headers: bearer(token) });
      expect(limited.status).toBe(429);
      const retry = Number(limited.headers.get("Retry-After"));
      expect(retry).toBeGreaterThan(0);
      expect(retry).toBeLessThanOrEqual(60);
      expect(limited.headers.get("Content-Type")).toContain("application/json");
      await checkApiAnswer(s.url, "GET", limited);
      expect(((await limited.json()) as { error: string }).error).toMatch(/Too many requests with this API token/);
    }
    // Another token is not held back by this one.
    const other = await tokenFor(sys.sql, "demo-builder");
    expect((await fetch(`${b.url}/api/builds`, { headers: bearer(other) })).status).toBe(200);
  });

  it("sign-in is limited per address across both servers", async () => {
    const statuses: number[] = [];
    for (let i = 0; i < 14; i++) {
      const r = await fetch(`${(i % 2 ? b : a).url}/auth/github`, { method: "POST", body: new URLSearchParams({ next: "/builds" }), headers: { Origin: (i % 2 ? b : a).url }, redirect: "manual" });
      statuses.push(r.status);
      if (r.status === 429) expect(Number(r.headers.get("Retry-After"))).toBeGreaterThan(0);
      await r.text();
    }
    // The first sign-ins of the earlier test count too: 12 per window in all.
    expect(statuses.filter((s) => s === 302).length).toBeLessThanOrEqual(12);
    expect(statuses.slice(-2)).toEqual([429, 429]);
    // Counted for the socket's address (scripts/lib/peer-address.mjs), not one shared bucket.
    const keys = (await sys.sql.query("SELECT key FROM rate_limits ORDER BY key")).rows.map((r) => r.key as string);
    expect(keys).toContain("sign-in:127.0.0.1");
    expect(keys).toContain("api-address:127.0.0.1");
  });
});
