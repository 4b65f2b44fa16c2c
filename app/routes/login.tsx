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
      <p className="mt-3 text-iron-300">Workshop members sign in with their GitHub account.</p>
      <Form method="post" action="/auth/github" className="mt-8">
        <input type="hidden" name="next" value={next} />
        <button type="submit" className="btn btn-primary">
          Sign in with GitHub
        </button>
      </Form>
      {params.get("error") ? (
        <p className="mt-6 text-signal-error" role="alert">
          {params.get("error")}
        </p>
      ) : null}
    </main>
  );
}
