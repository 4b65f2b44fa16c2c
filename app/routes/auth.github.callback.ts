// GitHub sends the browser back here with a code; remix-auth exchanges it, our verify step
// finds or creates the person, and we keep our own session.
import { redirect } from "react-router";
import { auth } from "~/lib/auth/auth.server";
import { sessions } from "~/lib/auth/session.server";
import { nextCookie, safeNext } from "./auth.github";
import { limitSignIn } from "~/lib/limits/rate-limit.server";
import type { Route } from "./+types/auth.github.callback";

export async function loader({ request }: Route.LoaderArgs) {
  await limitSignIn(request);
  let userId: string;
  try {
    userId = await auth().authenticate("github", request);
  } catch (e) {
    if (e instanceof Response) throw e;
    const why = e instanceof Error ? e.message : "unknown error";
    throw redirect(`/login?error=${encodeURIComponent(`Sign-in failed: ${why}`)}`);
  }
  const cookies = request.headers.get("Cookie");
  const next = safeNext(await nextCookie.parse(cookies));
  const store = sessions();
  const session = await store.getSession(); // a fresh id on every sign-in
  session.set("userId", userId);
  const headers = new Headers();
  headers.append("Set-Cookie", await store.commitSession(session));
  headers.append("Set-Cookie", await nextCookie.serialize("", { maxAge: 0 }));
  return redirect(next, { headers });
}
