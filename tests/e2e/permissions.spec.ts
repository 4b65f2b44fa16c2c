// Every role against every route and API endpoint: allowed (2xx, or 400 for an allowed action
// sent an empty form), forbidden (403), or sent to sign in. The last test checks that the
// matrix names every route in app/routes.ts, so a new route cannot skip it.
import type { RouteConfigEntry } from "@react-router/dev/routes";
import routes from "../../app/routes";
import { test, expect, signInRequest, buildIdByName, BASE_URL } from "./fixtures";

type Who = "anonymous" | "owner" | "builder" | "reviewer" | "client";
const LOGINS: Record<Exclude<Who, "anonymous">, string> = { owner: "demo-owner", builder: "demo-builder", reviewer: "demo-reviewer", client: "client-one" };
type Outcome = "ok" | "bad" | "403" | "404" | "405" | "409" | "415" | "login" | "401" | "redirect";
type Case = { route: string; method: "GET" | "POST" | "PUT"; path: (ids: Ids) => string; form?: Record<string, string>; json?: unknown; expect: Record<Who, Outcome> };
type Ids = { kestrel: string; harrier: string; template: string; kestrelSound: string; harrierSound: string; review: string; lib: string };

const all = (o: Outcome): Record<Who, Outcome> => ({ anonymous: o, owner: o, builder: o, reviewer: o, client: o });
const staff = (ok: Outcome, others: Outcome, anon: Outcome = "login"): Record<Who, Outcome> => ({ anonymous: anon, owner: ok, builder: ok, reviewer: others, client: others });

