// A tiny HTTP client that keeps cookies and signs in through the local fake GitHub the way the
// login page's button does; for system tests and the load bench (no browser needed).
/** Keeps name=value pairs from Set-Cookie; never follows redirects. */
export class Browser {
  cookies = new Map<string, string>();
  constructor(public origin: string) {}
  cookieHeader() {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join("; ");
  }
  async fetch(url: string, init: RequestInit = {}): Promise<Response> {
    const headers = new Headers(init.headers);
    if (this.cookies.size) headers.set("Cookie", this.cookieHeader());
    const r = await fetch(new URL(url, this.origin), { ...init, headers, redirect: "manual" });
    for (const c of r.headers.getSetCookie()) {
      const [pair] = c.split(";");
      const i = pair.indexOf("=");
      const name = pair.slice(0, i).trim();
      const value = pair.slice(i + 1).trim();
      if (/max-age=0|expires=thu, 01 jan 1970/i.test(c) || value === "") this.cookies.delete(name);
      else this.cookies.set(name, value);
    }
    return r;
  }
  /** Sign in through the local fake GitHub as `login`, the way the login page's button does. */
  async signIn(login: string) {
    const start = await this.fetch("/auth/github", { method: "POST", body: new URLSearchParams({ next: "/builds" }), headers: { Origin: this.origin } });
    if (start.status !== 302) throw new Error(`sign-in start answered ${start.status}`);
    const authorize = new URL(start.headers.get("location")!);
    const approve = new URL("/login/oauth/approve", authorize.origin);
    for (const k of ["redirect_uri", "state", "code_challenge", "code_challenge_method", "client_id"]) approve.searchParams.set(k, authorize.searchParams.get(k) ?? "");
    approve.searchParams.set("login", login);
    const granted = await fetch(approve, { redirect: "manual" });
    if (granted.status !== 302) throw new Error(`fake GitHub answered ${granted.status}`);
    const done = await this.fetch(granted.headers.get("location")!);
    if (done.status !== 302 || !this.cookies.has("__hb_session")) throw new Error(`sign-in callback answered ${done.status}: ${await done.text()}`);
  }
}
