// The build's reviews: every request (revision, who asked, reviewers and their verdicts) and,
// for those who may, asking reviewers to read the current revision.
import { Form, Link, redirect, useActionData, useNavigation } from "react-router";
import { requireViewer } from "~/lib/auth/auth.server";
import { loadBuildFor } from "~/lib/auth/build-access.server";
import { requestReview } from "~/lib/review/service.server";
import { actorOf, readReviewForm, renderForReview, reviewDeps } from "~/lib/review/web.server";
import { MAX_NOTE_CHARS } from "~/lib/review/rules";
import { fail } from "~/lib/web/http.server";
import { openReviewsPage } from "~/lib/review/pages.server";
import type { Route } from "./+types/builds.$buildId.reviews._index";

export const meta: Route.MetaFunction = ({ matches }) => {
  const build = (matches.find((m) => m?.id === "routes/builds.$buildId")?.data as { build?: { name?: string } } | undefined)?.build;
  return [{ title: `Reviews · ${build?.name ?? "Build"} · Hiltbench` }];
};

const STATE_LABELS = { open: "In review", approved: "Approved", "changes-requested": "Changes requested" } as const;

export async function loader({ request, params }: Route.LoaderArgs) {
  const v = await requireViewer(request, "view:reviews");
  return openReviewsPage(v, params.buildId);
}

export async function action({ request, params }: Route.ActionArgs) {
  const v = await requireViewer(request, "request:review");
  const b = await loadBuildFor(v, params.buildId);
  const form = await readReviewForm(request);
  if (form.get("intent") !== "request") fail(400, "Unknown action.");
  const note = form.get("note") ?? "";
  if (note.length > MAX_NOTE_CHARS) fail(413, `The note is longer than ${MAX_NOTE_CHARS} characters.`);
  const reviewerIds = form.getAll("reviewer");
  if (reviewerIds.length === 0) fail(400, "Choose at least one reviewer.");
  const rendered = await renderForReview(v, b);
  const id = await requestReview(reviewDeps(), actorOf(v), b, { reviewerIds, note, rendered });
  return redirect(`/builds/${b.id}/reviews/${id}`);
}

export default function Reviews({ loaderData }: Route.ComponentProps) {
  const { revision, openForCurrent, canRequest, candidates, requests } = loaderData;
  const nav = useNavigation();
  useActionData<typeof action>();
  return (
    <div className="grid gap-6 lg:grid-cols-[2fr_1fr]">
      <section aria-labelledby="reviews-heading">
        <h2 id="reviews-heading">Reviews</h2>
        {requests.length === 0 ? (
          <p className="mt-3 text-sm text-iron-400">No review has been asked for yet.</p>
        ) : (
          <table className="table mt-3">
            <thead>
              <tr>
                <th scope="col">Revision</th>
                <th scope="col">State</th>
                <th scope="col">Asked by</th>
                <th scope="col">Reviewers</th>
              </tr>
            </thead>
            <tbody>
              {requests.map((r) => (
                <tr key={r.id}>
                  <td>
                    <Link to={r.id}>Revision {r.revision}</Link>
                    {r.revision === revision ? <span className="ml-2 text-xs text-iron-400">current</span> : null}
                  </td>
                  <td data-testid="review-state">{STATE_LABELS[r.state]}</td>
                  <td>{r.by}</td>
                  <td className="text-iron-300">
                    {r.reviewers.map((x) => `${x.name}${x.verdict ? ` (${x.verdict === "approved" ? "approved" : "changes requested"})` : ""}`).join(", ")}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>
      {canRequest ? (
        <aside className="card">
          <h3>Ask for a review</h3>
          {openForCurrent ? (
            <p className="mt-2 text-sm text-iron-300">Revision {revision} is in review.</p>
          ) : candidates.length === 0 ? (
            <p className="mt-2 text-sm text-iron-300">Nobody in the workshop can review yet: invite a reviewer on the Workshop page.</p>
          ) : (
            <Form method="post" className="mt-3 space-y-3">
              <p className="text-sm text-iron-300">Reviewers read revision {revision} as it renders, comment on its lines and approve it or ask for changes. Each gets an e-mail.</p>
              <fieldset>
                <legend className="label">Reviewers</legend>
                {candidates.map((c) => (
                  <label key={c.id} className="flex items-center gap-2 text-sm">
                    <input type="checkbox" name="reviewer" value={c.id} /> {c.name} <span className="text-iron-400">({c.role})</span>
                  </label>
                ))}
              </fieldset>
              <label className="block">
                <span className="label">Note (optional)</span>
                <textarea name="note" className="field" rows={3} maxLength={2000} />
              </label>
              <button type="submit" name="intent" value="request" className="btn btn-primary" disabled={nav.state !== "idle"}>
                Ask for review of revision {revision}
              </button>
            </Form>
          )}
        </aside>
      ) : null}
    </div>
  );
}
