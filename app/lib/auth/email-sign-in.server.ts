// Clients sign in with an e-mailed code or one-time link (decision 023). remix-auth-totp makes
// the code, encrypts it into its `_totp` cookie (a JWE under a key derived from SESSION_SECRET)
// and checks what is typed; the server keeps, in `sign_in_codes`, what that cookie cannot be
// trusted with: the address the code went to, wrong tries, expiry and the single use. Any app
// server can answer any step: there is no state in a process.
import { createHash } from "node:crypto";
import { TOTPStrategy } from "remix-auth-totp";
import { z } from "zod";
import { db } from "../db/db.server";
import { env, isProduction, signInCodeSecret } from "../env.server";
import { limitSignIn, limitSignInCodes } from "../limits/rate-limit.server";
import { sendMail } from "../mail/mailer.server";
import { linkTo, signInCodeMail } from "../mail/messages";
import { codeBy, countWrongCode, recordCode, useCode } from "../repo/sign-in.server";
import { isClientAddress, signInEmailUser } from "../repo/users.server";
import { failureOf } from "../web/http.server";
import { startSession } from "./session.server";
import { CODE_DIGITS, CODE_MINUTES, MAX_WRONG_CODES, SIGN_IN_MESSAGES } from "./sign-in-words";

export { CODE_DIGITS, CODE_MINUTES, MAX_WRONG_CODES, SIGN_IN_MESSAGES };
export const LINK_PATH = "/login/link";
const CODE_PAGE = "/login/code";
const SUCCESS = "/handoff";
const FAILURE = "/login/code?failed=1";
const COOKIE = "_totp";

export type SignInOutcome = { ok: true; headers: Headers; to: string } | { ok: false; status: number; message: string; headers: Headers };

const emailSchema = z.string().trim().toLowerCase().max(320).pipe(z.email());
const codeSchema = z.string().trim().regex(new RegExp(`^[0-9]{${CODE_DIGITS}}$`));
const sha = (s: string) => createHash("sha256").update(s).digest("hex");

/** What a sign-in step sent to the strategy leaves for us to read after it throws its redirect. */
type Sent = { email: string; code: string; magicLink: string };
const sentFor = new WeakMap<Request, Sent>();
const verified = new WeakSet<Request>();

let strategy: TOTPStrategy<string> | undefined;
function totp(): TOTPStrategy<string> {
  strategy ??= new TOTPStrategy<string>(
    {
      secret: signInCodeSecret(),
      cookieOptions: { maxAge: CODE_MINUTES * 60, httpOnly: true, sameSite: "Lax", path: "/", ...(isProduction() ? { secure: true } : {}) },
      totpGeneration: { period: CODE_MINUTES * 60, digits: CODE_DIGITS, charSet: "0123456789", maxAttempts: MAX_WRONG_CODES },
      magicLinkPath: LINK_PATH,
      emailSentRedirect: CODE_PAGE,
      successRedirect: SUCCESS,
      failureRedirect: FAILURE,
      // Addresses are checked by our schema before the strategy sees them.
      validateEmail: async () => true,
      // Nothing is sent here: the row and the mail are written once the strategy's cookie exists.
      sendTOTP: async ({ email, code, magicLink, request }) => {
        sentFor.set(request, { email, code, magicLink });
      },
    },
    async ({ email, request }) => {
      verified.add(request);
      return email;
    },
  );
  return strategy;
}

/** The strategy's cookie state from a Cookie header, or from a Set-Cookie it answered with. */
function totpState(header: string | null | undefined): { email?: string; jwe?: string; error?: string } {
  if (!header) return {};
  const m = new RegExp(`(?:^|;\\s*)${COOKIE}=("?)([^";]*)\\1`).exec(header);
  if (!m) return {};
  const p = new URLSearchParams(m[2]);
  let jwe: string | undefined;
  try {
    jwe = (JSON.parse(p.get("totp") ?? "null") as { jwe?: string } | null)?.jwe;
  } catch {
    jwe = undefined;
  }
  return { email: p.get("email") ?? undefined, jwe, error: p.get("error") ?? undefined };
}

const setCookiesOf = (r: Response) => {
  const h = new Headers();
  for (const c of r.headers.getSetCookie()) h.append("Set-Cookie", c);
  return h;
};
const strategyCookieOf = (r: Response) => r.headers.getSetCookie().find((c) => c.startsWith(`${COOKIE}=`));

/** Run the strategy; it always ends by throwing a redirect (with its cookie), which we read. */
async function run(request: Request): Promise<Response> {
  try {
    await totp().authenticate(request);
  } catch (e) {
    if (e instanceof Response) return e;
    throw e;
  }
  throw new Error("remix-auth-totp returned without a redirect");
}

async function limited(f: () => Promise<void>): Promise<{ status: number; message: string } | null> {
  try {
    await f();
    return null;
  } catch (e) {
    const failure = failureOf(e);
    if (failure?.status === 429) return failure;
    throw e;
  }
}

const refused = (status: number, message: string, headers = new Headers()): SignInOutcome => ({ ok: false, status, message, headers });

/**
 * Step one: an address is typed. A client's address (or a pending client invitation) gets one
 * e-mail with the code and the link; any other address gets the same answer and nothing is sent.
 */