const CASES: Case[] = [
  { route: "/", method: "GET", path: () => "/", expect: { ...all("redirect"), anonymous: "ok" } },
  { route: "/login", method: "GET", path: () => "/login", expect: { ...all("redirect"), anonymous: "ok" } },
  { route: "/auth/github", method: "GET", path: () => "/auth/github", expect: all("redirect") },
  { route: "/auth/github/callback", method: "GET", path: () => "/auth/github/callback", expect: all("redirect") },
  { route: "/logout", method: "GET", path: () => "/logout", expect: all("redirect") },
  { route: "/healthz", method: "GET", path: () => "/healthz", expect: all("ok") },
  // Clients land on their handoff list instead of the workshop's table (decision 023).
  { route: "/builds", method: "GET", path: () => "/builds", expect: { ...all("ok"), anonymous: "login", client: "redirect" } },
  // E-mail sign-in for clients: the code page, sending or checking a code (an empty address is bad input), the one-time link.
  { route: "/login/code", method: "GET", path: () => "/login/code", expect: { ...all("redirect"), anonymous: "ok" } },
  // (Signed in, the page's loader after the action sends the person on, as it does on GET.)
  { route: "/login/code", method: "POST", path: () => "/login/code", form: { intent: "send", email: "" }, expect: { ...all("redirect"), anonymous: "bad" } },
  { route: "/login/code", method: "POST", path: () => "/login/code", form: { intent: "verify", code: "12" }, expect: { ...all("redirect"), anonymous: "bad" } },
  { route: "/login/link", method: "GET", path: () => "/login/link", expect: all("bad") },
  { route: "/login/link", method: "GET", path: () => "/login/link?t=not-a-link", expect: all("bad") },
  // The handoff: a client's own builds; members see a read-only preview.
  { route: "/handoff", method: "GET", path: () => "/handoff", expect: { ...all("ok"), anonymous: "login" } },
  { route: "/handoff/:buildId", method: "GET", path: (i) => `/handoff/${i.kestrel}`, expect: { ...all("ok"), anonymous: "login" } },
  { route: "/handoff/:buildId", method: "GET", path: (i) => `/handoff/${i.harrier}`, expect: { ...all("ok"), anonymous: "login", client: "404" } },
  // The released card: nothing released in the matrix's data (404); parameters are refused; another client's build is not found.
  { route: "/api/builds/:buildId/release-bundle", method: "GET", path: (i) => `/api/builds/${i.kestrel}/release-bundle`, expect: { ...all("404"), anonymous: "401" } },
  { route: "/api/builds/:buildId/release-bundle", method: "GET", path: (i) => `/api/builds/${i.kestrel}/release-bundle?revision=1`, expect: { ...all("bad"), anonymous: "401" } },
  { route: "/api/builds/:buildId/release-bundle", method: "GET", path: (i) => `/api/builds/${i.harrier}/release-bundle`, expect: { ...all("404"), anonymous: "401" } },
  { route: "/builds/new", method: "GET", path: () => "/builds/new", expect: staff("ok", "403") },
  { route: "/builds/new", method: "POST", path: () => "/builds/new", form: { name: "" }, expect: staff("bad", "403") },
  { route: "/builds/:buildId", method: "GET", path: (i) => `/builds/${i.kestrel}`, expect: { ...all("ok"), anonymous: "login" } },
  { route: "/builds/:buildId", method: "GET", path: (i) => `/builds/${i.harrier}`, expect: { ...all("ok"), anonymous: "login", client: "404" } },
  { route: "/builds/:buildId", method: "POST", path: (i) => `/builds/${i.kestrel}?index`, form: { intent: "save", name: "" }, expect: staff("bad", "403") },
  { route: "/builds/:buildId/rig", method: "GET", path: (i) => `/builds/${i.kestrel}/rig`, expect: { ...all("ok"), anonymous: "login" } },
  { route: "/builds/:buildId/rig", method: "POST", path: (i) => `/builds/${i.kestrel}/rig`, form: { version: "0" }, expect: staff("bad", "403") },
  { route: "/builds/:buildId/looks", method: "GET", path: (i) => `/builds/${i.kestrel}/looks`, expect: { ...all("ok"), anonymous: "login" } },
  { route: "/builds/:buildId/looks", method: "GET", path: (i) => `/builds/${i.harrier}/looks`, expect: { ...all("ok"), anonymous: "login", client: "404" } },
  { route: "/builds/:buildId/checks", method: "GET", path: (i) => `/builds/${i.kestrel}/checks`, expect: { ...all("ok"), anonymous: "login" } },
  { route: "/builds/:buildId/checks", method: "GET", path: (i) => `/builds/${i.harrier}/checks`, expect: { ...all("ok"), anonymous: "login", client: "404" } },
  { route: "/builds/:buildId/checks", method: "POST", path: (i) => `/builds/${i.kestrel}/checks`, form: { version: "0" }, expect: staff("bad", "403") },
  { route: "/builds/:buildId/config.json", method: "GET", path: (i) => `/builds/${i.kestrel}/config.json`, expect: { ...all("ok"), anonymous: "login" } },
  { route: "/builds/:buildId/config.json", method: "GET", path: (i) => `/builds/${i.harrier}/config.json`, expect: { ...all("ok"), anonymous: "login", client: "404" } },
  { route: "/workshop", method: "GET", path: () => "/workshop", expect: { anonymous: "login", owner: "ok", builder: "ok", reviewer: "ok", client: "403" } },
  { route: "/workshop", method: "POST", path: () => "/workshop", form: { intent: "invite", target: "" }, expect: { anonymous: "login", owner: "bad", builder: "403", reviewer: "403", client: "403" } },
  { route: "/account", method: "GET", path: () => "/account", expect: { ...all("ok"), anonymous: "login" } },
  { route: "/account", method: "POST", path: () => "/account", form: { intent: "create", name: "" }, expect: { ...all("bad"), anonymous: "login" } },
  { route: "/api/me", method: "GET", path: () => "/api/me", expect: { ...all("ok"), anonymous: "401" } },
  { route: "/api/builds", method: "GET", path: () => "/api/builds", expect: { ...all("ok"), anonymous: "401" } },
  { route: "/api/builds/:buildId", method: "GET", path: (i) => `/api/builds/${i.harrier}`, expect: { ...all("ok"), anonymous: "401", client: "404" } },
  { route: "/api/builds/:buildId/looks.png", method: "GET", path: (i) => `/api/builds/${i.kestrel}/looks.png?preset=ashfall&channel=crystal`, expect: { ...all("ok"), anonymous: "401" } },
  { route: "/api/builds/:buildId/looks.png", method: "GET", path: (i) => `/api/builds/${i.harrier}/looks.png?preset=glasswind&channel=crystal`, expect: { ...all("ok"), anonymous: "401", client: "404" } },
  { route: "/api/builds/:buildId/wiring.svg", method: "GET", path: (i) => `/api/builds/${i.kestrel}/wiring.svg`, expect: { ...all("ok"), anonymous: "401" } },
  { route: "/api/builds/:buildId/wiring.svg", method: "GET", path: (i) => `/api/builds/${i.harrier}/wiring.svg`, expect: { ...all("ok"), anonymous: "401", client: "404" } },
  { route: "/api/validate", method: "POST", path: () => "/api/validate", json: { notConfig: true }, expect: { ...all("bad"), anonymous: "401" } },
  { route: "/api/validate", method: "GET", path: () => "/api/validate", expect: { ...all("405"), anonymous: "401" } },
  { route: "/api/builds/:buildId/config", method: "GET", path: (i) => `/api/builds/${i.kestrel}/config`, expect: { ...all("ok"), anonymous: "401" } },
  { route: "/api/builds/:buildId/config", method: "GET", path: (i) => `/api/builds/${i.harrier}/config`, expect: { ...all("ok"), anonymous: "401", client: "404" } },
  { route: "/api/builds/:buildId/config", method: "PUT", path: (i) => `/api/builds/${i.kestrel}/config`, json: { config: {} }, expect: staff("bad", "403", "401") },
  { route: "/templates", method: "GET", path: () => "/templates", expect: { ...staff("ok", "403"), reviewer: "ok" } },
  { route: "/templates", method: "POST", path: () => "/templates", form: { name: "" }, expect: staff("bad", "403") },
  { route: "/templates/reference", method: "GET", path: () => "/templates/reference", expect: { ...staff("ok", "403"), reviewer: "ok" } },
  { route: "/templates/:templateId", method: "GET", path: () => "/templates/generic-header", expect: { ...staff("ok", "403"), reviewer: "ok" } },
  { route: "/templates/:templateId", method: "POST", path: () => "/templates/generic-header", form: { source: "" }, expect: { ...all("403"), anonymous: "login" } },
  { route: "/templates/:templateId", method: "POST", path: () => "/templates/generic-header", form: { intent: "delete", confirm: "generic-header" }, expect: { ...all("403"), anonymous: "login" } },
  // A delete without the typed name: refused as bad input for those who may delete, and it leaves the template there.
  { route: "/templates/:templateId", method: "POST", path: (i) => `/templates/${i.template}`, form: { intent: "delete", confirm: "" }, expect: staff("bad", "403") },
  { route: "/templates/:templateId", method: "GET", path: (i) => `/templates/${i.template}?compare=1..2`, expect: { ...staff("ok", "403"), reviewer: "ok" } },
  { route: "/templates/:templateId/compare.patch", method: "GET", path: (i) => `/templates/${i.template}/compare.patch?compare=1..2`, expect: { ...staff("ok", "403"), reviewer: "ok" } },
  { route: "/templates/:templateId/compare.patch", method: "GET", path: (i) => `/templates/${i.template}/compare.patch?compare=1..9`, expect: { ...staff("404", "403"), reviewer: "404" } },
  { route: "/builds/:buildId/render", method: "GET", path: (i) => `/builds/${i.kestrel}/render`, expect: { ...all("ok"), anonymous: "login" } },
  { route: "/builds/:buildId/render", method: "GET", path: (i) => `/builds/${i.harrier}/render`, expect: { ...all("ok"), anonymous: "login", client: "404" } },
  { route: "/builds/:buildId/render", method: "POST", path: (i) => `/builds/${i.kestrel}/render`, form: { intent: "pin" }, expect: staff("bad", "403") },
  { route: "/api/render", method: "POST", path: () => "/api/render", json: { template: { builtin: "generic-header" } }, expect: { ...all("bad"), anonymous: "401" } },
  { route: "/api/render", method: "GET", path: () => "/api/render", expect: { ...all("405"), anonymous: "401" } },
  { route: "/api/builds/:buildId/render", method: "GET", path: (i) => `/api/builds/${i.kestrel}/render`, expect: { ...all("ok"), anonymous: "401" } },
  { route: "/api/builds/:buildId/render", method: "GET", path: (i) => `/api/builds/${i.harrier}/render?template=readable-copy`, expect: { ...all("ok"), anonymous: "401", client: "404" } },
  // Revisions and comparisons: staff and reviewers; clients see none (decision 012).
  { route: "/builds/:buildId/revisions", method: "GET", path: (i) => `/builds/${i.kestrel}/revisions`, expect: { ...staff("ok", "403"), reviewer: "ok" } },
  { route: "/builds/:buildId/revisions", method: "POST", path: (i) => `/builds/${i.kestrel}/revisions`, form: { intent: "restore", n: "" }, expect: staff("bad", "403") },
  { route: "/builds/:buildId/compare", method: "GET", path: (i) => `/builds/${i.kestrel}/compare?from=1&to=1`, expect: { ...staff("ok", "403"), reviewer: "ok" } },
  { route: "/builds/:buildId/compare", method: "GET", path: (i) => `/builds/${i.kestrel}/compare?from=x&to=1`, expect: { ...staff("bad", "403"), reviewer: "bad" } },
  { route: "/api/builds/:buildId/revisions", method: "GET", path: (i) => `/api/builds/${i.kestrel}/revisions`, expect: { ...staff("ok", "403", "401"), reviewer: "ok" } },
  { route: "/api/builds/:buildId/revisions/:n", method: "GET", path: (i) => `/api/builds/${i.kestrel}/revisions/1`, expect: { ...staff("ok", "403", "401"), reviewer: "ok" } },
  { route: "/api/builds/:buildId/diff", method: "GET", path: (i) => `/api/builds/${i.kestrel}/diff?from=1&to=1`, expect: { ...staff("ok", "403", "401"), reviewer: "ok" } },
  { route: "/api/builds/:buildId/diff", method: "GET", path: (i) => `/api/builds/${i.harrier}/diff?from=1`, expect: { ...staff("bad", "403", "401"), reviewer: "bad" } },
  { route: "/builds/:buildId/fonts", method: "GET", path: (i) => `/builds/${i.kestrel}/fonts`, expect: { ...all("ok"), anonymous: "login" } },
  { route: "/builds/:buildId/fonts", method: "GET", path: (i) => `/builds/${i.harrier}/fonts`, expect: { ...all("ok"), anonymous: "login", client: "404" } },
  { route: "/builds/:buildId/fonts", method: "POST", path: (i) => `/builds/${i.kestrel}/fonts`, form: { intent: "add-font", name: "" }, expect: staff("bad", "403") },
  { route: "/builds/:buildId/fonts", method: "POST", path: (i) => `/builds/${i.kestrel}/fonts`, form: { intent: "save-layout", name: "", rules: "" }, expect: staff("bad", "403") },
  // A form that is not multipart: refused as such for those who may upload, 403 before reading it for the rest.
  { route: "/api/builds/:buildId/fonts/:fontId/files", method: "POST", path: (i) => `/api/builds/${i.kestrel}/fonts/northlight/files`, form: { files: "" }, expect: staff("415", "403", "401") },
  { route: "/api/builds/:buildId/fonts/:fontId/files", method: "POST", path: (i) => `/api/builds/${i.kestrel}/fonts/no-such-font/files`, form: { files: "" }, expect: staff("404", "403", "401") },
  { route: "/builds/:buildId/fonts/audio/:sha256", method: "GET", path: (i) => `/builds/${i.kestrel}/fonts/audio/${i.kestrelSound}`, expect: { ...all("ok"), anonymous: "login" } },
  { route: "/builds/:buildId/fonts/audio/:sha256", method: "GET", path: (i) => `/builds/${i.harrier}/fonts/audio/${i.harrierSound}`, expect: { ...all("ok"), anonymous: "login", client: "404" } },
  // A file that exists, asked for through a build that does not hold it.
  { route: "/builds/:buildId/fonts/audio/:sha256", method: "GET", path: (i) => `/builds/${i.kestrel}/fonts/audio/${"0".repeat(64)}`, expect: { ...all("404"), anonymous: "login" } },
  // Bundles of any revision or today's config: staff and reviewers; a client gets only the released card (decision 023).
  { route: "/api/builds/:buildId/bundle", method: "GET", path: (i) => `/api/builds/${i.kestrel}/bundle?check=1`, expect: { ...all("ok"), anonymous: "401", client: "403" } },
  { route: "/api/builds/:buildId/bundle", method: "GET", path: (i) => `/api/builds/${i.harrier}/bundle?check=1`, expect: { ...all("ok"), anonymous: "401", client: "403" } },
  { route: "/api/builds/:buildId/bundle", method: "GET", path: (i) => `/api/builds/${i.kestrel}/bundle?names=9.9`, expect: { ...all("bad"), anonymous: "401", client: "403" } },
  // A chosen revision: staff and reviewers (clients see no revisions, decision 012).
  { route: "/api/builds/:buildId/bundle", method: "GET", path: (i) => `/api/builds/${i.kestrel}/bundle?revision=1&check=1`, expect: { ...staff("ok", "403", "401"), reviewer: "ok" } },
  { route: "/api/builds/:buildId/bundle", method: "GET", path: (i) => `/api/builds/${i.kestrel}/bundle?revision=x`, expect: { ...all("bad"), anonymous: "401", client: "403" } },
  // The Bundle tab and Check a card: staff and reviewers (clients download the released card from their handoff sheet).
  { route: "/builds/:buildId/bundle", method: "GET", path: (i) => `/builds/${i.kestrel}/bundle`, expect: { ...all("ok"), anonymous: "login", client: "403" } },
  { route: "/builds/:buildId/bundle", method: "GET", path: (i) => `/builds/${i.harrier}/bundle?names=8.3&card=8`, expect: { ...all("ok"), anonymous: "login", client: "404" } },
  { route: "/builds/:buildId/bundle", method: "GET", path: (i) => `/builds/${i.kestrel}/bundle?revision=1`, expect: { ...staff("ok", "403"), reviewer: "ok" } },
  { route: "/builds/:buildId/bundle", method: "GET", path: (i) => `/builds/${i.kestrel}/bundle?card=none`, expect: { ...all("bad"), anonymous: "login", client: "403" } },
  { route: "/builds/:buildId/bundle/check", method: "GET", path: (i) => `/builds/${i.kestrel}/bundle/check`, expect: { ...all("ok"), anonymous: "login", client: "403" } },
  { route: "/builds/:buildId/bundle/check", method: "GET", path: (i) => `/builds/${i.harrier}/bundle/check`, expect: { ...all("ok"), anonymous: "login", client: "404" } },
  { route: "/builds/:buildId/bundle/check", method: "GET", path: (i) => `/builds/${i.kestrel}/bundle/check?revision=1`, expect: { ...staff("ok", "403"), reviewer: "ok" } },
  { route: "/builds/:buildId/reviews", method: "GET", path: (i) => `/builds/${i.kestrel}/reviews`, expect: { ...staff("ok", "403"), reviewer: "ok" } },
  // No reviewer chosen: refused as bad input for those who may ask; nothing is requested.
  { route: "/builds/:buildId/reviews", method: "POST", path: (i) => `/builds/${i.kestrel}/reviews`, form: { intent: "request" }, expect: staff("bad", "403") },
  { route: "/builds/:buildId/reviews/:requestId", method: "GET", path: (i) => `/builds/${i.kestrel}/reviews/${i.review}`, expect: { ...staff("ok", "403"), reviewer: "ok" } },
  { route: "/builds/:buildId/reviews/:requestId", method: "GET", path: (i) => `/builds/${i.harrier}/reviews/${i.review}`, expect: { ...all("404"), anonymous: "login" } },
  { route: "/builds/:buildId/reviews/:requestId", method: "POST", path: (i) => `/builds/${i.kestrel}/reviews/${i.review}`, form: { intent: "comment", body: "", line: "1" }, expect: { ...staff("bad", "403"), reviewer: "bad" } },
  // A verdict on a revision that is not in review (the matrix's request is for revision 9999): 409; builders and clients may give none.
  { route: "/builds/:buildId/reviews/:requestId", method: "POST", path: (i) => `/builds/${i.kestrel}/reviews/${i.review}`, form: { intent: "verdict", verdict: "approved" }, expect: { anonymous: "login", owner: "409", builder: "403", reviewer: "409", client: "403" } },
  // The preset library: owners and builders publish and apply, reviewers read, clients see nothing (decision 019).
  { route: "/library", method: "GET", path: () => "/library", expect: { ...staff("ok", "403"), reviewer: "ok" } },
  { route: "/library", method: "POST", path: () => "/library", form: { nothing: "" }, expect: staff("bad", "403") },
  { route: "/library/:presetId", method: "GET", path: (i) => `/library/${i.lib}`, expect: { ...staff("ok", "403"), reviewer: "ok" } },
  { route: "/library/:presetId", method: "GET", path: (i) => `/library/${i.lib}?compare=x`, expect: { ...staff("bad", "403"), reviewer: "bad" } },
  { route: "/library/:presetId", method: "POST", path: (i) => `/library/${i.lib}`, form: { intent: "delete-version", version: "" }, expect: staff("bad", "403") },
  { route: "/library/:presetId/edit", method: "GET", path: (i) => `/library/${i.lib}/edit`, expect: { ...staff("ok", "403"), reviewer: "ok" } },
  { route: "/library/:presetId/edit", method: "GET", path: (i) => `/library/${i.lib}/edit?px.main-blade=0`, expect: { ...staff("bad", "403"), reviewer: "bad" } },
  { route: "/library/:presetId", method: "POST", path: (i) => `/library/${i.lib}`, form: { intent: "dry-run" }, expect: { anonymous: "login", owner: "ok", builder: "403", reviewer: "403", client: "403" } },
  { route: "/builds/:buildId/looks", method: "POST", path: (i) => `/builds/${i.kestrel}/looks`, form: { intent: "add-from-library" }, expect: staff("bad", "403") },
  { route: "/api/presets", method: "GET", path: () => "/api/presets", expect: { ...staff("ok", "403", "401"), reviewer: "ok" } },
  { route: "/api/presets", method: "POST", path: () => "/api/presets", json: {}, expect: staff("bad", "403", "401") },
  { route: "/api/presets/:presetId", method: "GET", path: (i) => `/api/presets/${i.lib}`, expect: { ...staff("ok", "403", "401"), reviewer: "ok" } },
  { route: "/api/presets/:presetId/export", method: "GET", path: (i) => `/api/presets/${i.lib}/export`, expect: { ...staff("ok", "403", "401"), reviewer: "ok" } },
  { route: "/api/presets/:presetId/rollout", method: "POST", path: (i) => `/api/presets/${i.lib}/rollout`, json: {}, expect: { anonymous: "401", owner: "bad", builder: "403", reviewer: "403", client: "403" } },
  { route: "/api/presets/:presetId/versions", method: "GET", path: (i) => `/api/presets/${i.lib}/versions`, expect: { ...staff("ok", "403", "401"), reviewer: "ok" } },
  { route: "/api/presets/:presetId/versions", method: "POST", path: (i) => `/api/presets/${i.lib}/versions`, json: {}, expect: staff("bad", "403", "401") },
  { route: "/api/presets/:presetId/versions/:v", method: "GET", path: (i) => `/api/presets/${i.lib}/versions/1`, expect: { ...staff("ok", "403", "401"), reviewer: "ok" } },
  { route: "/api/builds/:buildId/presets", method: "GET", path: (i) => `/api/builds/${i.kestrel}/presets`, expect: { ...staff("ok", "403", "401"), reviewer: "ok" } },
  { route: "/api/builds/:buildId/presets", method: "POST", path: (i) => `/api/builds/${i.kestrel}/presets`, json: {}, expect: staff("bad", "403", "401") },
  // Client requests: the workshop answers and reads on the Requests tab; the client asks through the API (their handoff page); reviewers read.
  { route: "/builds/:buildId/requests", method: "GET", path: (i) => `/builds/${i.kestrel}/requests`, expect: { ...staff("ok", "403"), reviewer: "ok" } },
  { route: "/builds/:buildId/requests", method: "POST", path: (i) => `/builds/${i.kestrel}/requests`, form: {}, expect: staff("bad", "403") },
  { route: "/api/builds/:buildId/requests", method: "GET", path: (i) => `/api/builds/${i.kestrel}/requests`, expect: { ...all("ok"), anonymous: "401" } },
  { route: "/api/builds/:buildId/requests", method: "POST", path: (i) => `/api/builds/${i.kestrel}/requests`, json: {}, expect: { ...staff("bad", "403", "401"), client: "bad" } },
  { route: "/api/builds/:buildId/requests/:requestId", method: "PUT", path: (i) => `/api/builds/${i.kestrel}/requests/00000000-0000-0000-0000-000000000000`, json: {}, expect: staff("bad", "403", "401") },
  { route: "/api/builds/:buildId/preset-updates", method: "GET", path: (i) => `/api/builds/${i.kestrel}/preset-updates`, expect: { ...staff("ok", "403", "401"), reviewer: "ok" } },
  { route: "/api/builds/:buildId/preset-updates", method: "POST", path: (i) => `/api/builds/${i.kestrel}/preset-updates`, json: {}, expect: staff("bad", "403", "401") },
  // The bench check and the release: owners and builders tick and release, reviewers read, clients see nothing there.
  { route: "/builds/:buildId/release", method: "GET", path: (i) => `/builds/${i.kestrel}/release`, expect: { ...staff("ok", "403"), reviewer: "ok" } },
  { route: "/builds/:buildId/release", method: "GET", path: (i) => `/builds/${i.kestrel}/release?revision=x`, expect: { ...staff("bad", "403"), reviewer: "bad" } },
  { route: "/builds/:buildId/release", method: "POST", path: (i) => `/builds/${i.kestrel}/release`, form: { intent: "tick" }, expect: staff("bad", "403") },
  { route: "/builds/:buildId/release", method: "POST", path: (i) => `/builds/${i.kestrel}/release`, form: { intent: "release" }, expect: staff("bad", "403") },
  { route: "/api/builds/:buildId/releases", method: "GET", path: (i) => `/api/builds/${i.kestrel}/releases`, expect: { ...staff("ok", "403", "401"), reviewer: "ok" } },
  { route: "/api/builds/:buildId/releases", method: "POST", path: (i) => `/api/builds/${i.kestrel}/releases`, json: {}, expect: staff("bad", "403", "401") },
  { route: "/api/builds/:buildId/revisions/:n/bench-check", method: "GET", path: (i) => `/api/builds/${i.kestrel}/revisions/1/bench-check`, expect: { ...staff("ok", "403", "401"), reviewer: "ok" } },
  { route: "/api/builds/:buildId/revisions/:n/bench-check", method: "PUT", path: (i) => `/api/builds/${i.kestrel}/revisions/1/bench-check`, json: {}, expect: staff("bad", "403", "401") },
  // The development mailbox is open to anyone while it is served (HB_DEV_MAILBOX=1 in the e2e run); production answers 404.
  { route: "/dev/mailbox", method: "GET", path: () => "/dev/mailbox", expect: all("ok") },
  { route: "/dev/mailbox/:messageId", method: "GET", path: () => "/dev/mailbox/00000000-0000-4000-8000-000000000000", expect: all("404") },
  // The API's reference is public: the OpenAPI document and the page drawn from it.
  { route: "/api/openapi.json", method: "GET", path: () => "/api/openapi.json", expect: all("ok") },
  { route: "/api/docs", method: "GET", path: () => "/api/docs", expect: all("ok") },
  // An unknown API address: a JSON 404 for everyone, signed in or not.
  { route: "/api/*", method: "GET", path: () => "/api/no/such/route", expect: all("404") },
  { route: "/api/*", method: "POST", path: () => "/api/no-such-route", json: {}, expect: all("404") },
  { route: "*", method: "GET", path: () => "/no/such/page", expect: all("404") },
];

