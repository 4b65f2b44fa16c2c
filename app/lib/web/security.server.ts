// Headers for every page. The policy has no 'unsafe-eval': nothing in Hiltbench (the template
// language included) turns text into code. Inline scripts stay allowed because React Router
// streams its hydration data inline. Form posts may go on to the sign-in provider only.
import { env } from "../env.server";

let cached: Record<string, string> | undefined;

export function securityHeaders(): Record<string, string> {
  if (cached) return cached;
  const e = env();
  const signIn = e.AUTH_PROVIDER === "fake-github" ? new URL(e.FAKE_GITHUB_URL!).origin : "https://github.com";
  cached = {
    "Content-Security-Policy": [
      "default-src 'self'",
      "script-src 'self' 'unsafe-inline'",
      "style-src 'self' 'unsafe-inline'",
      "img-src 'self' data: blob:",
      "font-src 'self' data:", // small font files are inlined by the bundler
      "connect-src 'self'",
      "object-src 'none'",
      "base-uri 'self'",
      "frame-ancestors 'none'",
      `form-action 'self' ${signIn}`,
    ].join("; "),
    "X-Content-Type-Options": "nosniff",
    "Referrer-Policy": "same-origin",
    "X-Frame-Options": "DENY",
  };
  return cached;
}
