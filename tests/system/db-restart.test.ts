// A PostgreSQL restart under traffic, with idle pooled connections: the app server stays up,
// answers 503 (JSON for the API, a page for pages, `database: down` from /healthz) while the
// database is away, serves again when it is back, and every save it acknowledged is stored.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { contractOf } from "../api-contract";
import { Browser, startSystem, tokenFor, type Server, type System } from "./harness";

let sys: System;
let app: Server;
let token: string;
let browser: Browser;

beforeAll(async () => {
  sys = await startSystem();
  app = await sys.startServer();
  token = await tokenFor(sys.sql, "demo-builder");
  browser = new Browser(app.url);
  await browser.signIn("demo-builder");
});
afterAll(async () => sys?.close());

type Seen = { what: string; status: number; body: string; at: number };

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

describe("a database restart under traffic", () => {
  it("keeps the server up, answers 503 while down, recovers, and loses no acknowledged save", async () => {
    const api = (path: string, init: RequestInit = {}) =>
      fetch(new URL(path, app.url), { ...init, headers: { Authorization: `Bearer ${token}`, "Content-Type": "application/json", ...init.headers } });
    const list = (await (await api("/api/builds")).json()) as { builds: { id: string }[] };
    const buildIds = list.builds.slice(0, 3).map((b) => b.id);
    expect(buildIds.length).toBeGreaterThanOrEqual(2);

    // Fill the pool: 30 requests at once leave up to 10 idle connections for the restart to cut.
    await Promise.all(Array.from({ length: 30 }, () => api("/api/builds").then((r) => r.text())));

    const seen: Seen[] = [];
    let running = true;
    const acked = new Map<string, { version: number; marker: string }>();
    let saves = 0;

    // One writer per build: read, change a preset name, save from the version read; on a 503 try
    // again later, on a 409 (a save whose answer was lost) read again.
    const writer = async (id: string, w: number) => {
      let current = (await (await api(`/api/builds/${id}/config`)).json()) as { config: { presets: { name: string }[] }; version: number };
      for (let n = 0; running; n++) {
        const marker = `Writer ${w} save ${n}`;
        const config = structuredClone(current.config);
        config.presets[0].name = marker;
        const r = await api(`/api/builds/${id}/config`, { method: "PUT", body: JSON.stringify({ config, version: current.version }) }).catch(() => null);
        if (!r) continue;
        const body = await r.text();
        seen.push({ what: "save", status: r.status, body, at: Date.now() });
        if (r.status === 200) {
          const version = (JSON.parse(body) as { version: number }).version;
          acked.set(id, { version, marker });
          current = { config, version };
          saves++;
        } else if (r.status === 409) {
          const again = await api(`/api/builds/${id}/config`).catch(() => null);
          if (again?.ok) current = await again.json();
        } else await sleep(100);
      }
    };
    const reader = async () => {
      while (running) {
        for (const [what, f] of [
          ["healthz", () => fetch(new URL("/healthz", app.url))],
          ["api", () => api("/api/builds")],
          ["page", () => browser.fetch("/builds")],
        ] as const) {
          const r = await f().catch(() => null);
          if (r) seen.push({ what, status: r.status, body: await r.text(), at: Date.now() });
        }
        await sleep(20);
      }
    };
    const traffic = Promise.all([...buildIds.map((id, i) => writer(id, i)), reader(), reader()]);

    // Wait for traffic to be under way (a busy machine can take seconds for the first save).
    for (let i = 0; i < 300 && saves === 0; i++) await sleep(100);
    await sleep(500);
    const before = saves;
    expect(before).toBeGreaterThan(0);

    // 1) Stopped for three seconds (fast shutdown: every connection is terminated).
    expect(sys.cluster.stop()).toBe(true);
    const downFrom = Date.now();
    await sleep(3000);
    expect(app.child.exitCode, "the app server stays up while the database is down").toBeNull();
    expect(sys.cluster.start()).toBe(true);
    const upAt = Date.now();
    await sleep(2000);

    // 2) `pg_ctl restart -m fast` while the pool again holds connections.
    await Promise.all(Array.from({ length: 20 }, () => api("/api/builds").then((r) => r.text())));
    expect(sys.cluster.restart()).toBe(true);
    await sleep(2500);

    running = false;
    await traffic;
    expect(app.child.exitCode, "the app server is still running").toBeNull();

    // Nothing answered 500; the outage answered 503 in every shape.
    const statuses = new Set(seen.map((s) => s.status));
    expect([...statuses].filter((s) => s >= 500 && s !== 503), JSON.stringify(seen.filter((s) => s.status >= 500 && s.status !== 503).slice(0, 3))).toEqual([]);
    const down = seen.filter((s) => s.at > downFrom + 200 && s.at < upAt);
    const health = down.find((s) => s.what === "healthz");
    expect(health?.status).toBe(503);
    expect(JSON.parse(health!.body)).toMatchObject({ database: "down" });
    const apiDown = down.find((s) => s.what === "api");
    expect(apiDown?.status).toBe(503);
    expect(JSON.parse(apiDown!.body).error).toMatch(/database is not answering/);
    // The outage answer has the API's one error shape, as the document says.
    expect((await contractOf(app.url)).check({ method: "GET", url: new URL("/api/builds", app.url).href, status: 503, contentType: "application/json", body: Buffer.from(apiDown!.body) })).toBeNull();
    const pageDown = down.find((s) => s.what === "page");
    expect(pageDown?.status).toBe(503);
    expect(pageDown!.body).toContain("database is not answering");

    // The same process serves again.
    expect((await fetch(new URL("/healthz", app.url))).status).toBe(200);
    expect((await api("/api/builds")).status).toBe(200);
    expect((await browser.fetch("/builds")).status).toBe(200);
    expect(saves).toBeGreaterThan(before);
    const savesAfter = seen.filter((s) => s.what === "save" && s.status === 200 && s.at > upAt);
    expect(savesAfter.length).toBeGreaterThan(0);

    // Every acknowledged save is stored: each build's version is at least the last one answered,
    // and where nothing unacknowledged followed, its content is that save's.
    for (const [id, last] of acked) {
      const r = await sys.sql.query("SELECT config_version, config FROM builds WHERE id = $1", [id]);
      const row = r.rows[0] as { config_version: number; config: { presets: { name: string }[] } };
      expect(row.config_version).toBeGreaterThanOrEqual(last.version);
      if (row.config_version === last.version) expect(row.config.presets[0].name).toBe(last.marker);
    }
    console.log(`saves acknowledged: ${saves}; answers seen: ${seen.length}; statuses: ${[...statuses].sort().join(", ")}`);
  });
});
