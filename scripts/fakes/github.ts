// A local stand-in for GitHub's OAuth and user API, on loopback only. It speaks the same
// protocol the real client libraries speak (authorization code with PKCE, form-encoded token
// exchange, /user and /user/emails), so the app's code path is the production one.
import { createHash, randomBytes } from "node:crypto";
import http from "node:http";

type Identity = { login: string; name: string; email: string };

export const FAKE_IDENTITIES: Identity[] = [
  { login: "demo-owner", name: "Demo Owner", email: "owner@ember-anvil.example.test" },
  { login: "demo-builder", name: "Demo Builder", email: "builder@ember-anvil.example.test" },
  { login: "demo-reviewer", name: "Demo Reviewer", email: "reviewer@ember-anvil.example.test" },
  { login: "client-one", name: "Client One", email: "client-one@example.test" },
  { login: "client-two", name: "Client Two", email: "client-two@example.test" },
];

const esc = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

function identityFor(login: string): Identity {
  return FAKE_IDENTITIES.find((i) => i.login === login) ?? { login, name: login, email: `${login}@example.test` };
}

function isLoopback(uri: string) {
  try {
    const u = new URL(uri);
    return u.protocol === "http:" && ["127.0.0.1", "localhost", "[::1]"].includes(u.hostname);
  } catch {
    return false;
  }
}

function page(params: URLSearchParams) {
  const hidden = ["redirect_uri", "state", "code_challenge", "code_challenge_method", "client_id"]
    .map((k) => `<input type="hidden" name="${k}" value="${esc(params.get(k) ?? "")}">`)
    .join("");
  const buttons = FAKE_IDENTITIES.map(
    (i) => `<button name="login" value="${esc(i.login)}" type="submit">Continue as ${esc(i.login)}</button>`,
  ).join("");
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>Local GitHub sign-in (fake)</title>
<style>body{font:16px system-ui;background:#111;color:#eee;max-width:32rem;margin:3rem auto}button{display:block;margin:.5rem 0;padding:.6rem 1rem;font:inherit}</style></head>
<body><h1>Local GitHub sign-in</h1><p>This page stands in for GitHub on this machine. Choose who you are.</p>
<form method="get" action="/login/oauth/approve">${hidden}${buttons}</form>
<form method="get" action="/login/oauth/approve">${hidden}<label>Another login <input name="login" required pattern="[A-Za-z0-9-]{1,39}"></label><button type="submit">Continue</button></form>
</body></html>`;
}

export function startFakeGitHub(port: number, host = "127.0.0.1"): Promise<{ url: string; close: () => void }> {
  const codes = new Map<string, { login: string; challenge: string | null; redirectUri: string }>();
  const tokens = new Map<string, string>();

  const server = http.createServer(async (req, res) => {
    const url = new URL(req.url ?? "/", `http://${host}`);
    const send = (status: number, body: string, type = "application/json") => {
      res.writeHead(status, { "Content-Type": type });
      res.end(body);
    };
    if (req.method === "GET" && url.pathname === "/login/oauth/authorize") {
      const redirect = url.searchParams.get("redirect_uri") ?? "";
      if (!isLoopback(redirect)) return send(400, JSON.stringify({ error: "redirect_uri must be on loopback" }));
      return send(200, page(url.searchParams), "text/html; charset=utf-8");
    }
    if (req.method === "GET" && url.pathname === "/login/oauth/approve") {
      const redirect = url.searchParams.get("redirect_uri") ?? "";
      const login = url.searchParams.get("login") ?? "";
      if (!isLoopback(redirect) || !/^[A-Za-z0-9-]{1,39}$/.test(login)) return send(400, JSON.stringify({ error: "bad request" }));
      const code = randomBytes(16).toString("hex");
      codes.set(code, { login, challenge: url.searchParams.get("code_challenge"), redirectUri: redirect });
      const back = new URL(redirect);
      back.searchParams.set("code", code);
      back.searchParams.set("state", url.searchParams.get("state") ?? "");
      res.writeHead(302, { Location: back.toString() });
      return res.end();
    }
    if (req.method === "POST" && url.pathname === "/login/oauth/access_token") {
      let body = "";
      for await (const chunk of req) body += chunk;
      const form = new URLSearchParams(body);
      const grant = codes.get(form.get("code") ?? "");
      if (!grant) return send(400, JSON.stringify({ error: "bad_verification_code" }));
      codes.delete(form.get("code")!);
      if (grant.challenge) {
        const verifier = form.get("code_verifier") ?? "";
        const digest = createHash("sha256").update(verifier).digest("base64url");
        if (digest !== grant.challenge) return send(400, JSON.stringify({ error: "invalid_grant", error_description: "PKCE check failed" }));
      }
      const token = `fake_${randomBytes(16).toString("hex")}`;
      tokens.set(token, grant.login);
      return send(200, JSON.stringify({ access_token: token, token_type: "bearer", scope: "read:user,user:email" }));
    }
    if (req.method === "GET" && url.pathname.startsWith("/api/")) {
      const login = tokens.get((req.headers.authorization ?? "").replace(/^(Bearer|token)\s+/i, ""));
      if (!login) return send(401, JSON.stringify({ message: "Bad credentials" }));
      const who = identityFor(login);
      if (url.pathname === "/api/user")
        return send(200, JSON.stringify({ login: who.login, id: parseInt(createHash("sha1").update(who.login).digest("hex").slice(0, 8), 16), name: who.name, email: who.email }));
      if (url.pathname === "/api/user/emails") return send(200, JSON.stringify([{ email: who.email, primary: true, verified: true }]));
    }
    send(404, JSON.stringify({ message: "Not Found" }));
  });
  return new Promise((resolve) => {
    server.listen(port, host, () => {
      const addr = server.address() as { port: number };
      resolve({ url: `http://${host}:${addr.port}`, close: () => server.close() });
    });
  });
}
