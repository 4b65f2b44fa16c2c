// The bench check and the release, as routes and the API use them. A release needs an approved
// revision (a review request on it in state "approved"), every bench-check item of that revision
// ticked, and a bundle plan without errors; then the bundle's zip is streamed through SHA-256
// (never stored: the same inputs give the same bytes), and the release row, the build's status
// and the client's e-mail are written in one transaction. Every refusal changes nothing.
import { createHash } from "node:crypto";
import type { Readable } from "node:stream";
import type { Transaction } from "kysely";
import type { Viewer } from "../auth/auth.server";
import { requirePermission } from "../auth/auth.server";
import { can } from "../auth/permissions";
import type { BuildRow } from "../db/types";
import { db } from "../db/db.server";
import type { Database } from "../db/types";
import { bundleFor } from "../bundle/service.server";
import { zipBundle } from "../bundle/zip.server";
import { appLink, sendMail } from "../mail/mailer.server";
import type { MailMessage } from "../mail/messages";
import * as repo from "../repo/releases.server";
import { revisionOf } from "../revisions/compare.server";
import { storage } from "../storage/settings.server";
import { fail } from "../web/http.server";
import { benchChecklist } from "./checklist";
import { releaseBlocker, type BenchCheck } from "./rules";
import { releasedMail } from "./mail";
import type { ReleaseInput } from "./requests";

type Build = Pick<BuildRow, "id" | "name" | "client_name" | "status" | "config" | "config_version" | "archived_at" | "config_saved_at" | "pinned_template_id" | "pinned_template_version">;

export async function benchCheckFor(v: Viewer, b: Build, n: number): Promise<BenchCheck> {
  requirePermission(v, "view:release");
  const r = await revisionOf(v, b, n);
  const ticks = new Map((await repo.ticksOf(db(), b.id, n)).map((t) => [t.item_key, { by: t.ticked_by_name ?? null, at: t.ticked_at.toISOString() }]));
  const groups = benchChecklist(r.config).map((g) => ({ ...g, items: g.items.map((i) => ({ ...i, tick: ticks.get(i.key) ?? null })) }));
  const items = groups.flatMap((g) => g.items);
  return { revision: n, groups, ticked: items.filter((i) => i.tick).length, total: items.length };
}

/** Tick or untick one item of revision `n`'s bench check; answers the check as it now stands. */
export async function setTickFor(v: Viewer, b: Build, n: number, item: string, ticked: boolean): Promise<BenchCheck> {
  requirePermission(v, "check:bench");
  if (b.archived_at) fail(409, "This build is archived; restore it before working on its bench check.");
  const r = await revisionOf(v, b, n);
  if (!benchChecklist(r.config).some((g) => g.items.some((i) => i.key === item)))
    fail(422, `The bench check of revision ${n} has no item '${item.slice(0, 80)}'; nothing was changed.`);
  if (ticked) await repo.tick(db(), b.id, n, item, v.user.id);
  else await repo.untick(db(), b.id, n, item);
  return benchCheckFor(v, b, n);
}

/** The zip's SHA-256 and size, read as it streams (nothing is kept). */
export async function digestStream(stream: Readable): Promise<{ sha256: string; bytes: number }> {
  const h = createHash("sha256");
  let bytes = 0;
  for await (const chunk of stream) {
    h.update(chunk as Buffer);
    bytes += (chunk as Buffer).length;
  }
  return { sha256: h.digest("hex"), bytes };
}

export type { BenchCheck, CheckedItem, Tick } from "./rules";
export { releaseBlocker };

export type ReleaseDeps = {
  /** Put a message in the outbox inside the release's transaction. */
  enqueue: (trx: Transaction<Database>, m: MailMessage) => Promise<unknown>;
  link: (path: string) => string;
};
export const releaseDeps = (): ReleaseDeps => ({ enqueue: (trx, m) => sendMail(trx, m), link: appLink });

export type Release = {
  id: string;
  number: number;
  revision: number;
  template: string;
  names: "long" | "8.3";
  card: number;
  sha256: string;
  bytes: number;
  note: string;
  releasedBy: string | null;
  releasedAt: string;
  /** The bundle's download address, with the release's own choices. */
  download: string;
};

/**
 * The bundle's address with the release's choices: the template and the version it rendered
 * with, named exactly, so the same bytes come back after the template (or the build's pin)
 * changes.
 */
