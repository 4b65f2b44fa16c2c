// The API's answers and bodies as zod schemas: the routes type what they answer with these
// (`jsonAs(schema, body)` in app/lib/web) and the OpenAPI document is generated from them, so the
// two cannot tell different stories. Schemas that belong to a concern (the config, a diagnostic,
// a positioned error, the bundle query) live in that concern and are only imported here.
import { z } from "zod";
import { configSchema, rigSchema } from "../config/schema";
import { diagnosticSchema } from "../checks/diagnostics";
import { errorKindSchema, positionedErrorSchema } from "../template/error-list";
import { BUILD_STATUSES, ROLES } from "../db/types";
import { CUES } from "../config/schema";
import { presetBodySchema } from "../library/format";

const isoTime = z.string().meta({ description: "A time in ISO 8601 (UTC), e.g. 2026-12-03T08:00:00.000Z.", format: "date-time" });
const int = () => z.number().int();

/** A finding about a font's files or the card's names: like a diagnostic, with no hint. */
export const findingSchema = z
  .object({ severity: z.enum(["error", "warning", "info"]), code: z.string(), path: z.string(), message: z.string() })
  .meta({ id: "Finding" });

/** A place where the library's changes and a build's own edits collide: the key for a choice. */
export const conflictSchema = z
  .strictObject({
    path: z.string().meta({ description: "The place's stable address: the key in choices." }),
    text: z.string().meta({ description: "Where and what, in words." }),
    base: z.string().meta({ description: "The value in the library version the build started from." }),
    mine: z.string().meta({ description: "The build's value." }),
    theirs: z.string().meta({ description: "The newest library version's value." }),
  })
  .meta({ id: "MergeConflict" });

/** A build using a library preset (a version of it). */
export const presetUseSchema = z
  .strictObject({ buildId: z.string(), buildName: z.string(), status: z.enum(BUILD_STATUSES), presetId: z.string().meta({ description: "The build's preset id." }), version: int().meta({ description: "The library version it is on." }) })
  .meta({ id: "PresetUse" });

/**
 * The one error shape of the API (`ApiErrorBody` in app/lib/web/http.server.ts): every 4xx and
 * 5xx JSON answer has it. Details appear only where they apply.
 */
export const apiErrorSchema = z
  .strictObject({
    status: int().meta({ description: "The HTTP status again, for logs that keep only the body." }),
    error: z.string().meta({ description: "What went wrong and what to do, for a person." }),
    field: z.string().optional().meta({ description: "The body field or query parameter at fault, when one is." }),
    diagnostics: z.array(diagnosticSchema).optional().meta({ description: "A config the validator refused: every finding." }),
    errors: z.array(positionedErrorSchema).optional().meta({ description: "Template or config errors with their place: the first 50." }),
    total: int().optional().meta({ description: "How many errors there were in all (errors lists the first 50)." }),
    kinds: z.array(errorKindSchema).optional().meta({ description: "The distinct kinds of error, most frequent first." }),
    findings: z.array(findingSchema).optional().meta({ description: "Why a bundle cannot be built." }),
    currentVersion: int().nullable().optional().meta({ description: "A stale save: the version to read again and start from." }),
    latestVersion: int().nullable().optional().meta({ description: "A stale library publish: the newest version, to read again and start from." }),
    conflicts: z.array(conflictSchema).optional().meta({ description: "A library update whose collisions with the build's edits need a choice each." }),
    builds: z.array(presetUseSchema).optional().meta({ description: "The builds that use a library version, so it cannot be deleted." }),
  })
  .meta({ id: "ApiError" });

// ------------------------------------------------------------------ who and which builds

export const meAnswer = z.strictObject({
  user: z.strictObject({ id: z.string(), name: z.string(), githubLogin: z.string().nullable(), email: z.string().nullable() }),
  role: z.enum(ROLES),
  workshop: z.strictObject({ id: z.string(), name: z.string() }),
});

export const buildSummarySchema = z
  .strictObject({ id: z.string(), name: z.string(), client: z.string(), status: z.enum(BUILD_STATUSES), updatedAt: isoTime, createdAt: isoTime, archived: z.boolean() })
  .meta({ id: "BuildSummary" });

export const buildListAnswer = z.strictObject({ total: int(), page: int(), perPage: int(), builds: z.array(buildSummarySchema) });

