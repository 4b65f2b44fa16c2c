// The bench check and the release on a real PostgreSQL database and a disk store: each
// precondition refused with nothing changed, the release numbered per build with the SHA-256 of
// the zip the bundle API serves, the build released and the client's e-mail queued in the same
// transaction, a race for the same number refused, and release rows that cannot be changed.
import { createHash } from "node:crypto";
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { sql, type Kysely, type Transaction } from "kysely";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Viewer } from "~/lib/auth/auth.server";
import type { Database, Role } from "~/lib/db/types";
import type { MailMessage } from "~/lib/mail/messages";
import { benchItems } from "~/lib/release/checklist";
import { BUILTIN_VERSION } from "~/lib/template";
import { benchCheckFor, releaseBuildFor, setTickFor, type ReleaseDeps } from "~/lib/release/service.server";
import { createToken } from "~/lib/repo/tokens.server";
import { seed } from "../../db/seed";
import { freshAppDatabase, hasDatabase } from "./db";

const work = mkdtempSync(path.join(tmpdir(), "hb-release-"));
afterAll(() => rmSync(work, { recursive: true, force: true }));
const statusOf = (e: unknown) => (e as { init?: { status?: number } }).init?.status;
const messageOf = (e: unknown) => String((e as { data?: { message?: string } })?.data?.message ?? e);
async function failsWith(p: Promise<unknown>, status: number, message?: RegExp) {
  const e = await p.then(
    () => undefined,
    (err) => err,
  );
  expect(statusOf(e), messageOf(e)).toBe(status);
  if (message) expect(messageOf(e)).toMatch(message);
}

