import { requireViewer } from "~/lib/auth/auth.server";
import { apiAnswer, jsonAs } from "~/lib/web/http.server";
import { meAnswer } from "~/lib/api-doc/shapes";
import type { Route } from "./+types/api.me";

export function loader({ request }: Route.LoaderArgs) {
  return apiAnswer(async () => {
    const v = await requireViewer(request, "use:api");
    return jsonAs(meAnswer, { user: { id: v.user.id, name: v.user.displayName, githubLogin: v.user.githubLogin, email: v.user.email }, role: v.role, workshop: v.workshop });
  });
}