export function downloadHref(buildId: string, r: { revision: number; template_ref: string; template_version: number; name_mode: string; card_gb: string | number }): string {
  const q = new URLSearchParams({ revision: String(r.revision), template: r.template_ref, version: String(r.template_version) });
  q.set("names", r.name_mode);
  q.set("card", String(Number(r.card_gb)));
  return `/api/builds/${buildId}/bundle?${q}`;
}

function releaseOf(buildId: string, r: repo.ReleaseRow): Release {
  return {
    id: r.id,
    number: r.number,
    revision: r.revision,
    template: r.template_ref,
    names: r.name_mode,
    card: Number(r.card_gb),
    sha256: r.bundle_sha256,
    bytes: Number(r.bundle_bytes),
    note: r.note,
    releasedBy: r.released_by_name ?? null,
    releasedAt: r.released_at.toISOString(),
    download: downloadHref(buildId, r),
  };
}

export async function releasesFor(v: Viewer, b: Pick<Build, "id">): Promise<Release[]> {
  requirePermission(v, "view:release");
  return (await repo.releasesOf(db(), v.workshop.id, b.id)).map((r) => releaseOf(b.id, r));
}

export function approvedRevisionsFor(v: Viewer, b: Pick<Build, "id">): Promise<number[]> {
  requirePermission(v, "view:release");
  return repo.approvedRevisions(db(), b.id);
}

const isUniqueViolation = (e: unknown) => (e as { code?: string })?.code === "23505";

/** Release an approved, bench-checked revision; answers the release. Refusals change nothing. */
export async function releaseBuildFor(v: Viewer, b: Build, input: ReleaseInput, deps: ReleaseDeps = releaseDeps()): Promise<Release> {
  requirePermission(v, "release:build");
  if (b.archived_at) fail(409, "This build is archived; restore it before releasing it.");
  const check = await benchCheckFor(v, b, input.revision); // 404 for a revision the build does not have
  const blocked = releaseBlocker(await repo.isApproved(db(), b.id, input.revision), check);
  if (blocked) fail(blocked.status, blocked.message);
  const plan = await bundleFor(v, b, { revision: input.revision, template: input.template, mode: input.mode, cardGb: input.cardGb });
  const errors = plan.findings.filter((f) => f.severity === "error");
  if (errors.length) fail(422, `The card cannot be built, so it cannot be released: ${errors.map((e) => e.message).join(" ")}`, { findings: plan.findings });
  const { sha256, bytes } = await digestStream(zipBundle(plan, storage()));
  const same = (await repo.releasesOf(db(), v.workshop.id, b.id)).find((r) => r.bundle_sha256 === sha256);
  if (same) fail(409, `This bundle is already released, as release ${same.number} (revision ${same.revision}); nothing was changed.`);
  try {
    const id = await db()
      .transaction()
      .execute(async (trx) => {
        // Ticks may have been taken back since they were read: the same check, inside the transaction.
        const keys = new Set(check.groups.flatMap((g) => g.items.map((i) => i.key)));
        const ticked = new Set((await repo.ticksOf(trx, b.id, input.revision)).map((t) => t.item_key));
        const missing = [...keys].filter((k) => !ticked.has(k));
        if (missing.length) fail(409, `${missing.length} bench-check item${missing.length === 1 ? " was" : "s were"} unticked meanwhile; reload and tick ${missing.length === 1 ? "it" : "them"} again.`);
        const number = (await repo.lastReleaseNumber(trx, b.id)) + 1;
        const row = await repo.insertRelease(trx, {
          buildId: b.id,
          workshopId: v.workshop.id,
          number,
          revision: input.revision,
          templateRef: plan.template.ref,
          templateVersion: plan.template.version,
          nameMode: input.mode,
          cardGb: input.cardGb,
          sha256,
          bytes,
          note: input.note,
          userId: v.user.id,
        });
        await repo.setReleased(trx, b.id);
        const client = await repo.clientOf(trx, b.id);
        if (client?.email)
          await deps.enqueue(trx, releasedMail({ to: client.email, clientName: client.display_name, buildName: b.name, number, note: input.note, url: deps.link(`/handoff/${b.id}`) }));
        return row.id;
      });
    const all = await repo.releasesOf(db(), v.workshop.id, b.id);
    return releaseOf(b.id, all.find((r) => r.id === id)!);
  } catch (e) {
    if (isUniqueViolation(e)) fail(409, "Someone released this build at the same moment; nothing was changed. Reload to see the release history.");
    throw e;
  }
}

/** May this viewer tick and release (the page hides the forms otherwise; the guard is the check). */
export const releaseAbilities = (v: Viewer) => ({ tick: can(v.role, "check:bench"), release: can(v.role, "release:build") });