export async function requestSignInCode(request: Request, form: FormData): Promise<SignInOutcome> {
  const address = emailSchema.safeParse(String(form.get("email") ?? ""));
  if (!address.success) return refused(400, SIGN_IN_MESSAGES.badEmail);
  const email = address.data;
  const over = (await limited(() => limitSignIn(request))) ?? (await limited(() => limitSignInCodes(email)));
  if (over) return refused(429, over.message);
  const ask = new Request(request.url, { method: "POST", headers: { Cookie: request.headers.get("Cookie") ?? "" }, body: new URLSearchParams({ email }) });
  const answer = await run(ask);
  const sent = sentFor.get(ask);
  const jwe = totpState(strategyCookieOf(answer)).jwe;
  if (!sent || !jwe) return refused(500, "The sign-in code could not be made.");
  if (await isClientAddress(db(), email)) {
    const linkToken = new URL(sent.magicLink).searchParams.get("t") ?? "";
    const url = linkTo(env().APP_URL, `${LINK_PATH}?t=${encodeURIComponent(linkToken)}`);
    await db()
      .transaction()
      .execute(async (trx) => {
        await recordCode(trx, { email, tokenHash: sha(jwe), linkHash: sha(linkToken), expiresAt: new Date(Date.now() + CODE_MINUTES * 60_000) });
        await sendMail(trx, signInCodeMail({ to: email, code: sent.code, minutes: CODE_MINUTES, url }));
      });
  }
  return { ok: true, headers: setCookiesOf(answer), to: CODE_PAGE };
}

/** The address this browser asked a code for (shown on the code page), if any. */
export function pendingAddress(request: Request): string | null {
  return totpState(request.headers.get("Cookie")).email ?? null;
}

/** The row of this browser's code, with the checks that come before the strategy reads the code. */
async function liveRow(request: Request, by: { link: string } | null) {
  const state = totpState(request.headers.get("Cookie"));
  if (by) {
    const row = await codeBy(db(), "link_hash", sha(by.link));
    if (!row) return { refusal: refused(400, SIGN_IN_MESSAGES.badLink) };
    const early = rowRefusal(row);
    if (early) return { refusal: early };
    if (!state.email || !state.jwe) return { refusal: refused(400, SIGN_IN_MESSAGES.otherBrowser) };
    if (row.token_hash !== sha(state.jwe)) return { refusal: refused(400, SIGN_IN_MESSAGES.olderLink) };
    if (row.email !== state.email.toLowerCase()) return { refusal: refused(400, SIGN_IN_MESSAGES.badLink) };
    return { row };
  }
  if (!state.email || !state.jwe) return { refusal: refused(400, SIGN_IN_MESSAGES.noCode) };
  const row = await codeBy(db(), "token_hash", sha(state.jwe));
  // No row: the address got no mail (not a client), or the cookie was changed. Either way the code is wrong.
  if (!row || row.email !== state.email.toLowerCase()) return { refusal: refused(400, SIGN_IN_MESSAGES.wrong(MAX_WRONG_CODES)) };
  const early = rowRefusal(row);
  return early ? { refusal: early } : { row };
}

function rowRefusal(row: { used_at: Date | null; expires_at: Date; attempts: number }): SignInOutcome | null {
  if (row.used_at) return refused(410, SIGN_IN_MESSAGES.used);
  if (row.attempts >= MAX_WRONG_CODES) return refused(429, SIGN_IN_MESSAGES.tooMany);
  if (row.expires_at.getTime() <= Date.now()) return refused(410, SIGN_IN_MESSAGES.expired);
  return null;
}

/** After the strategy answered: a session for the person, or the reason in words. */
async function finish(ask: Request, answer: Response, row: { id: string; email: string }): Promise<SignInOutcome> {
  const headers = setCookiesOf(answer);
  if (verified.has(ask)) {
    if (!(await useCode(db(), row.id, MAX_WRONG_CODES))) return refused(410, SIGN_IN_MESSAGES.used, headers);
    const userId = await signInEmailUser(db(), row.email);
    headers.append("Set-Cookie", await startSession(userId));
    return { ok: true, headers, to: SUCCESS };
  }
  const error = totpState(strategyCookieOf(answer)).error ?? "";
  if (/expired/i.test(error)) return refused(410, SIGN_IN_MESSAGES.expired, headers);
  const tries = await countWrongCode(db(), row.id);
  if (tries >= MAX_WRONG_CODES) return refused(429, SIGN_IN_MESSAGES.tooMany, headers);
  return refused(400, SIGN_IN_MESSAGES.wrong(MAX_WRONG_CODES - tries), headers);
}

/** Step two, by hand: the code typed on the code page. */
export async function verifySignInCode(request: Request, form: FormData): Promise<SignInOutcome> {
  const over = await limited(() => limitSignIn(request));
  if (over) return refused(429, over.message);
  const code = codeSchema.safeParse(String(form.get("code") ?? ""));
  if (!code.success) return refused(400, SIGN_IN_MESSAGES.badCode);
  const live = await liveRow(request, null);
  if (live.refusal) return live.refusal;
  const ask = new Request(request.url, { method: "POST", headers: { Cookie: request.headers.get("Cookie") ?? "" }, body: new URLSearchParams({ code: code.data }) });
  return finish(ask, await run(ask), live.row);
}

/** Step two, by link: the one-time link from the e-mail, opened in the same browser. */
export async function verifySignInLink(request: Request): Promise<SignInOutcome> {
  const over = await limited(() => limitSignIn(request));
  if (over) return refused(429, over.message);
  const url = new URL(request.url);
  const token = url.searchParams.get("t");
  if (!token || token.length > 2000) return refused(400, SIGN_IN_MESSAGES.badLink);
  const live = await liveRow(request, { link: token });
  if (live.refusal) return live.refusal;
  // The strategy checks the path: ask at LINK_PATH on whatever host the request came to.
  const ask = new Request(new URL(`${LINK_PATH}?t=${encodeURIComponent(token)}`, url.origin), { headers: { Cookie: request.headers.get("Cookie") ?? "" } });
  return finish(ask, await run(ask), live.row);
}
