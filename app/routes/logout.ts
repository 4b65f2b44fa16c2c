import { redirect } from "react-router";
import { sessions } from "~/lib/auth/session.server";
import type { Route } from "./+types/logout";

export async function loader() {
  return redirect("/");
}

export async function action({ request }: Route.ActionArgs) {
  const store = sessions();
  const session = await store.getSession(request.headers.get("Cookie"));
  return redirect("/", { headers: { "Set-Cookie": await store.destroySession(session) } });
}
