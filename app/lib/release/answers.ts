// The release API's answers as zod schemas: the routes type their answers with these
// (`jsonAs`) and the OpenAPI document (app/lib/api-doc/) is generated from them.
import { z } from "zod";

const isoTime = z.string().meta({ description: "A time in ISO 8601 (UTC), e.g. 2026-12-03T08:00:00.000Z.", format: "date-time" });
const int = () => z.number().int();

export const benchItemSchema = z
  .strictObject({
    key: z.string().meta({ description: "Stable across revisions for the same thing, e.g. preset:ashfall:clash." }),
    label: z.string(),
    hint: z.string().optional(),
    commonPractice: z.boolean().optional().meta({ description: "A rule of thumb, not a figure from a data sheet." }),
    tick: z.strictObject({ by: z.string().nullable().meta({ description: "Who ticked it (null: the account is gone)." }), at: isoTime }).nullable(),
  })
  .meta({ id: "BenchItem" });

export const benchCheckAnswer = z.strictObject({
  buildId: z.string(),
  revision: int(),
  approved: z.boolean().meta({ description: "Whether a review approved this revision." }),
  ticked: int(),
  total: int(),
  groups: z.array(z.strictObject({ key: z.string(), kind: z.enum(["preset", "channel", "buttons", "power", "card"]), title: z.string(), items: z.array(benchItemSchema) })),
});

export const releaseSchema = z
  .strictObject({
    id: z.string(),
    number: int().meta({ description: "1, 2, … per build." }),
    revision: int(),
    template: z.string().meta({ description: "The template the bundle was made with (id or built-in name)." }),
    names: z.enum(["long", "8.3"]),
    card: z.number().meta({ description: "The card's size in decimal GB." }),
    sha256: z.string().meta({ description: "The bundle zip's SHA-256 (the zip is byte-identical for the same inputs)." }),
    bytes: int().meta({ description: "The bundle zip's size in bytes." }),
    note: z.string(),
    releasedBy: z.string().nullable(),
    releasedAt: isoTime,
    download: z.string().meta({ description: "The bundle's address with the release's own choices (GET it for the zip)." }),
  })
  .meta({ id: "Release" });

export const releaseListAnswer = z.strictObject({ buildId: z.string(), releases: z.array(releaseSchema) });
