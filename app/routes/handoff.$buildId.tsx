// A build's handoff sheet (decision 023): its stage; once released, the released revision's
// controls in plain words (the same words as handoff.html on the card), its presets with a live
// preview and their fonts, the cell cautions, and the card zip with its SHA-256 and size.
import { useState } from "react";
import { requireViewer } from "~/lib/auth/auth.server";
import { can } from "~/lib/auth/permissions";
import { handoffSheetFor } from "~/lib/handoff/service.server";
import { listRequestsFor } from "~/lib/requests/service.server";
import { ClientRequests } from "~/components/requests/ClientRequests";
import { sizeInWords } from "~/lib/handoff/words";
import { LivePreview } from "~/components/looks/LivePreview";
import { SafetyCautions } from "~/components/SafetyCautions";
import type { Route } from "./+types/handoff.$buildId";

export const meta: Route.MetaFunction = ({ data }) => [{ title: `${data?.build.name ?? "Your build"} · Hiltbench` }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const v = await requireViewer(request, "view:handoff");
  const sheet = await handoffSheetFor(v, params.buildId);
  // The client's requests to the workshop; members read them here as the client does and answer on the Requests tab.
  const requests = can(v.role, "view:requests") ? await listRequestsFor(v, sheet.build.id) : [];
  return {
    ...sheet,
    canAsk: v.role === "client" && can(v.role, "ask:request"),
    requests: requests.map((r) => ({ id: r.id, kindLabel: r.kindLabel, message: r.message, statusLabel: r.statusLabel, reply: r.reply, askedAt: r.askedAt.toISOString(), open: r.open })),
  };
}

export default function HandoffSheet({ loaderData }: Route.ComponentProps) {
  const { build, release, requests, canAsk } = loaderData;
  return (
    <article className="space-y-8">
      <header>
        <h1>{build.name}</h1>
        <p className="mt-2" data-testid="handoff-stage">
          <span className="font-semibold">{build.stage.label}.</span> <span className="text-iron-300">{build.stage.detail}</span>
        </p>
      </header>
      {release ? <Released buildId={build.id} release={release} /> : <NotYet />}
      {canAsk || requests.length > 0 ? <ClientRequests buildId={build.id} requests={requests} canAsk={canAsk} /> : null}
    </article>
  );
}

function NotYet() {
  return (
    <section className="card" aria-labelledby="not-yet" data-testid="handoff-not-released">
      <h2 id="not-yet" className="text-lg">
        Not released yet
      </h2>
      <p className="mt-2 text-iron-300">
        Your saber is still in the workshop. When its card is ready, the workshop e-mails you, and this page shows the controls, the presets and the
        card to download.
      </p>
    </section>
  );
}

type Release = NonNullable<Route.ComponentProps["loaderData"]["release"]>;

function Released({ buildId, release }: { buildId: string; release: Release }) {
  const [presetId, setPresetId] = useState(release.presets[0]?.id ?? "");
  const chosen = release.presets.find((p) => p.id === presetId);
  return (
    <>
      {release.note ? (
        <section aria-labelledby="note" className="card">
          <h2 id="note" className="text-lg">
            A note from the workshop
          </h2>
          <p className="mt-2 whitespace-pre-wrap">{release.note}</p>
        </section>
      ) : null}

      <section aria-labelledby="controls">
        <h2 id="controls">Controls</h2>
        <table className="table mt-3" data-testid="handoff-controls">
          <thead>
            <tr>
              <th scope="col">What happens</th>
              <th scope="col">What to do</th>
            </tr>
          </thead>
          <tbody>
            {release.controls.map((c, i) => (
              <tr key={i}>
                <td>{c.what}</td>
                <td>{c.how}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </section>

      <section aria-labelledby="presets">
        <h2 id="presets">Presets</h2>
        <p className="mt-1 text-sm text-iron-300">The saber steps through them in this order. Choose one to see it lit.</p>
        <ol className="mt-3 flex flex-wrap gap-2" data-testid="handoff-presets">
          {release.presets.map((p) => (
            <li key={p.id}>
              <button type="button" className={`btn ${p.id === presetId ? "btn-primary" : ""}`} aria-pressed={p.id === presetId} onClick={() => setPresetId(p.id)}>
                {p.position}. {p.name} <span className="text-xs">· sound font {p.font}</span>
              </button>
            </li>
          ))}
        </ol>
        {chosen ? (
          <div className="mt-4" data-testid="handoff-preview-of">
            <p className="mb-2 text-sm">
              {chosen.name}, with the sound font <strong>{chosen.font}</strong>
            </p>
            <LivePreview key={chosen.id} config={release.config} presetId={chosen.id} />
          </div>
        ) : null}
      </section>

      <SafetyCautions headingLevel={2} cellOnly />

      <section aria-labelledby="card" className="card">
        <h2 id="card" className="text-lg">
          Your card
        </h2>
        <p className="mt-2 text-iron-300">
          Release {release.number}, {new Date(release.releasedAt).toLocaleDateString("en-GB", { day: "numeric", month: "long", year: "numeric", timeZone: "UTC" })}. The
          zip holds everything on the saber's SD card: the settings, the sound fonts, a readable copy and this sheet (handoff.html).
        </p>
        <p className="mt-4">
          <a className="btn btn-primary" href={`/api/builds/${buildId}/release-bundle`} download={release.fileName} data-testid="handoff-download">
            Download the card zip
          </a>
        </p>
        <dl className="mt-4 grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
          <dt className="text-iron-400">File</dt>
          <dd className="font-mono">{release.fileName}</dd>
          <dt className="text-iron-400">Size</dt>
          <dd data-testid="handoff-size">{sizeInWords(release.bytes)}</dd>
          <dt className="text-iron-400">SHA-256</dt>
          <dd className="break-all font-mono" data-testid="handoff-sha256">
            {release.sha256}
          </dd>
        </dl>
        <p className="mt-3 text-xs text-iron-300">
          To check the download is whole, compare its SHA-256 with the one above: <code>sha256sum</code> on Linux, <code>shasum -a 256</code> on macOS,{" "}
          <code>certutil -hashfile &lt;file&gt; SHA256</code> on Windows.
        </p>
      </section>
    </>
  );
}
