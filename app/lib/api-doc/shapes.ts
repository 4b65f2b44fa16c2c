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

const isoTime = z.string().meta({ description: "A time in ISO 8601 (UTC), e.g. 2026-12-03T08:00:00.000Z.", format: "date-time" });
const int = () => z.number().int();

/** A finding about a font's files or the card's names: like a diagnostic, with no hint. */
export const findingSchema = z
  .object({ severity: z.enum(["error", "warning", "info"]), code: z.string(), path: z.string(), message: z.string() })
  .meta({ id: "Finding" });

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

export const fontUploadAnswer = z.strictObject({ status: z.enum(["received", "invalid"]), configVersion: int(), report: fontReportSchema });

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