function matches(outcome: Outcome, status: number, location: string | undefined) {
  switch (outcome) {
    case "ok":
      return status >= 200 && status < 300;
    case "bad":
      return status === 400;
    case "login":
      return status === 302 && (location ?? "").startsWith("/login");
    case "redirect":
      return status === 302 || status === 303;
    default:
      return status === Number(outcome);
  }
}

for (const who of ["anonymous", "owner", "builder", "reviewer", "client"] as Who[]) {
  test(`permission matrix: ${who}`, async ({ playwright, sql }) => {
    const ws = (await sql.query("SELECT workshop_id FROM builds WHERE name = 'Kestrel' LIMIT 1")).rows[0].workshop_id;
    const template = (await sql.query("INSERT INTO templates (workshop_id, name) VALUES ($1, $2) RETURNING id", [ws, `matrix-${who}-${Date.now()}`])).rows[0].id;
    await sql.query("INSERT INTO template_versions (template_id, version, source) VALUES ($1, 1, 'one'), ($1, 2, 'two')", [template]);
    const sound = async (name: string) =>
      (await sql.query("SELECT f.sha256 FROM font_files f JOIN font_uploads u ON u.id = f.upload_id JOIN builds b ON b.id = u.build_id WHERE b.name = $1 ORDER BY f.path LIMIT 1", [name])).rows[0].sha256 as string;
    const kestrel = await buildIdByName(sql, "Kestrel");
    const review = (await sql.query("INSERT INTO review_requests (build_id, workshop_id, revision, template_label, rendered) VALUES ($1, $2, 9999, 'matrix', E'one\\ntwo') RETURNING id", [kestrel, ws])).rows[0].id;
    const lib = (await sql.query("SELECT id FROM library_presets WHERE workshop_id = $1 AND name = 'Ashfall embers'", [ws])).rows[0].id as string;
    const libBefore = (await sql.query("SELECT (SELECT count(*) FROM library_versions)::int AS v, (SELECT count(*) FROM library_presets)::int AS p, (SELECT config_version FROM builds WHERE id = $1) AS c", [kestrel])).rows[0];
    const ids = { kestrel, review, lib, harrier: await buildIdByName(sql, "Harrier"), template, kestrelSound: await sound("Kestrel"), harrierSound: await sound("Harrier") };
    const api = await playwright.request.newContext({ baseURL: BASE_URL, extraHTTPHeaders: { Origin: BASE_URL } });
    if (who !== "anonymous") await signInRequest(api, LOGINS[who]);
    const failures: string[] = [];
    for (const c of CASES) {
      const url = c.path(ids);
      const res =
        c.method === "GET"
          ? await api.get(url, { maxRedirects: 0 })
          : await api.fetch(url, { method: c.method, ...(c.json !== undefined ? { data: c.json } : { form: c.form }), maxRedirects: 0 });
      const want = c.expect[who];
      if (!matches(want, res.status(), res.headers()["location"])) failures.push(`${c.method} ${url}: wanted ${want}, got ${res.status()}`);
    }
    expect(failures).toEqual([]);
    expect((await sql.query("SELECT count(*)::int AS n FROM template_versions WHERE template_id = $1", [template])).rows[0].n).toBe(2);
    expect((await sql.query("SELECT count(*)::int AS n FROM review_comments WHERE request_id = $1", [review])).rows[0].n).toBe(0);
    // Nothing in the library or the build changed on any of the refused or empty requests.
    expect((await sql.query("SELECT (SELECT count(*) FROM library_versions)::int AS v, (SELECT count(*) FROM library_presets)::int AS p, (SELECT config_version FROM builds WHERE id = $1) AS c", [kestrel])).rows[0]).toEqual(libBefore);
    await sql.query("DELETE FROM review_requests WHERE id = $1", [review]);
    await sql.query("DELETE FROM templates WHERE id = $1", [template]);
    await api.dispose();
  });
}

test("the matrix covers every route in app/routes.ts", () => {
  const paths: string[] = [];
  const walk = (entries: RouteConfigEntry[], parent: string) => {
    for (const e of entries) {
      const here = e.path ? `${parent.replace(/\/$/, "")}/${e.path}` : parent;
      if (e.children) walk(e.children, here);
      if (e.index || (e.path && !e.children)) paths.push(e.path === "*" ? "*" : here || "/");
      else if (e.children && e.path) paths.push(here);
    }
  };
  walk(routes as RouteConfigEntry[], "");
  const covered = new Set(CASES.map((c) => c.route));
  expect([...new Set(paths)].filter((p) => !covered.has(p))).toEqual([]);
});
