// Who is asking: GitHub sign-in through remix-auth, the app's own session cookie, and personal
// API tokens. Which GitHub answers (github.com or the local fake) is one setting, AUTH_PROVIDER;
// everything after the token exchange is the same code.
import { Authenticator } from "remix-auth";
import { GitHubStrategy } from "remix-auth-github";
import { OAuth2Strategy } from "remix-auth-oauth2";
import { redirect } from "react-router";
import { db } from "../db/db.server";
import { env } from "../env.server";
import { fail } from "../web/http.server";
import { can, type Permission } from "./permissions";
import { limitApi } from "../limits/rate-limit.server";
import { sessions } from "./session.server";
import { tokenViewerRow } from "../repo/tokens.server";
import { signInGitHubUser, membershipFor, type GitHubProfile } from "../repo/users.server";
import type { Role } from "../db/types";

export type Viewer = {
  user: { id: string; displayName: string; githubLogin: string | null; email: string | null };
  workshop: { id: string; name: string };
  role: Role;
  via: "session" | "token";
};

function githubEndpoints() {
  const e = env();
  if (e.AUTH_PROVIDER === "fake-github") {
    const base = e.FAKE_GITHUB_URL!.replace(/\/$/, "");
    return { api: `${base}/api`, authorize: `${base}/login/oauth/authorize`, token: `${base}/login/oauth/access_token` };
  }
  return { api: "https://api.github.com", authorize: "", token: "" };
}

async function fetchProfile(accessToken: string): Promise<GitHubProfile> {
  const api = githubEndpoints().api;
  const headers = { Authorization: `Bearer ${accessToken}`, Accept: "application/vnd.github+json", "User-Agent": "hiltbench" };
  const [userRes, emailsRes] = await Promise.all([fetch(`${api}/user`, { headers }), fetch(`${api}/user/emails`, { headers })]);
  if (!userRes.ok) fail(502, `GitHub did not return the profile (status ${userRes.status}).`);
  const u = (await userRes.json()) as { login: string; name?: string | null; email?: string | null };
  const emails = emailsRes.ok ? ((await emailsRes.json()) as { email: string; verified: boolean; primary: boolean }[]) : [];
  const verified = emails.filter((m) => m.verified).map((m) => m.email.toLowerCase());
  return { login: u.login, name: u.name ?? u.login, verifiedEmails: verified };
}

let authenticator: Authenticator<string> | undefined;

/** The authenticator's one strategy, "github"; its verify step returns our user id. */
export function auth(): Authenticator<string> {
  if (authenticator) return authenticator;
  const e = env();
  const redirectURI = new URL("/auth/github/callback", e.APP_URL).toString();
  const verify = async ({ tokens }: { tokens: { accessToken(): string } }) => {
    const profile = await fetchProfile(tokens.accessToken());
    return signInGitHubUser(db(), profile);
  };
  const cookie = { name: "__hb_oauth", httpOnly: true as const, sameSite: "Lax" as const, path: "/", ...(e.APP_URL.startsWith("https:") ? { secure: true as const } : {}) };
  authenticator = new Authenticator<string>();
  if (e.AUTH_PROVIDER === "fake-github") {
    const ep = githubEndpoints();
    authenticator.use(
      new OAuth2Strategy(
        { cookie, clientId: "hiltbench-local", clientSecret: "hiltbench-local-secret", authorizationEndpoint: ep.authorize, tokenEndpoint: ep.token, redirectURI, scopes: ["read:user", "user:email"] },
        verify,
      ),
      "github",
    );
  } else {
    authenticator.use(
      new GitHubStrategy({ cookie, clientId: e.GITHUB_CLIENT_ID!, clientSecret: e.GITHUB_CLIENT_SECRET!, redirectURI, scopes: ["read:user", "user:email"] }, verify),
      "github",
    );
  }
  return authenticator;
}

type MembershipRow = NonNullable<Awaited<ReturnType<typeof membershipFor>>>;

async function viewerFromUserId(userId: string, via: Viewer["via"]): Promise<Viewer | null> {
  const m = await membershipFor(db(), userId);
  return m ? viewerOf(m, via) : null;
}

function viewerOf(m: MembershipRow, via: Viewer["via"]): Viewer {
  return {
    user: { id: m.user_id, displayName: m.display_name, githubLogin: m.github_login, email: m.email },
    workshop: { id: m.workshop_id, name: m.workshop_name },
    role: m.role,
    via,
  };
}

export async function getSessionUserId(request: Request): Promise<string | null> {
  const session = await sessions().getSession(request.headers.get("Cookie"));
  return session.get("userId") ?? null;
}

/**
 * Every loader and action starts here. Without a session a page goes to sign-in; with one but
 * no workshop the person is told so; a missing permission is a 403.
 */
export async function requireViewer(request: Request, permission?: Permission): Promise<Viewer> {
  if (new URL(request.url).pathname.startsWith("/api/")) await limitApi(request);
  const authz = request.headers.get("Authorization");
  let viewer: Viewer | null = null;
  if (authz) {
    const match = /^Bearer\s+(\S+)$/i.exec(authz);
    if (!match) fail(401, "The Authorization header must be 'Bearer <token>'.");
    const found = await tokenViewerRow(db(), match[1]);
    if (!found) fail(401, "This API token is not valid (unknown or revoked).");
    viewer = found.member ? viewerOf(found.member, "token") : null;
  } else {
    const userId = await getSessionUserId(request);
    if (!userId) {
      const url = new URL(request.url);
      throw redirect(`/login?next=${encodeURIComponent(url.pathname + url.search)}`);
    }
    // Cross-site changes were refused before any loader or action ran (web/guard.server.ts).
    viewer = await viewerFromUserId(userId, "session");
  }
  if (!viewer) fail(403, "You are signed in but not a member of any workshop yet. Ask a workshop owner to invite you.");
  if (permission) requirePermission(viewer, permission);
  return viewer;
}

/** For an action whose permission depends on what the form asks (after `requireViewer` guarded the route): 403 without it. */
export function requirePermission(v: Viewer, permission: Permission): void {
  if (!can(v.role, permission)) fail(403, `Your role (${v.role}) does not allow this.`);
}
