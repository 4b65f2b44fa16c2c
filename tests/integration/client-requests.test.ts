// Client requests against PostgreSQL: a client asks about their own build and the workshop's
// owners and builders hear of it; answers are compare-and-set on the version, declining needs a
// reason, the client is told when a reply is written or the request closes; each refusal
// changes nothing, and the mail goes in the same transaction as the write.
import { beforeAll, describe, expect, it } from "vitest";
import { sql, type Kysely } from "kysely";
import type { Database } from "~/lib/db/types";
import type { MailMessage } from "~/lib/mail/messages";
import { answerRequest, askRequest, listRequests, refused, type Asker, type Deps } from "~/lib/requests/service.server";
import { MAX_OPEN_PER_BUILD } from "~/lib/requests/rules";
import { seed } from "../../db/seed";
import { freshDb, hasDatabase } from "./db";

describe.runIf(hasDatabase)("client requests (PostgreSQL)", () => {
  let db: Kysely<Database>;
  let deps: Deps;
  const sent: MailMessage[] = [];
  let client: Asker;
  let builder: Asker;
  let build: { id: string; name: string; client_name: string; client_user_id: string | null };
  const counts = async () =>
    (await sql<{ req: number; out: number; v: number }>`SELECT (SELECT count(*)::int FROM client_requests) AS req, (SELECT count(*)::int FROM mail_outbox) AS out,
      (SELECT coalesce(sum(version), 0)::int FROM client_requests) AS v`.execute(db)).rows[0];

  beforeAll(async () => {
    db = await freshDb();
    const { workshopId } = await seed(db);
    deps = {
      db,
      link: (p) => `http://hb.test${p}`,
      enqueue: async (trx, m) => {
        await trx.insertInto("mail_outbox").values({ kind: m.kind, to_address: m.to, subject: m.subject, text_body: m.text, html_body: m.html }).execute();
        sent.push(m);
      },
    };
    const user = async (email: string) => (await db.selectFrom("users").select(["id", "display_name"]).where("email", "=", email).executeTakeFirstOrThrow());
    const c = await user("client-one@example.test");
    const b = await user("builder@ember-anvil.example.test");
    client = { id: c.id, name: c.display_name, workshopId, isClient: true };
    builder = { id: b.id, name: b.display_name, workshopId, isClient: false };
    build = await db.selectFrom("builds").select(["id", "name", "client_name", "client_user_id"]).where("name", "=", "Kestrel").executeTakeFirstOrThrow();
    expect(build.client_user_id).toBe(c.id);
  });

  it("a client asks; the owner and the builder are told, the reviewer and the client are not", async () => {
    const r = await askRequest(deps, client, build, { kind: "font", message: "One more font, please: something like a storm at sea." });
    expect(r.status).toBe(201);
    expect(sent.map((m) => m.to).sort()).toEqual(["builder@ember-anvil.example.test", "owner@ember-anvil.example.test"]);
    expect(sent[0].subject).toBe("Client One asks: one more sound font (Kestrel)");
    expect(sent[0].text).toContain("> One more font, please: something like a storm at sea.");
    expect(sent[0].text).toContain(`http://hb.test/builds/${build.id}/requests`);
    const [row] = await listRequests(deps, client.workshopId, build.id);
    expect(row).toMatchObject({ kind: "font", status: "open", statusLabel: "Sent, not yet read", askedByName: "Client One", version: 1, open: true });
  });

  it("answers: taken in hand silently, a stale answer and a decline without reason refused with nothing changed, done with a reply tells the client", async () => {
    sent.length = 0;
    const [req] = await listRequests(deps, client.workshopId, build.id);
    const inHand = await answerRequest(deps, builder, build, req.id, { status: "in-hand", version: 1 });
    expect(inHand).toEqual({ status: 200, body: { version: 2 } });
    expect(sent).toEqual([]);
    const before = await counts();
    const stale = await answerRequest(deps, builder, build, req.id, { status: "done", reply: "Loaded.", version: 1 });
    expect(refused(stale) && stale.status).toBe(409);
    expect(refused(stale) && stale.body).toMatchObject({ currentVersion: 2, error: expect.stringMatching(/Someone answered this request since you read it \(it is now the workshop is on it\)/) });
    const bare = await answerRequest(deps, builder, build, req.id, { status: "declined", reply: "  ", version: 2 });
    expect(refused(bare) && bare.status).toBe(422);
    expect(await answerRequest(deps, builder, build, "not-a-uuid", { status: "done", version: 2 })).toMatchObject({ status: 404 });
    expect(await counts()).toEqual(before);
    const done = await answerRequest(deps, builder, build, req.id, { status: "done", reply: "Tidebreak II is on the card; bring the saber by for a swap.", version: 2 });
    expect(done).toEqual({ status: 200, body: { version: 3 } });
    expect(sent).toHaveLength(1);
    expect(sent[0]).toMatchObject({ to: "client-one@example.test", subject: "Your request about the Kestrel: done" });
    expect(sent[0].text).toContain(`http://hb.test/handoff/${build.id}`);
    expect(sent[0].text).toContain("because a Hiltbench workshop is building or looking after your saber");
    const [after] = await listRequests(deps, client.workshopId, build.id);
    expect(after).toMatchObject({ status: "done", open: false, reply: "Tidebreak II is on the card; bring the saber by for a swap.", handledByName: "Demo Builder" });
  });

  it(`a build holds at most ${MAX_OPEN_PER_BUILD} requests waiting; the next is refused and nothing is stored`, async () => {
    for (let i = 0; i < MAX_OPEN_PER_BUILD; i++) expect((await askRequest(deps, client, build, { kind: "other", message: `Note ${i}` })).status).toBe(201);
    const before = await counts();
    const over = await askRequest(deps, client, build, { kind: "fault", message: "One too many" });
    expect(over.status).toBe(429);
    expect(refused(over) && over.body.error).toMatch(/already has 20 requests waiting/);
    expect(await counts()).toEqual(before);
  });

  it("the database keeps kinds, statuses and lengths to what the rules allow", async () => {
    await expect(sql`INSERT INTO client_requests (build_id, workshop_id, kind, message) VALUES (${build.id}, ${client.workshopId}, 'sword', 'x')`.execute(db)).rejects.toThrow(/check/);
    await expect(sql`INSERT INTO client_requests (build_id, workshop_id, kind, message) VALUES (${build.id}, ${client.workshopId}, 'font', '')`.execute(db)).rejects.toThrow(/check/);
  });
});