export const buildAnswer = z.strictObject({
  id: z.string(),
  name: z.string(),
  client: z.string(),
  status: z.enum(BUILD_STATUSES),
  hiltNotes: z.string(),
  archived: z.boolean(),
  configVersion: int(),
  updatedAt: isoTime,
  rig: rigSchema,
});

// ------------------------------------------------------------------ config, validation

export const configAnswer = z.strictObject({ config: configSchema, version: int().meta({ description: "Send it back with a PUT: a save from an older version is refused (409)." }) });

export const configPutBody = z.object({
  config: z.unknown().meta({ description: "The whole config, hiltbench.config/2 (a /1 document is upgraded)." }),
  version: int().min(0).meta({ description: "The config version the config was read at (GET answers it)." }),
  message: z.string().max(500).optional().meta({ description: "What changed, kept with the revision." }),
});

export const configSavedAnswer = z.strictObject({
  version: int(),
  revision: z.strictObject({ number: int(), savedAt: isoTime.optional(), message: z.string().nullable().optional(), url: z.string().optional() }),
  diagnostics: z.array(diagnosticSchema),
});

export const validateBody = z.object({ config: z.unknown().meta({ description: "Any JSON: the validator says what is wrong with it." }) });

const presetPower = z.strictObject({
  presetId: z.string(),
  peakAmps: z.number(),
  typicalAmps: z.number(),
  runtimeHours: z.number(),
  channels: z.array(z.strictObject({ channelId: z.string(), peakMa: z.number(), meanMa: z.number() })),
});

export const powerSummarySchema = z
  .strictObject({
    presets: z.array(presetPower),
    overall: z.strictObject({
      peakAmps: z.number(),
      worstPresetId: z.string().nullable(),
      wireDropVolts: z.number(),
      wireHeatWatts: z.number(),
      suggestedBrightnessCap: z.number(),
      energyWh: z.number(),
      cellMaxContinuousAmps: z.number(),
    }),
  })
  .meta({ id: "PowerSummary" });

export const validateAnswer = z.strictObject({
  diagnostics: z.array(diagnosticSchema),
  power: powerSummarySchema.nullable().meta({ description: "Null when the config has no model shape to compute power from." }),
  powerSource: z.enum(["engine", "estimate"]).nullable().meta({ description: "engine: from rendered frames; estimate: from each layer's bounds (a config too large to render in time)." }),
});

// ------------------------------------------------------------------ revisions and diffs

const revisionMeta = {
  number: int(),
  createdAt: isoTime,
  message: z.string().nullable(),
  authorId: z.string().nullable(),
  authorName: z.string().nullable(),
  templateId: z.string().nullable(),
  templateVersion: int().nullable(),
  errorCount: int(),
  warningCount: int(),
  review: z.null().meta({ description: "Reserved for the revision's review; null for now." }),
};

export const revisionListAnswer = z.strictObject({
  buildId: z.string(),
  current: int().meta({ description: "The build's current config version (its newest revision)." }),
  page: int(),
  perPage: int(),
  total: int(),
  revisions: z.array(z.strictObject(revisionMeta)),
});

export const revisionAnswer = z.strictObject({ buildId: z.string(), ...revisionMeta, current: z.boolean(), config: configSchema });

const comparedRevision = z.strictObject({ number: int(), createdAt: isoTime, authorName: z.string().nullable(), message: z.string().nullable(), errorCount: int(), warningCount: int() });
const segment = z.strictObject({ text: z.string(), changed: z.boolean() });

export const diffAnswer = z.strictObject({
  from: comparedRevision,
  to: comparedRevision,
  reversed: z.boolean().meta({ description: "True when from is the later revision: the diff reads backwards in time." }),
  template: z.strictObject({ name: z.string(), version: int(), ref: z.string() }),
  model: z.array(
    z.strictObject({
      kind: z.enum(["added", "removed", "changed", "moved"]),
      text: z.string(),
      where: z.array(z.string()),
      field: z.string().optional(),
      before: z.string().optional(),
      after: z.string().optional(),
      from: int().optional(),
      to: int().optional(),
    }),
  ),
  text: z.union([
    z.strictObject({ kind: z.literal("same"), patch: z.string() }),
    z.strictObject({
      kind: z.literal("changed"),
      added: int(),
      removed: int(),
      patch: z.string(),
      hunks: z.array(
        z.strictObject({
          oldStart: int(),
          oldLines: int(),
          newStart: int(),
          newLines: int(),
          rows: z.array(z.strictObject({ kind: z.enum(["context", "removed", "added"]), oldNo: int().optional(), newNo: int().optional(), text: z.string(), words: z.array(segment).optional() })),
          side: z.array(z.looseObject({})).meta({ description: "The same rows paired for a side-by-side view." }),
        }),
      ),
    }),
    z.strictObject({ kind: z.literal("too-large"), limit: int() }),
  ]),
});

