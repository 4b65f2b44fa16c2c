// Roles map to sets of typed permissions here and nowhere else. Routes ask for a permission,
// never for a role, so a change of policy is a change to this table.
import type { Role } from "../db/types";

export const PERMISSIONS = [
  "view:builds", // see the workshop's builds (clients see only their own, checked per build)
  "create:build",
  "edit:build",
  "archive:build",
  "view:members",
  "manage:members",
  "use:api",
  "view:templates", // the workshop's templates and their editor (read-only without edit:template)
  "edit:template",
  "view:revisions", // a build's revisions, their configs and comparisons (not clients)
  "upload:font", // send a font's files to a build (clients send theirs to the workshop, which uploads them)
  "view:reviews", // review requests, threads and verdicts (never clients)
  "request:review", // ask reviewers to read a revision
  "comment:review", // comment and reply in review threads
  "resolve:comment", // mark a thread resolved (the builder, once it is dealt with)
  "give:verdict", // approve a revision or ask for changes (not on one's own revision, see mayGiveVerdict)
  "be:reviewer", // may be asked to review
  "view:library", // the workshop's preset library: presets, versions, compares, exports (never clients)
  "publish:library", // publish a version, create or import a library preset, delete an unused version
  "apply:library", // add a library preset to a build, apply an update to a build's preset
  "apply:library-all", // apply an update to every build that uses a preset (the owner)
  "view:release", // a build's Release tab: the bench check, its ticks and the release history (read-only without the two below)
  "check:bench", // tick or untick an item of a revision's bench check
  "release:build", // release an approved, bench-checked revision to the client
  "view:requests", // a build's client requests (a client: their own build's)
  "ask:request", // send a request about a build (its client, or the workshop logging one for them)
  "answer:request", // take a client request in hand, close or decline it, reply
  "view:build-list", // the workshop's table of builds (clients land on their handoff list instead)
  "make:bundle", // a card bundle of today's config or any revision, and Check a card (clients get only the released one)
  "view:handoff", // a build's handoff sheet and its released card zip (clients: their own; members: a read-only preview)
] as const;
export type Permission = (typeof PERMISSIONS)[number];

const table: Record<Role, ReadonlySet<Permission>> = {
  owner: new Set(PERMISSIONS),
  builder: new Set([
    "view:builds",
    "create:build",
    "edit:build",
    "archive:build",
    "view:members",
    "use:api",
    "view:templates",
    "edit:template",
    "view:revisions",
    "upload:font",
    "view:reviews",
    "request:review",
    "comment:review",
    "resolve:comment",
    "view:library",
    "publish:library",
    "apply:library",
    "view:release",
    "check:bench",
    "release:build",
    "view:requests",
    "ask:request",
    "answer:request",
    "view:build-list",
    "make:bundle",
    "view:handoff",
  ]),
  reviewer: new Set(["view:builds", "view:members", "use:api", "view:templates", "view:revisions", "view:reviews", "comment:review", "give:verdict", "be:reviewer", "view:library", "view:release", "view:requests", "view:build-list", "make:bundle", "view:handoff"]),
  client: new Set(["view:builds", "use:api", "view:requests", "ask:request", "view:handoff"]),
};

export function can(role: Role, permission: Permission): boolean {
  return table[role].has(permission);
}

/**
 * What each form action on a build's Render view needs: reading a header back only looks at it
 * (anyone who sees the build); making it the build's config or pinning a template changes the build.
 */
export const RENDER_VIEW_ACTIONS = { read: "view:builds", apply: "edit:build", pin: "edit:build" } as const satisfies Record<string, Permission>;
export type RenderViewAction = keyof typeof RENDER_VIEW_ACTIONS;
export const isRenderViewAction = (s: unknown): s is RenderViewAction => typeof s === "string" && Object.hasOwn(RENDER_VIEW_ACTIONS, s);

/** Clients see only the builds they are the client of; everyone else sees the workshop's. */
export function seesOnlyOwnBuilds(role: Role): boolean {
  return role === "client";
}

/**
 * A verdict needs the permission and someone else's work: nobody approves (or turns back) a
 * revision they saved or a review they asked for themselves, whatever their role.
 */
export function mayGiveVerdict(role: Role, viewerId: string, revision: { authorId: string | null; requestedBy: string | null }): boolean {
  return can(role, "give:verdict") && revision.authorId !== viewerId && revision.requestedBy !== viewerId;
}
