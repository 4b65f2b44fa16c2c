// The library's page forms, read at the edge (zod): each intent's fields, with a message naming
// what is wrong. Pure; the routes answer 400 with the message.
import { z } from "zod";
import { textSchema } from "../config/schema";
import { INT4_MAX } from "../input/edges";
import type { Side } from "../model-diff/merge";
import { MAX_TAGS, tagSchema } from "./format";

const whole = (what: string, min = 0) =>
  z
    .string()
    .regex(/^[0-9]{1,10}$/, `${what} is a whole number`)
    .transform(Number)
    .refine((n) => n >= min && n <= INT4_MAX, `${what} is out of range`);
const optionalVersion = z.union([z.literal("").transform(() => null), whole("The version", 1)]);
const uuid = z.string().regex(/^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i, "Choose a library preset");
const tags = z
  .string()
  .max(600)
  .transform((s) => [...new Set(s.split(",").map((t) => t.trim()).filter(Boolean))])
  .pipe(z.array(tagSchema).max(MAX_TAGS, `At most ${MAX_TAGS} tags`));

/** "Library preset and version": "<preset id>@latest" or "<preset id>@<n>". */
const choice = z
  .string()
  .max(80)
  .regex(/^[0-9a-f-]{36}@(latest|[1-9][0-9]{0,9})$/i, "Choose a library preset and version")
  .transform((s) => {
    const [id, v] = s.split("@");
    return { libraryPresetId: id, version: v === "latest" ? null : Number(v) };
  })
  .pipe(z.object({ libraryPresetId: uuid, version: z.number().int().min(1).max(INT4_MAX).nullable() }));

export const addForm = z.object({
  choice,
  fontId: z.string().min(1, "Choose a font").max(48),
  configVersion: whole("The config version"),
});

export const saveForm = z.object({
  presetId: z.string().min(1).max(48),
  libraryPresetId: z.union([z.literal("").transform(() => null), uuid]),
  baseVersion: optionalVersion,
  name: textSchema().trim().min(1, "Give the library preset a name").max(60, "At most 60 characters"),
  tags,
  changelog: textSchema().trim().min(1, "Say in one line what this version is").max(200, "One line of at most 200 characters"),
});

export const applyForm = z.object({ presetId: z.string().min(1).max(48), configVersion: whole("The config version") });

/** Choices of a collision form: fields "choice:<path>" = mine | theirs. */
export function choicesOf(form: FormData): Record<string, Side> {
  const out: Record<string, Side> = {};
  for (const [k, v] of form.entries()) if (k.startsWith("choice:") && (v === "mine" || v === "theirs")) out[k.slice(7)] = v;
  return out;
}

/** A FormData's fields as a plain record of strings (files left out). */
export function fieldsOf(form: FormData, names: readonly string[]): Record<string, string> {
  return Object.fromEntries(names.map((n) => [n, typeof form.get(n) === "string" ? (form.get(n) as string) : ""]));
}

export function firstFormIssue(e: z.ZodError): string {
  return e.issues[0]?.message ?? "The form is not valid.";
}
