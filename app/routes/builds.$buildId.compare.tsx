// Compare two revisions of a build: /builds/:buildId/compare?from=a&to=b&template=&view=side.
// The URL is the whole state, so it can be shared. `from` after `to` reads backwards in time.
import { Form, Link, useSearchParams } from "react-router";
import { ModelChanges } from "~/components/revisions/ModelChanges";
import { TextDiffView } from "~/components/revisions/TextDiffView";
import { requireViewer } from "~/lib/auth/auth.server";
import { loadBuildFor } from "~/lib/auth/build-access.server";
import { compareFromUrl } from "~/lib/revisions/compare.server";
import type { Route } from "./+types/builds.$buildId.compare";

export const meta: Route.MetaFunction = ({ data }) => [{ title: data ? `Revision ${data.from.number} → ${data.to.number} · Hiltbench` : "Compare · Hiltbench" }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const v = await requireViewer(request, "view:revisions");
  const b = await loadBuildFor(v, params.buildId);
  const c = await compareFromUrl(v, b, new URL(request.url));
  return { buildId: b.id, current: b.config_version, ...c };
}

function Meta({ label, r }: { label: string; r: { number: number; createdAt: string; authorName: string | null; message: string | null } }) {
  return (
    <div className="card text-sm">
      <p className="label">{label}</p>
      <p>
        Revision <strong>{r.number}</strong> · {r.authorName ?? "unknown"} · <time dateTime={r.createdAt}>{r.createdAt.slice(0, 19).replace("T", " ")} UTC</time>
      </p>
      {r.message ? <p className="text-iron-300">{r.message}</p> : null}
    </div>
  );
}

export default function ComparePage({ loaderData }: Route.ComponentProps) {
  const { buildId, from, to, reversed, template, model, text } = loaderData;
  const [params] = useSearchParams();
  const view = params.get("view") === "side" ? "side" : "unified";
  const withParams = (changes: Record<string, string | null>) => {
    const p = new URLSearchParams(params);
    for (const [k, v] of Object.entries(changes)) (v === null ? p.delete(k) : p.set(k, v));
    return `?${p.toString()}`;
  };
  const api = `/api/builds/${buildId}/diff?from=${from.number}&to=${to.number}&template=${encodeURIComponent(template.ref)}`;
  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-end gap-4">
        <h2 className="text-lg">
          Revision {from.number} → {to.number}
        </h2>
        <Link to={withParams({ from: String(to.number), to: String(from.number) })} className="text-sm">
          Swap
        </Link>
        <Link to={`/builds/${buildId}/revisions`} className="text-sm">
          All revisions
        </Link>
      </div>
      {reversed ? <p className="text-sm text-signal-warning">Reading backwards in time: revision {from.number} is the later one.</p> : null}
      <div className="grid gap-3 sm:grid-cols-2">
        <Meta label="From" r={from} />
        <Meta label="To" r={to} />
      </div>
      <section aria-labelledby="model-h" className="space-y-2">
        <h3 id="model-h">What changed in the config</h3>
        <ModelChanges changes={model} />
      </section>
      <section aria-labelledby="text-h" className="space-y-2">
        <div className="flex flex-wrap items-end gap-4">
          <h3 id="text-h">
            Rendered with {template.name} v{template.version}
          </h3>
          <nav className="flex gap-3 text-sm" aria-label="Diff layout">
            <Link to={withParams({ view: null })} aria-current={view === "unified" ? "page" : undefined}>
              Unified
            </Link>
            <Link to={withParams({ view: "side" })} aria-current={view === "side" ? "page" : undefined}>
              Side by side
            </Link>
          </nav>
          <Form method="get" className="flex items-end gap-2 text-sm">
            <input type="hidden" name="from" value={from.number} />
            <input type="hidden" name="to" value={to.number} />
            {view === "side" ? <input type="hidden" name="view" value="side" /> : null}
            <label className="label" htmlFor="cmp-template">
              Template
            </label>
            <input id="cmp-template" name="template" defaultValue={template.ref} className="field w-56" />
            <button className="btn" type="submit">
              Render
            </button>
          </Form>
        </div>
        <TextDiffView diff={text} view={view} />
        <p className="text-xs text-iron-400">
          As a patch: <code>curl -H "Accept: text/x-diff" -H "Authorization: Bearer …" "{api}" | patch your-file</code>
        </p>
      </section>
    </div>
  );
}