// ------------------------------------------------------------------ fonts and the bundle

export const fontReportSchema = z
  .strictObject({
    layout: z.string(),
    files: z.array(
      z.looseObject({ path: z.string(), size: int(), cue: z.enum(CUES).nullable(), durationMs: z.number(), format: z.string(), peakDbfs: z.number().nullable(), clippedSamples: int() }),
    ),
    cues: z.record(z.string(), z.strictObject({ variants: int(), totalMs: z.number(), files: z.array(z.string()) })),
    present: z.array(z.enum(CUES)),
    missing: z.array(z.enum(CUES)),
    totalBytes: int(),
    totalMs: z.number(),
    igniteMs: z.number().nullable(),
    retractMs: z.number().nullable(),
    findings: z.array(findingSchema),
    status: z.enum(["received", "invalid"]),
  })
  .meta({ id: "FontReport" });

export const fontUploadAnswer = z.strictObject({
  status: z.enum(["received", "invalid"]),
  configVersion: int(),
  report: fontReportSchema.extend({ ignored: z.array(z.string()).meta({ description: "Files in the upload that are not WAVs and were left out (besides system clutter)." }) }),
});

export const bundlePlanAnswer = z.strictObject({
  name: z.string().meta({ description: "The zip's file name." }),
  revision: int().meta({ description: "The revision the card is made from." }),
  latest: z.boolean().meta({ description: "Whether that revision is the build's newest." }),
  template: z.strictObject({ name: z.string(), version: int(), ref: z.string() }).meta({ description: "The template (and its version) the config was rendered with." }),
  totalBytes: int().meta({ description: "The files' bytes." }),
  cardUsedBytes: int().meta({ description: "What the files take on a FAT32 card, in whole clusters." }),
  cardBytes: int().meta({ description: "The card's size in decimal bytes." }),
  files: z.array(z.strictObject({ path: z.string(), size: int(), sha256: z.string(), stored: z.boolean().meta({ description: "A font file from storage (true) or a text made for the card." }) })),
  findings: z.array(findingSchema),
});

// ------------------------------------------------------------------ the preset library

const versionSummary = {
  version: int(),
  changelog: z.string(),
  authorName: z.string().nullable(),
  createdAt: isoTime,
  errorCount: int(),
  warningCount: int(),
};

export const libraryListAnswer = z.strictObject({
  total: int(),
  page: int(),
  perPage: int(),
  presets: z.array(
    z.strictObject({
      id: z.string(),
      name: z.string(),
      tags: z.array(z.string()),
      latestVersion: int().nullable(),
      publishedAt: isoTime,
      buildCount: int().meta({ description: "How many builds use any version of it." }),
      buildNames: z.array(z.string()),
      url: z.string(),
    }),
  ),
});

/** A version published (a new preset, or a new version of one). */
export const presetPublishedAnswer = z.strictObject({
  presetId: z.string(),
  version: int(),
  url: z.string().meta({ description: "Where the version is read." }),
  diagnostics: z.array(diagnosticSchema).meta({ description: "The validator's warnings (a preset with errors is refused)." }),
});

/** A preset file imported as a new library preset. */
export const presetImportedAnswer = z.strictObject({
  presetId: z.string(),
  versions: int().meta({ description: "How many versions were imported (renumbered from 1)." }),
  url: z.string(),
});

export const libraryPresetAnswer = z.strictObject({
  id: z.string(),
  name: z.string(),
  tags: z.array(z.string()),
  notes: z.string(),
  latestVersion: int().nullable(),
  publishedAt: isoTime,
  versions: z.array(z.strictObject({ ...versionSummary, url: z.string() })).meta({ description: "Newest first." }),
  builds: z.array(presetUseSchema),
});

