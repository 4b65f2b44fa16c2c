// The one-time link from the sign-in e-mail (decision 023): signs the client in, or says why not.
import { data, Link, redirect } from "react-router";
import { verifySignInLink } from "~/lib/auth/email-sign-in.server";
import { clientLanding } from "~/lib/auth/sign-in-words";
import { nextCookie } from "./auth.github";
import type { Route } from "./+types/login.link";

export const meta: Route.MetaFunction = () => [{ title: "Sign in · Hiltbench" }];

export async function loader({ request }: Route.LoaderArgs) {
  const outcome = await verifySignInLink(request);
  if (outcome.ok) {
    const next = clientLanding(await nextCookie.parse(request.headers.get("Cookie")));
    outcome.headers.append("Set-Cookie", await nextCookie.serialize("", { maxAge: 0 }));
    throw redirect(next, { headers: outcome.headers });
  }
  return data({ error: outcome.message }, { status: outcome.status, headers: outcome.headers });
}

export default function SignInLink({ loaderData }: Route.ComponentProps) {
  return (
    <main className="mx-auto max-w-md px-6 py-20">
      <h1>This link did not sign you in</h1>
      <p className="mt-4 text-signal-error" role="alert">
        {loaderData.error}
      </p>
      <p className="mt-6">
        <Link to="/login">Back to sign-in</Link>
      </p>
    </main>
  );
}