describe.runIf(hasDatabase)("bench check and release (PostgreSQL, disk storage)", () => {
  let db: Kysely<Database>;
  let ws: string;
  let buildId: string;
  const people: Record<string, Viewer> = {};
  const sent: MailMessage[] = [];
  let deps: ReleaseDeps;
  let bundleLoader: (args: { request: Request; params: Record<string, string>; context: unknown }) => Promise<Response>;
  let token = "";
  const build = () => db.selectFrom("builds").selectAll().where("id", "=", buildId).executeTakeFirstOrThrow();
  const state = async () =>
    (
      await sql<{ releases: number; ticks: number; mail: number; status: string }>`SELECT
        (SELECT count(*)::int FROM releases) AS releases, (SELECT count(*)::int FROM bench_check_ticks) AS ticks,
        (SELECT count(*)::int FROM mail_outbox) AS mail, (SELECT status FROM builds WHERE id = ${buildId}) AS status`.execute(db)
    ).rows[0];
  const approve = (n: number) =>
    sql`INSERT INTO review_requests (build_id, workshop_id, revision, template_label, rendered, state) VALUES (${buildId}, ${ws}, ${n}, 'test', 'x', 'approved')`.execute(db);
  const tickAll = async (n: number) => {
    const b = await build();
    const check = await benchCheckFor(people.builder, b, n);
    for (const i of check.groups.flatMap((g) => g.items)) await setTickFor(people.builder, b, n, i.key, true);
  };

  beforeAll(async () => {
    // The routes read their settings from the environment, as the server does.
    const fresh = await freshAppDatabase({ HB_DATA_DIR: work, HB_STORAGE: "disk" });
    db = fresh.db;
    ws = (await seed(db)).workshopId;
    buildId = (await db.selectFrom("builds").select("id").where("name", "=", "Kestrel").executeTakeFirstOrThrow()).id;
    const rows = await db.selectFrom("memberships as m").innerJoin("users as u", "u.id", "m.user_id").select(["u.id", "u.display_name", "u.github_login", "u.email", "m.role"]).where("m.workshop_id", "=", ws).execute();
    for (const r of rows)
      people[r.role === "client" ? "client" : r.github_login!.replace("demo-", "")] = {
        user: { id: r.id, displayName: r.display_name, githubLogin: r.github_login, email: r.email },
        workshop: { id: ws, name: "Ember & Anvil" },
        role: r.role as Role,
        via: "token",
      };
    deps = {
      link: (p) => `http://hb.test${p}`,
      enqueue: async (trx, m) => {
        await trx.insertInto("mail_outbox").values({ kind: m.kind, to_address: m.to, subject: m.subject, text_body: m.text, html_body: m.html }).execute();
        sent.push(m);
      },
    };
    token = (await createToken(db, people.builder.user.id, "release test")).token;
    bundleLoader = (await import("~/routes/api.builds.$buildId.bundle")).loader as never;
  });

  it("refuses ticks that are not allowed or not there, and changes nothing", async () => {
    const before = await state();
    const b = await build();
    const n = b.config_version;
    await failsWith(setTickFor(people.reviewer, b, n, "card:matches", true), 403);
    await failsWith(setTickFor(people.client, b, n, "card:matches", true), 403);
    await failsWith(setTickFor(people.builder, b, n + 50, "card:matches", true), 404, /no revision/);
    await failsWith(setTickFor(people.builder, b, n, "preset:nope:clash", true), 422, /no item 'preset:nope:clash'/);
    expect(await state()).toEqual(before);
  });

  it("ticks and unticks an item, with who and when", async () => {
    const b = await build();
    const n = b.config_version;
    const ticked = await setTickFor(people.builder, b, n, "card:matches", true);
    const item = ticked.groups.flatMap((g) => g.items).find((i) => i.key === "card:matches")!;
    expect(item.tick?.by).toBe(people.builder.user.displayName);
    expect(ticked.ticked).toBe(1);
    expect(ticked.total).toBe(benchItems(b.config).length);
    expect((await setTickFor(people.owner, b, n, "card:matches", false)).ticked).toBe(0);
  });

  it("refuses a release before every condition holds, each with its reason, and changes nothing", async () => {
    const before = await state();
    const b = await build();
    const n = b.config_version;
    const input = { revision: n, note: "", template: null, mode: "long" as const, cardGb: 32 };
    await failsWith(releaseBuildFor(people.reviewer, b, input, deps), 403);
    await failsWith(releaseBuildFor(people.client, b, input, deps), 403);
    await failsWith(releaseBuildFor(people.builder, b, { ...input, revision: n + 50 }, deps), 404);
    await failsWith(releaseBuildFor(people.builder, b, input, deps), 409, /not approved/);
    await approve(n);
    const total = benchItems(b.config).length;
    await failsWith(releaseBuildFor(people.builder, b, input, deps), 409, new RegExp(`^${total} of ${total} bench-check items are not ticked yet \\("Select `));
    await tickAll(n);
    // A card far too small: the plan has an error, so the release is refused.
    await failsWith(releaseBuildFor(people.builder, b, { ...input, cardGb: 0.000001 }, deps), 422, /cannot be built/);
    const after = await state();
    expect({ ...after, ticks: before.ticks }).toEqual(before);
    expect(after.ticks).toBe(total);
  });

  it("releases: number 1, the served zip's SHA-256 and size, the build released and the client e-mailed, all at once", async () => {
    const b = await build();
    const n = b.config_version;
    const r = await releaseBuildFor(people.builder, b, { revision: n, note: "First handoff", template: null, mode: "long", cardGb: 32 }, deps);
    expect(r).toMatchObject({ number: 1, revision: n, names: "long", card: 32, note: "First handoff", releasedBy: people.builder.user.displayName });
    // The bundle API serves the same bytes for the release's own choices, the template named with the version it rendered at.
    expect(r.download).toBe(`/api/builds/${buildId}/bundle?revision=${n}&template=generic-header&version=${BUILTIN_VERSION}&names=long&card=32`);
    const res = await bundleLoader({ request: new Request(`http://127.0.0.1${r.download}`, { headers: { Authorization: `Bearer ${token}` } }), params: { buildId }, context: {} });
    expect(res.status).toBe(200);
    const zip = new Uint8Array(await res.arrayBuffer());
    expect(createHash("sha256").update(zip).digest("hex")).toBe(r.sha256);
    expect(zip.length).toBe(r.bytes);
    expect((await build()).status).toBe("released");
    const mail = sent.at(-1)!;
    expect(mail.kind).toBe("build-released");
    expect(mail.to).toBe("client-one@example.test");
    expect(mail.text).toContain(`http://hb.test/handoff/${buildId}`);
    expect(mail.text).toContain("First handoff");
  });

  it("numbers releases per build, and a failed e-mail leaves no release behind", async () => {
    const b = await build();
    const n = b.config_version;
    const input = { revision: n, note: "", template: null, mode: "8.3" as const, cardGb: 16 };
    const before = await state();
    const broken: ReleaseDeps = {
      ...deps,
      enqueue: async (trx: Transaction<Database>, m) => {
        await deps.enqueue(trx, m);
        throw new Error("outbox down");
      },
    };
    await expect(releaseBuildFor(people.builder, b, input, broken)).rejects.toThrow("outbox down");
    expect(await state()).toEqual(before);
    const second = await releaseBuildFor(people.owner, b, input, deps);
    expect(second.number).toBe(2);
    expect(second.download).toContain("names=8.3");
    expect(second.download).toContain("card=16");
  });

  it("refuses releasing the same bundle twice (409), and changes nothing", async () => {
    const b = await build();
    const before = await state();
    await failsWith(releaseBuildFor(people.builder, b, { revision: b.config_version, note: "", template: null, mode: "long", cardGb: 32 }, deps), 409, /already released, as release 1/);
    expect(await state()).toEqual(before);
  });

  it("refuses a second release that raced for the same number (409), keeping the first", async () => {
    const b = await build();
    const n = b.config_version;
    // Another template makes another bundle (the card's size alone does not change the bytes).
    const input = { revision: n, note: "", template: "readable-copy", mode: "long" as const, cardGb: 64 };
    let other: Promise<unknown> | undefined;
    const racing: ReleaseDeps = {
      ...deps,
      enqueue: async (trx, m) => {
        await deps.enqueue(trx, m);
        // A second release starts while this one holds number 3 uncommitted; wait until its insert waits on ours.
        other = releaseBuildFor(people.owner, b, input, deps).then(
          () => "released",
          (e) => e,
        );
        for (let i = 0; i < 200; i++) {
          const waiting = await sql<{ n: number }>`SELECT count(*)::int AS n FROM pg_stat_activity WHERE wait_event_type = 'Lock' AND datname = current_database()`.execute(db);
          if (waiting.rows[0].n > 0) break;
          await new Promise((r) => setTimeout(r, 50));
        }
      },
    };
    const first = await releaseBuildFor(people.builder, b, input, racing);
    expect(first.number).toBe(3);
    expect(first.download).toContain("template=readable-copy");
    const e = await other;
    expect(statusOf(e), messageOf(e)).toBe(409);
    expect(messageOf(e)).toMatch(/at the same moment/);
    expect((await db.selectFrom("releases").select("number").where("build_id", "=", buildId).orderBy("number").execute()).map((x) => x.number)).toEqual([1, 2, 3]);
  });

  it("keeps releases immutable: UPDATE and DELETE are refused by the database", async () => {
    await expect(sql`UPDATE releases SET note = 'changed' WHERE build_id = ${buildId}`.execute(db)).rejects.toThrow(/releases are immutable/);
    await expect(sql`DELETE FROM releases WHERE build_id = ${buildId}`.execute(db)).rejects.toThrow(/immutable/);
    expect((await db.selectFrom("releases").select("note").where("build_id", "=", buildId).where("number", "=", 1).executeTakeFirstOrThrow()).note).toBe("First handoff");
  });
});
