// Client requests as pages and the API use them. The build is already loaded for the viewer
// (loadBuildFor: a client only reaches their own build), so these check the action's own rules:
// who asks, how many may wait, and answers that must not overwrite each other. Each write and
// the mail it sends share one transaction (the outbox, app/lib/mail/).
import type { Kysely, Transaction } from "kysely";
import type { Viewer } from "../auth/auth.server";
import { db as appDb } from "../db/db.server";
import type { Database } from "../db/types";
import { appLink, sendMail } from "../mail/mailer.server";
import { clientRequestAnsweredMail, clientRequestMail, type MailMessage } from "../mail/messages";
import * as repo from "../repo/requests.server";
import { membersWithRoles, userEmail } from "../repo/reviews.server";
import type { ApiErrorDetails } from "../web/http.server";
import { answerProblem, isOpen, KIND_LABEL, MAX_OPEN_PER_BUILD, STATUS_LABEL, tellsClient, type AnswerBody, type AskBody } from "./rules";

type Db = Kysely<Database>;
export type Refusal = { status: number; body: { error: string } & ApiErrorDetails };
export type Outcome<T> = { status: 200 | 201; body: T } | Refusal;
export const refused = <T>(r: Outcome<T>): r is Refusal => r.status >= 400;
const refuse = (status: number, error: string, more: ApiErrorDetails = {}): Refusal => ({ status, body: { error, ...more } });

export type Deps = { db: Db; enqueue: (trx: Transaction<Database>, m: MailMessage) => Promise<unknown>; link: (path: string) => string };
const appDeps = (): Deps => ({ db: appDb(), enqueue: (trx, m) => sendMail(trx, m), link: appLink });

export type Asker = { id: string; name: string; workshopId: string; isClient: boolean };
type Build = { id: string; name: string; client_name: string; client_user_id: string | null };

export const askerOf = (v: Viewer): Asker => ({ id: v.user.id, name: v.user.displayName, workshopId: v.workshop.id, isClient: v.role === "client" });

/** Where each side reads a request: the client on their handoff page, the workshop on the build's Requests tab. */
export const clientPath = (buildId: string) => `/handoff/${buildId}`;
export const workshopPath = (buildId: string) => `/builds/${buildId}/requests`;

export async function askRequest(d: Deps, who: Asker, build: Build, body: AskBody): Promise<Outcome<{ id: string }>> {
  const open = (await repo.openRequestCounts(d.db, who.workshopId, build.id)).get(build.id) ?? 0;
  if (open >= MAX_OPEN_PER_BUILD)
    return refuse(429, `This build already has ${open} requests waiting for an answer; the workshop will answer those first. Nothing was sent.`);
  return d.db.transaction().execute(async (trx) => {
    const id = await repo.insertClientRequest(trx, { workshopId: who.workshopId, buildId: build.id, kind: body.kind, message: body.message, askedBy: who.id });
    // Owners and builders hear of it; when the workshop logs a request for a client, the one who logged it is left out.
    const team = await membersWithRoles(trx, who.workshopId, ["owner", "builder"]);
    const clientName = who.isClient ? who.name : build.client_name || "The client";
    for (const m of team)
      if (m.email && m.id !== who.id)
        await d.enqueue(trx, clientRequestMail({ to: m.email, buildName: build.name, clientName, kindLabel: KIND_LABEL[body.kind], message: body.message, url: d.link(workshopPath(build.id)) }));
    return { status: 201 as const, body: { id } };
  });
}

export async function answerRequest(d: Deps, who: Asker, build: Build, requestId: string, body: AnswerBody): Promise<Outcome<{ version: number }>> {
  const now = await repo.getClientRequest(d.db, who.workshopId, build.id, requestId);
  if (!now) return refuse(404, "No request with this id on this build.");
  const reply = body.reply ?? now.reply;
  const problem = answerProblem(body.status, reply);
  if (problem) return refuse(422, `${problem} Nothing was changed.`);
  return d.db.transaction().execute(async (trx) => {
    const version = await repo.answerClientRequest(trx, now.id, body.version, { status: body.status, reply, by: who.id });
    if (version === null) {
      const current = await repo.getClientRequest(trx, who.workshopId, build.id, requestId);
      return refuse(409, `Someone answered this request since you read it (it is now ${STATUS_LABEL[current?.status ?? now.status].toLowerCase()}); read it again. Nothing was changed.`, { currentVersion: current?.version ?? now.version });
    }
    if (tellsClient(now, { status: body.status, reply }) && now.askedBy) {
      const to = await userEmail(trx, build.client_user_id ?? now.askedBy);
      if (to?.email)
        await d.enqueue(trx, clientRequestAnsweredMail({ to: to.email, buildName: build.name, kindLabel: KIND_LABEL[now.kind], statusLabel: STATUS_LABEL[body.status], reply, url: d.link(clientPath(build.id)) }));
    }
    return { status: 200 as const, body: { version } };
  });
}

export type RequestView = repo.ClientRequestRow & { kindLabel: string; statusLabel: string; open: boolean };

export async function listRequests(d: Pick<Deps, "db">, workshopId: string, buildId: string): Promise<RequestView[]> {
  const rows = await repo.listClientRequests(d.db, workshopId, buildId);
  return rows.map((r) => ({ ...r, kindLabel: KIND_LABEL[r.kind], statusLabel: STATUS_LABEL[r.status], open: isOpen(r.status) }));
}

/** For routes: the same with the app's database and mail. */
export const askRequestFor = (v: Viewer, build: Build, body: AskBody) => askRequest(appDeps(), askerOf(v), build, body);
export const answerRequestFor = (v: Viewer, build: Build, id: string, body: AnswerBody) => answerRequest(appDeps(), askerOf(v), build, id, body);
export const listRequestsFor = (v: Viewer, buildId: string) => listRequests({ db: appDb() }, v.workshop.id, buildId);
export const openRequestCountsFor = (v: Viewer, buildId?: string) => repo.openRequestCounts(appDb(), v.workshop.id, buildId);
