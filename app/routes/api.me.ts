import { requireViewer } from "~/lib/auth/auth.server";
import { apiAnswer, json } from "~/lib/web/http.server";
import type { Route } from "./+types/api.me";

export function loader({ request }: Route.LoaderArgs) {
  return apiAnswer(async () => {
    const v = await requireViewer(request, "use:api");
    return json({ user: { id: v.user.id, name: v.user.displayName, githubLogin: v.user.githubLogin, email: v.user.email }, role: v.role, workshop: v.workshop });
  });
}
