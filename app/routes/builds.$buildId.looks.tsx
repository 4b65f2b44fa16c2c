// A build's presets and looks: the look editor for builders and owners, the same screen
// read-only for reviewers and clients. Saving and checking go through the JSON API.
import { LookEditor } from "~/components/looks/LookEditor";
import { requireViewer } from "~/lib/auth/auth.server";
import { loadBuildFor } from "~/lib/auth/build-access.server";
import type { Config } from "~/lib/config/schema";
import { can } from "~/lib/auth/permissions";
import type { Route } from "./+types/builds.$buildId.looks";

export const meta: Route.MetaFunction = ({ matches }) => {
  const build = (matches.find((m) => m?.id === "routes/builds.$buildId")?.data as { build?: { name?: string } } | undefined)?.build;
  return [{ title: `Looks · ${build?.name ?? "Build"} · Hiltbench` }];
};

export async function loader({ request, params }: Route.LoaderArgs) {
  const v = await requireViewer(request, "view:builds");
  const b = await loadBuildFor(v, params.buildId);
  return { buildId: b.id, config: b.config as Config, version: b.config_version, canEdit: can(v.role, "edit:build") };
}

export default function LooksPage({ loaderData }: Route.ComponentProps) {
  const { buildId, config, version, canEdit } = loaderData;
  // A new version (another tab saved, or a reload) starts the editor afresh.
  return <LookEditor key={`${buildId}-${version}`} buildId={buildId} initial={config} version={version} canEdit={canEdit} />;
}
