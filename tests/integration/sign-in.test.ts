// Who may sign in by e-mail (decision 023), on a real PostgreSQL database: a known client and a
// pending client invitation get one mail with a code and a link; any other address gets the same
// answer and nothing is sent or stored. Wrong, expired, reused and tampered codes are refused with
// their reason; per-address sending is rate-limited in PostgreSQL.
import type { Kysely } from "kysely";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import type { Database } from "~/lib/db/types";
import type { MailMessage } from "~/lib/mail/messages";
import { seed } from "../../db/seed";
import { freshAppDatabase, hasDatabase } from "./db";

// The outbox row is written in the caller's transaction, as the real queue does (no pg-boss here).
vi.mock("~/lib/mail/mailer.server", () => ({
  sendMail: async (trx: Kysely<Database>, m: MailMessage) => {
    await trx.insertInto("mail_outbox").values({ kind: m.kind, to_address: m.to, subject: m.subject, text_body: m.text, html_body: m.html }).execute();
    return "queued";
  },
}));

type Flow = typeof import("~/lib/auth/email-sign-in.server");

describe.runIf(hasDatabase)("e-mail sign-in (PostgreSQL)", () => {
  let db: Kysely<Database>;
  let flow: Flow;

  /** The browser's cookie jar, reduced to a Cookie header after each answer. */
  class Browser {
    jar = new Map<string, string>();
    take(headers: Headers) {
      for (const c of headers.getSetCookie()) {
        const [pair] = c.split(";");
        const i = pair.indexOf("=");
        this.jar.set(pair.slice(0, i), pair.slice(i + 1));
      }
    }
    get cookie() {
      return [...this.jar].map(([k, v]) => `${k}=${v}`).join("; ");
    }
    request(path: string) {
      return new Request(`http://127.0.0.1${path}`, { headers: { Cookie: this.cookie } });
    }
    async ask(email: string) {
      const o = await flow.requestSignInCode(this.request("/login/code"), form({ email }));
      this.take(o.headers);
      return o;
    }
    async type(code: string) {
      const o = await flow.verifySignInCode(this.request("/login/code"), form({ code }));
      this.take(o.headers);
      return o;
    }
    async open(link: string) {
      const u = new URL(link);
      const o = await flow.verifySignInLink(this.request(u.pathname + u.search));
      this.take(o.headers);
      return o;
    }
  }
  const form = (o: Record<string, string>) => {
    const f = new FormData();
    for (const [k, v] of Object.entries(o)) f.set(k, v);
    return f;
  };
  const mails = (to: string) => db.selectFrom("mail_outbox").select(["subject", "text_body"]).where("to_address", "=", to).orderBy("created_at", "desc").execute();
  const lastMail = async (to: string) => {
    const [m] = await mails(to);
    return { code: /sign-in code: (\d{6})/.exec(m.subject)![1], link: /(http\S+\/login\/link\?t=\S+)/.exec(m.text_body)![1] };
  };
  const counts = async () => ({
    mail: (await db.selectFrom("mail_outbox").select("id").execute()).length,
    codes: (await db.selectFrom("sign_in_codes").select("id").execute()).length,
    sessions: (await db.selectFrom("sessions").select("id").execute()).length,
    users: (await db.selectFrom("users").select("id").execute()).length,
  });
  const sessionUser = async (headers: Headers) => {
    const b = new Browser();
    b.take(headers);
    const { getSessionUserId } = await import("~/lib/auth/auth.server");
    return getSessionUserId(new Request("http://127.0.0.1/", { headers: { Cookie: b.cookie } }));
  };
  const userId = async (email: string) => (await db.selectFrom("users").select("id").where("email", "=", email).executeTakeFirstOrThrow()).id;

  beforeAll(async () => {
    // The routes read their settings from the environment, as the server does.
    const fresh = await freshAppDatabase({ APP_URL: "http://hb.test", HB_RATE_SIGNIN_CODES_PER_EMAIL: "3" });
    db = fresh.db;
    await seed(db);
    flow = await import("~/lib/auth/email-sign-in.server");
  });
  afterAll(async () => {
    const { db: appDb } = await import("~/lib/db/db.server");
    await appDb().destroy();
  });

  it("sends a known client one mail with a code and a link, and the right code signs them in once", async () => {
    const b = new Browser();
    const before = await counts();
    const asked = await b.ask("  Client-One@Example.test ");
    expect(asked).toMatchObject({ ok: true, to: "/login/code" });
    expect(await mails("client-one@example.test")).toHaveLength(1);
    const { code, link } = await lastMail("client-one@example.test");
    expect(link.startsWith("http://hb.test/login/link?t=")).toBe(true);
    expect(flow.pendingAddress(b.request("/login/code"))).toBe("client-one@example.test");

    const wrong = await b.type(code === "000000" ? "111111" : "000000");
    expect(wrong).toMatchObject({ ok: false, status: 400, message: flow.SIGN_IN_MESSAGES.wrong(flow.MAX_WRONG_CODES - 1) });
    expect(await b.type("12ab")).toMatchObject({ ok: false, status: 400, message: flow.SIGN_IN_MESSAGES.badCode });

    const right = await b.type(code);
    expect(right).toMatchObject({ ok: true, to: "/handoff" });
    expect(await sessionUser(right.headers)).toBe(await userId("client-one@example.test"));
    expect((await counts()).sessions).toBe(before.sessions + 1);

    // The link of the same mail, once the code was used: refused as used.
    expect(await b.open(link)).toMatchObject({ ok: false, status: 410, message: flow.SIGN_IN_MESSAGES.used });
  });

  it("answers an unknown address exactly as a known one, and sends and stores nothing", async () => {
    const before = await counts();
    const b = new Browser();
    const o = await b.ask("stranger@example.test");
    expect(o).toMatchObject({ ok: true, to: "/login/code" });
    expect(b.jar.has("_totp")).toBe(true);
    // A builder's address is no client's: the workshop signs in with GitHub.
    expect(await new Browser().ask("builder@ember-anvil.example.test")).toMatchObject({ ok: true, to: "/login/code" });
    expect(await counts()).toEqual(before);
    // Whatever is typed, no session comes of it.
    expect(await b.type("123456")).toMatchObject({ ok: false, status: 400 });
    expect(await counts()).toEqual(before);
  });

  it("refuses a malformed address with its reason, sending nothing", async () => {
    const before = await counts();
    for (const bad of ["", "not-an-address", "a@b", "x".repeat(400) + "@example.test"]) {
      expect(await new Browser().ask(bad)).toMatchObject({ ok: false, status: 400, message: flow.SIGN_IN_MESSAGES.badEmail });
    }
    expect(await counts()).toEqual(before);
  });

  it("lets a pending client invitation sign in: a new person with the client's membership", async () => {
    const ws = (await db.selectFrom("workshops").select("id").executeTakeFirstOrThrow()).id;
    await db.insertInto("invitations").values({ workshop_id: ws, email: "late-client@example.test", role: "client", github_login: null, invited_by: null }).execute();
    const b = new Browser();
    await b.ask("late-client@example.test");
    const { code } = await lastMail("late-client@example.test");
    const o = await b.type(code);
    expect(o.ok).toBe(true);
    const id = await userId("late-client@example.test");
    expect(await sessionUser(o.headers)).toBe(id);
    const m = await db.selectFrom("memberships").select(["role", "workshop_id"]).where("user_id", "=", id).executeTakeFirstOrThrow();
    expect(m).toEqual({ role: "client", workshop_id: ws });
    expect((await db.selectFrom("invitations").select("accepted_at").where("email", "=", "late-client@example.test").executeTakeFirstOrThrow()).accepted_at).not.toBeNull();
  });

  it("signs in with the one-time link in the same browser, once; another browser is told why not", async () => {
    const b = new Browser();
    await b.ask("client-two@example.test");
    const { link } = await lastMail("client-two@example.test");
    expect(await new Browser().open(link)).toMatchObject({ ok: false, status: 400, message: flow.SIGN_IN_MESSAGES.otherBrowser });
    const o = await b.open(link);
    expect(o).toMatchObject({ ok: true, to: "/handoff" });
    expect(await sessionUser(o.headers)).toBe(await userId("client-two@example.test"));
    expect(await b.open(link)).toMatchObject({ ok: false, status: 410, message: flow.SIGN_IN_MESSAGES.used });
    expect(await new Browser().open("http://hb.test/login/link?t=forged")).toMatchObject({ ok: false, status: 400, message: flow.SIGN_IN_MESSAGES.badLink });
  });

  it("refuses an expired code, and a code after too many wrong ones", async () => {
    const b = new Browser();
    await b.ask("client-two@example.test");
    const { code } = await lastMail("client-two@example.test");
    await db.updateTable("sign_in_codes").set({ expires_at: new Date(Date.now() - 1000) }).where("email", "=", "client-two@example.test").where("used_at", "is", null).execute();
    expect(await b.type(code)).toMatchObject({ ok: false, status: 410, message: flow.SIGN_IN_MESSAGES.expired });

    const c = new Browser();
    await c.ask("client-two@example.test");
    const next = await lastMail("client-two@example.test");
    const wrong = next.code === "999999" ? "888888" : "999999";
    for (let i = 1; i < flow.MAX_WRONG_CODES; i++) expect(await c.type(wrong)).toMatchObject({ ok: false, status: 400 });
    expect(await c.type(wrong)).toMatchObject({ ok: false, status: 429, message: flow.SIGN_IN_MESSAGES.tooMany });
    expect(await c.type(next.code)).toMatchObject({ ok: false, status: 429, message: flow.SIGN_IN_MESSAGES.tooMany });
  });

  it("does not let a changed cookie sign in as another client with one's own code", async () => {
    const b = new Browser();
    await b.ask("client-one@example.test");
    const { code } = await lastMail("client-one@example.test");
    const state = new URLSearchParams(b.jar.get("_totp")!);
    state.set("email", "client-two@example.test");
    b.jar.set("_totp", state.toString());
    const before = await counts();
    expect(await b.type(code)).toMatchObject({ ok: false, status: 400 });
    expect((await counts()).sessions).toBe(before.sessions);
  });

  it("limits codes per address (HB_RATE_SIGNIN_CODES_PER_EMAIL), for unknown addresses too, and sends nothing over it", async () => {
    for (const address of ["limited@example.test", "client-one@example.test"]) {
      const sent = (await mails(address)).length;
      let refusedAt = 0;
      for (let i = 1; i <= 4 && !refusedAt; i++) {
        const o = await new Browser().ask(address);
        if (!o.ok) {
          expect(o.status).toBe(429);
          expect(o.message).toMatch(/Too many requests for this e-mail address/);
          refusedAt = i;
        }
      }
      expect(refusedAt).toBeGreaterThan(0);
      const after = (await mails(address)).length;
      if (address.startsWith("limited")) expect(after).toBe(0);
      else expect(after - sent).toBeLessThanOrEqual(3);
    }
  });
});
