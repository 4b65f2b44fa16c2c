// The card bundle API on a real PostgreSQL database and a disk store: the route's loader is
// called as a script would call it (a personal token), for a chosen revision and template. The
// zip is read back by an independent reader (JSZip) and checked against its own manifest; bad
// queries answer 4xx with their reason and change nothing stored.
import { createHash } from "node:crypto";
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import JSZip from "jszip";
import type { Kysely } from "kysely";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { synthFont } from "~/lib/audio/synth";
import type { Database } from "~/lib/db/types";
import { acceptUpload } from "~/lib/fonts/accept.server";
import { DEFAULT_LAYOUT } from "~/lib/fonts/layout";
import { receiveUpload } from "~/lib/fonts/receive.server";
import { createToken } from "~/lib/repo/tokens.server";
import { seed } from "../../db/seed";
import { freshAppDatabase, hasDatabase } from "./db";

const work = mkdtempSync(path.join(tmpdir(), "hb-bundle-api-"));
afterAll(() => rmSync(work, { recursive: true, force: true }));
const sha = (b: Uint8Array) => createHash("sha256").update(b).digest("hex");

describe.runIf(hasDatabase)("GET /api/builds/:id/bundle (PostgreSQL, disk storage)", () => {
  let db: Kysely<Database>;
  let ws: string;
  let buildId: string;
  const tokens: Record<string, string> = {};
  let loader: (args: { request: Request; params: Record<string, string>; context: unknown }) => Promise<Response>;
  const revs: Record<string, number> = {};

  async function get(query: string, who = "builder") {
    const request = new Request(`http://127.0.0.1/api/builds/${buildId}/bundle${query}`, { headers: { Authorization: `Bearer ${tokens[who]}` } });
    return loader({ request, params: { buildId }, context: {} });
  }
  async function uploadAshfall(cues: string[], hz: number) {
    const form = new FormData();
    for (const f of synthFont(cues as never, hz)) form.append("files", new Blob([Buffer.from(f.bytes)]), f.name);
    const got = await receiveUpload(new Request("http://127.0.0.1/upload", { method: "POST", body: form }), { maxFileBytes: 8e6, maxTotalBytes: 6e7, maxFiles: 100 }, path.join(work, "staging"));
    try {
      const { storage } = await import("~/lib/storage/settings.server");
      return await acceptUpload(db, storage(), { workshopId: ws, buildId, fontId: "ashfall", userId: null, layout: DEFAULT_LAYOUT, files: got.files, ignored: got.ignored });
    } finally {
      rmSync(got.dir, { recursive: true, force: true });
    }
  }
  async function zipOf(res: Response) {
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("application/zip");
    const bytes = new Uint8Array(await res.arrayBuffer());
    const zip = await JSZip.loadAsync(bytes);
    const manifest = await zip.file("MANIFEST.txt")!.async("string");
    const listed = manifest.trim().split("\n").slice(1).map((l) => l.split("  "));
    // Every file the manifest lists is in the zip with that size and SHA-256, and nothing else is.
    for (const [hash, size, name] of listed) {
      const b = await zip.file(name)!.async("uint8array");
      expect([name, b.length, sha(b)]).toEqual([name, Number(size), hash]);
    }
    expect(Object.keys(zip.files).filter((n) => !zip.files[n].dir).sort()).toEqual([...listed.map((l) => l[2]), "MANIFEST.txt"].sort());
    return { bytes, zip, manifest, names: listed.map((l) => l[2]) };
  }
  const state = async () => ({
    build: await db.selectFrom("builds").select(["config_version", "config"]).where("id", "=", buildId).executeTakeFirstOrThrow(),
    uploads: (await db.selectFrom("font_uploads").select("id").execute()).length,
    revisions: (await db.selectFrom("config_revisions").select("number").where("build_id", "=", buildId).execute()).length,
  });

  beforeAll(async () => {
    // The routes read their settings from the environment, as the server does.
    const fresh = await freshAppDatabase({ HB_DATA_DIR: work, HB_STORAGE: "disk" });
    db = fresh.db;
    ws = (await seed(db)).workshopId;
    buildId = (await db.selectFrom("builds").select("id").where("name", "=", "Kestrel").executeTakeFirstOrThrow()).id;
    for (const [who, login] of [["builder", "demo-builder"], ["reviewer", "demo-reviewer"]]) {
      const u = await db.selectFrom("users").select("id").where("github_login", "=", login).executeTakeFirstOrThrow();
      tokens[who] = (await createToken(db, u.id, "bundle test")).token;
    }
    const client = await db.selectFrom("users").select("id").where("email", "=", "client-one@example.test").executeTakeFirstOrThrow();
    tokens.client = (await createToken(db, client.id, "bundle test")).token;
    loader = (await import("~/routes/api.builds.$buildId.bundle")).loader as never;
    revs.first = (await uploadAshfall(["hum", "clash"], 110)).configVersion;
    revs.second = (await uploadAshfall(["hum", "swing", "ignite"], 146.8)).configVersion;
  });

  it("builds the zip of a chosen revision: that revision's config and the font files the build had then", async () => {
    const old = await zipOf(await get(`?revision=${revs.first}`));
    const now = await zipOf(await get(""));
    expect(old.names.filter((n) => n.startsWith("ashfall/"))).toEqual(["ashfall/clash-1.wav", "ashfall/clash-2.wav", "ashfall/hum.wav"]);
    expect(now.names.filter((n) => n.startsWith("ashfall/"))).toEqual(["ashfall/hum.wav", "ashfall/ignite.wav", "ashfall/swing-1.wav", "ashfall/swing-2.wav"]);
    expect(old.manifest.split("\n")[0]).toBe(`# Kestrel, revision ${revs.first}, template generic-header v${old.manifest.match(/generic-header v(\d+)/)![1]}: every file of this card with its size in bytes and SHA-256.`);
    expect(now.manifest.split("\n")[0]).toContain(`revision ${revs.second},`);
    // Today's config is the newest revision: asking for it by number gives the same bytes.
    expect(sha((await zipOf(await get(`?revision=${revs.second}`))).bytes)).toBe(sha(now.bytes));
    // The rendered config is that revision's (it prints its own revision number).
    const header = old.names.find((n) => n.endsWith(".h"))!;
    expect(await old.zip.file(header)!.async("string")).toMatch(new RegExp(`\\b${revs.first}\\b`));
  });

  it("puts the wiring picture on the card as an SVG file listed in the manifest", async () => {
    const { zip, names } = await zipOf(await get(""));
    expect(names).toContain("wiring.svg");
    const svg = await zip.file("wiring.svg")!.async("string");
    expect(svg).toMatch(/^<svg[^>]*xmlns="http:\/\/www\.w3\.org\/2000\/svg"/);
    expect(svg).toContain("Wiring of Kestrel");
    expect(zip.file("handoff.html")).not.toBeNull();
    expect(await zip.file("handoff.html")!.async("string")).toMatch(/Charging and the battery/);
  });

  it("is byte-identical for the same revision and template, and a different template gives a different bundle", async () => {
    const a = await zipOf(await get(`?revision=${revs.first}&template=generic-header`));
    const b = await zipOf(await get(`?revision=${revs.first}&template=generic-header`));
    expect(sha(a.bytes)).toBe(sha(b.bytes));
    const c = await zipOf(await get(`?revision=${revs.first}&template=readable-copy`));
    expect(sha(c.bytes)).not.toBe(sha(a.bytes));
    expect(c.manifest.split("\n")[0]).toContain("template readable-copy");
  });

  it("answers the plan with check=1: revision, template, sizes in decimal bytes and whole clusters", async () => {
    const res = await get(`?revision=${revs.first}&check=1&card=8`);
    expect(res.status).toBe(200);
    const plan = await res.json();
    expect(plan).toMatchObject({ revision: revs.first, latest: false, cardBytes: 8_000_000_000, template: { name: "generic-header" } });
    expect(plan.cardUsedBytes % 32768).toBe(0);
    expect(plan.cardUsedBytes).toBeGreaterThan(plan.totalBytes);
    expect(plan.files.map((f: { path: string }) => f.path)).toContain("wiring.svg");
  });

  it("refuses a card too small for the files (422 with the findings; nothing streamed)", async () => {
    const res = await get("?card=0.0001");
    expect(res.status).toBe(422);
    const body = await res.json();
    expect(body.error).toMatch(/a 0\.0001 GB card holds 100,000 bytes \(decimal, as cards are sold\)/);
    expect(body.findings.map((f: { code: string }) => f.code)).toContain("card-too-small");
  });

  it.each([
    ["?revision=abc", 400, /'revision' must be a revision number/],
    ["?revision=0", 400, /'revision' must be 1 or more/],
    ["?revision=99999", 404, /has no revision 99999/],
    ["?names=9.9", 400, /names is long or 8\.3/],
    ["?card=-4", 400, /card's size in GB/],
    ["?card=lots", 400, /card's size in GB/],
    ["?card=4096", 400, /at most 2048 GB/],
    ["?template=no-such-template", 404, /No template 'no-such-template'/],
  ])("refuses %s with %i and its reason, changing nothing", async (query, status, message) => {
    const before = await state();
    const res = await get(query);
    expect(res.status).toBe(status);
    expect((await res.json()).error).toMatch(message);
    expect(await state()).toEqual(before);
  });

  it("lets reviewers bundle a revision; clients get no bundle here, only the released card (decision 023)", async () => {
    expect((await get(`?revision=${revs.first}&check=1`, "reviewer")).status).toBe(200);
    for (const q of ["?check=1", "", `?revision=${revs.first}&check=1`]) {
      const res = await get(q, "client");
      expect(res.status).toBe(403);
      expect((await res.json()).error).toMatch(/release-bundle/);
    }
  });
});