export const libraryVersionsAnswer = z.strictObject({ versions: z.array(z.strictObject(versionSummary)).meta({ description: "Newest first." }) });

export const libraryVersionAnswer = z.strictObject({
  presetId: z.string(),
  ...versionSummary,
  body: presetBodySchema.meta({ description: "The preset body: name, tags, notes and looks by channel role (each with the pixel count it was made on); send it back as preset to publish a new version." }),
  previousVersion: int().nullable(),
  changes: z.array(z.string()).meta({ description: "What changed from the previous version, in words." }),
});

export const libraryVersionDeletedAnswer = z.strictObject({ deleted: int().meta({ description: "The version number removed." }) });

export const rolloutAnswer = z.strictObject({
  target: int().meta({ description: "The newest version, which the builds are brought to." }),
  rows: z.array(
    z.strictObject({
      buildId: z.string(),
      buildName: z.string(),
      presetId: z.string(),
      presetName: z.string(),
      fromVersion: int(),
      outcome: z.enum(["clean", "conflicts", "released", "current", "missing"]).meta({ description: "clean: merges without a choice; conflicts: needs hands; released: never changed; current: already there; missing: the preset is gone from the build." }),
      conflicts: z.array(conflictSchema),
      applied: z.boolean().optional().meta({ description: "With apply: whether this build was saved." }),
      error: z.string().optional().meta({ description: "With apply: why a clean build was not saved (it changed meanwhile)." }),
    }),
  ),
});

const libraryNote = z.strictObject({ kind: z.enum(["skipped-role", "no-look", "dropped-mirror", "duplicate-role"]), text: z.string() });

export const presetOriginsAnswer = z.strictObject({
  origins: z.array(
    z.strictObject({
      presetId: z.string().meta({ description: "The build's preset id." }),
      libraryPresetId: z.string(),
      libraryName: z.string(),
      version: int().meta({ description: "The library version the build's preset is on." }),
      latest: int().meta({ description: "The library's newest version." }),
    }),
  ),
});

export const presetAddedAnswer = z.strictObject({
  presetId: z.string().meta({ description: "The new preset's id in the build." }),
  version: int().meta({ description: "The build's new config version." }),
  libraryVersion: int(),
  notes: z.array(libraryNote).meta({ description: "What did not carry over: roles the rig lacks, channels left with no look." }),
});

export const presetUpdatesAnswer = z.strictObject({
  updates: z.array(
    z.strictObject({
      presetId: z.string(),
      presetName: z.string(),
      libraryPresetId: z.string(),
      libraryName: z.string(),
      from: int(),
      to: int(),
      changes: z.array(z.string()).meta({ description: "The library's changes from → to, in words." }),
      conflicts: z.array(conflictSchema),
      notes: z.array(z.string()),
    }),
  ),
});

export const presetUpdatedAnswer = z.strictObject({ version: int().meta({ description: "The build's new config version." }), libraryVersion: int() });

const clientRequestSchema = z
  .strictObject({
    id: z.string(),
    kind: z.enum(["font", "colour", "fault", "other"]),
    kindLabel: z.string().meta({ description: "The kind in words." }),
    message: z.string().meta({ description: "What the client asked, as written." }),
    status: z.enum(["open", "in-hand", "done", "declined"]),
    statusLabel: z.string().meta({ description: "The status as the client reads it." }),
    reply: z.string().meta({ description: "The workshop's reply (empty until one is written)." }),
    askedBy: z.string().nullable().meta({ description: "Who sent it (the client, or a member logging it for them); null when that account is gone." }),
    askedAt: z.string().meta({ description: "ISO 8601." }),
    updatedAt: z.string().meta({ description: "ISO 8601." }),
    version: int().meta({ description: "Send it back with an answer: an answer from an older version is refused (409)." }),
  })
  .meta({ id: "ClientRequest" });

export const clientRequestListAnswer = z.strictObject({ requests: z.array(clientRequestSchema).meta({ description: "Newest first." }), open: int().meta({ description: "How many wait for an answer (open or in hand)." }) });
export const clientRequestAskedAnswer = z.strictObject({ id: z.string().meta({ description: "The new request's id." }) });
export const clientRequestAnsweredAnswer = z.strictObject({ version: int().meta({ description: "The request's new version." }) });
