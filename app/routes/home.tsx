import { redirect, Link } from "react-router";
import { getSessionUserId } from "~/lib/auth/auth.server";
import type { Route } from "./+types/home";

export const meta: Route.MetaFunction = () => [{ title: "Hiltbench" }];

export async function loader({ request }: Route.LoaderArgs) {
  if (await getSessionUserId(request)) throw redirect("/builds");
  return null;
}

export default function Home() {
  return (
    <main className="mx-auto max-w-2xl px-6 py-20">
      <p className="font-mono text-sm text-ember-400">hiltbench</p>
      <h1 className="mt-2 text-4xl">The workbench for saber installs</h1>
      <p className="mt-6 text-iron-300">
        Model each commission's rig, compose a look for every channel and font, check power and wiring, render the
        board config, review it with a teammate and hand the client a card they can trust.
      </p>
      <p className="mt-10">
        <Link to="/login" className="btn btn-primary">
          Sign in
        </Link>
      </p>
    </main>
  );
}
