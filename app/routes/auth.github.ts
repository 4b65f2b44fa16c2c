// Starts GitHub sign-in: remix-auth answers with a redirect to the authorization page (GitHub
// or the local fake) and a cookie holding the OAuth state.
import { createCookie, redirect } from "react-router";
import { auth } from "~/lib/auth/auth.server";
import { limitSignIn } from "~/lib/limits/rate-limit.server";
import type { Route } from "./+types/auth.github";

export const nextCookie = createCookie("__hb_next", { httpOnly: true, sameSite: "lax", path: "/", maxAge: 600 });

export function safeNext(value: unknown): string {
  return typeof value === "string" && value.startsWith("/") && !value.startsWith("//") && !value.startsWith("/\\") ? value : "/builds";
}

export async function loader() {
  return redirect("/login");
}

export async function action({ request }: Route.ActionArgs) {
  await limitSignIn(request);
  const form = await request.clone().formData().catch(() => new FormData());
  const next = safeNext(form.get("next"));
  try {
    await auth().authenticate("github", request);
  } catch (e) {
    if (e instanceof Response) {
      e.headers.append("Set-Cookie", await nextCookie.serialize(next));
      throw e;
    }
    throw redirect(`/login?error=${encodeURIComponent("GitHub sign-in could not start. Try again.")}`);
  }
  return redirect("/login");
}
