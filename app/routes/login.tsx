import { Form, redirect, useSearchParams } from "react-router";
import { getSessionUserId } from "~/lib/auth/auth.server";
import type { Route } from "./+types/login";

export const meta: Route.MetaFunction = () => [{ title: "Sign in · Hiltbench" }];

export async function loader({ request }: Route.LoaderArgs) {
  if (await getSessionUserId(request)) throw redirect("/builds");
  return null;
}

export default function Login() {
  const [params] = useSearchParams();
  const next = params.get("next") ?? "/builds";
  return (
    <main className="mx-auto max-w-md px-6 py-20">
      <h1>Sign in to Hiltbench</h1>
      <section aria-labelledby="workshop-sign-in" className="mt-8">
        <h2 id="workshop-sign-in" className="text-lg">
          Workshop members
        </h2>
        <p className="mt-1 text-iron-300">Owners, builders and reviewers sign in with their GitHub account.</p>
        <Form method="post" action="/auth/github" className="mt-4">
          <input type="hidden" name="next" value={next} />
          <button type="submit" className="btn btn-primary">
            Sign in with GitHub
          </button>
        </Form>
      </section>
      <section aria-labelledby="client-sign-in" className="card mt-10">
        <h2 id="client-sign-in" className="text-lg">
          Clients: sign in with your e-mail
        </h2>
        <p className="mt-1 text-sm text-iron-300">We e-mail you a code and a one-time link; no password, no GitHub account needed.</p>
        <Form method="post" action="/login/code" className="mt-4 space-y-3">
          <input type="hidden" name="intent" value="send" />
          {next.startsWith("/handoff/") ? <input type="hidden" name="next" value={next} /> : null}
          <label className="block">
            <span className="text-sm">Your e-mail address</span>
            <input type="email" name="email" required autoComplete="email" className="field mt-1" />
          </label>
          <button type="submit" className="btn">
            E-mail me a code
          </button>
        </Form>
      </section>
      {params.get("error") ? (
        <p className="mt-6 text-signal-error" role="alert">
          {params.get("error")}
        </p>
      ) : null}
    </main>
  );
}
