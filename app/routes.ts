import { type RouteConfig, index, layout, prefix, route } from "@react-router/dev/routes";

export default [
  index("routes/home.tsx"),
  route("login", "routes/login.tsx"),
  // Clients sign in with an e-mailed code or one-time link (decision 023).
  route("login/code", "routes/login.code.tsx"),
  route("login/link", "routes/login.link.tsx"),
  route("auth/github", "routes/auth.github.ts"),
  route("auth/github/callback", "routes/auth.github.callback.ts"),
  route("logout", "routes/logout.ts"),
  route("healthz", "routes/healthz.ts"),
  route("builds/:buildId/config.json", "routes/builds.$buildId.config-json.ts"),
  route("builds/:buildId/fonts/audio/:sha256", "routes/builds.$buildId.fonts.audio.ts"),
  route("templates/:templateId/compare.patch", "routes/templates.$templateId.compare-patch.ts"),
  // Development mailbox (404 in production unless HB_DEV_MAILBOX=1).
  route("dev/mailbox", "routes/dev.mailbox._index.tsx"),
  route("dev/mailbox/:messageId", "routes/dev.mailbox.$messageId.tsx"),

  // The client's side: their builds and each build's handoff sheet (members: a read-only preview).
  layout("routes/handoff-layout.tsx", [
    route("handoff", "routes/handoff._index.tsx"),
    route("handoff/:buildId", "routes/handoff.$buildId.tsx"),
  ]),

  layout("routes/app-layout.tsx", [
    route("builds", "routes/builds._index.tsx"),
    route("builds/new", "routes/builds.new.tsx"),
    route("builds/:buildId", "routes/builds.$buildId.tsx", [
      index("routes/builds.$buildId._index.tsx"),
      route("rig", "routes/builds.$buildId.rig.tsx"),
      route("looks", "routes/builds.$buildId.looks.tsx"),
      route("render", "routes/builds.$buildId.render.tsx"),
      route("checks", "routes/builds.$buildId.checks.tsx"),
      route("revisions", "routes/builds.$buildId.revisions.tsx"),
      route("compare", "routes/builds.$buildId.compare.tsx"),
      route("fonts", "routes/builds.$buildId.fonts.tsx"),
      route("bundle", "routes/builds.$buildId.bundle.tsx"),
      route("bundle/check", "routes/builds.$buildId.bundle.check.tsx"),
      route("reviews", "routes/builds.$buildId.reviews._index.tsx"),
      route("reviews/:requestId", "routes/builds.$buildId.reviews.$requestId.tsx"),
    ]),
    route("workshop", "routes/workshop.tsx"),
    route("account", "routes/account.tsx"),
    route("templates", "routes/templates._index.tsx"),
    route("templates/reference", "routes/templates.reference.tsx"),
    route("templates/:templateId", "routes/templates.$templateId.tsx"),
    route("library", "routes/library._index.tsx"),
    route("library/:presetId", "routes/library.$presetId.tsx"),
    route("library/:presetId/edit", "routes/library.$presetId.edit.tsx"),
  ]),

  ...prefix("api", [
    route("me", "routes/api.me.ts"),
    route("builds", "routes/api.builds.ts"),
    route("builds/:buildId", "routes/api.builds.$buildId.ts"),
    route("builds/:buildId/looks.png", "routes/api.builds.$buildId.looks-png.ts"),
    route("builds/:buildId/wiring.svg", "routes/api.builds.$buildId.wiring-svg.ts"),
    route("builds/:buildId/config", "routes/api.builds.$buildId.config.ts"),
    route("validate", "routes/api.validate.ts"),
    route("render", "routes/api.render.ts"),
    route("builds/:buildId/render", "routes/api.builds.$buildId.render.ts"),
    route("builds/:buildId/revisions", "routes/api.builds.$buildId.revisions.ts"),
    route("builds/:buildId/revisions/:n", "routes/api.builds.$buildId.revisions.$n.ts"),
    route("builds/:buildId/diff", "routes/api.builds.$buildId.diff.ts"),
    route("builds/:buildId/fonts/:fontId/files", "routes/api.builds.$buildId.fonts.$fontId.files.ts"),
    route("builds/:buildId/bundle", "routes/api.builds.$buildId.bundle.ts"),
    route("builds/:buildId/release-bundle", "routes/api.builds.$buildId.release-bundle.ts"),
    route("builds/:buildId/presets", "routes/api.builds.$buildId.presets.ts"),
    route("builds/:buildId/preset-updates", "routes/api.builds.$buildId.preset-updates.ts"),
    route("presets", "routes/api.presets.ts"),
    route("presets/:presetId", "routes/api.presets.$presetId.ts"),
    route("presets/:presetId/export", "routes/api.presets.$presetId.export.ts"),
    route("presets/:presetId/rollout", "routes/api.presets.$presetId.rollout.ts"),
    route("presets/:presetId/versions", "routes/api.presets.$presetId.versions.ts"),
    route("presets/:presetId/versions/:v", "routes/api.presets.$presetId.versions.$v.ts"),
    // The API's own reference, public: the OpenAPI document and a page drawn from it.
    route("openapi.json", "routes/api.openapi-json.ts"),
    route("docs", "routes/api.docs.tsx"),
    // Unknown /api addresses answer a JSON 404 (keep last in this list).
    route("*", "routes/api.not-found.ts"),
  ]),

  route("*", "routes/not-found.tsx"),
] satisfies RouteConfig;
