// A client's builds, each with its stage in plain words (decision 023).
import { Link } from "react-router";
import { requireViewer } from "~/lib/auth/auth.server";
import { handoffList } from "~/lib/handoff/service.server";
import type { Route } from "./+types/handoff._index";

export const meta: Route.MetaFunction = () => [{ title: "Your builds · Hiltbench" }];

export async function loader({ request }: Route.LoaderArgs) {
  const v = await requireViewer(request, "view:handoff");
  return { builds: await handoffList(v) };
}

export default function HandoffList({ loaderData }: Route.ComponentProps) {
  const { builds } = loaderData;
  return (
    <div>
      <h1>Your builds</h1>
      {builds.length === 0 ? (
        <p className="mt-4 text-iron-300">There is no build for you yet. The workshop e-mails you when there is news.</p>
      ) : (
        <ul className="mt-6 space-y-3" data-testid="handoff-builds">
          {builds.map((b) => (
            <li key={b.id} className="card">
              <h2 className="text-lg">
                <Link to={`/handoff/${b.id}`}>{b.name}</Link>
              </h2>
              <p className="mt-1">
                <span className="font-semibold">{b.stage.label}.</span> <span className="text-iron-300">{b.stage.detail}</span>
              </p>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
