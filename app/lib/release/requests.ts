// What a release or a tick asks for, read at the edge (the API's JSON bodies and the Release
// page's forms alike). Pure: a value, or a message for a 400 naming the field.
import { z } from "zod";
import { INT4_MAX } from "../input/edges";
import { textSchema } from "../config/schema";
import type { NameMode } from "../bundle/names";

export const MAX_RELEASE_NOTE_CHARS = 2000;

const revision = z.number({ message: "revision is a revision number of this build, e.g. 3" }).int("revision is a whole number").min(1, "revision is 1 or more").max(INT4_MAX);

export const releaseBody = z.strictObject({
  revision: revision.meta({ description: "The approved revision to release." }),
  note: textSchema().max(MAX_RELEASE_NOTE_CHARS, `note is at most ${MAX_RELEASE_NOTE_CHARS} characters`).optional().meta({ description: "A note kept with the release (what changed, what the client asked for)." }),
  template: z.string().trim().min(1).max(100).optional().meta({ description: "A template id or built-in name; the revision's own template when absent." }),
  names: z.enum(["long", "8.3"], { message: "names is long or 8.3" }).default("long").meta({ description: "Long FAT32 names, or 8.3 names." }),
  card: z.number({ message: "card is the card's size in GB, e.g. 32" }).positive("card is the card's size in GB, e.g. 32").max(2048, "card is at most 2048 GB").default(32).meta({ description: "The card's size in decimal GB." }),
});

export const tickBody = z.strictObject({
  item: z.string().min(1, "item is a bench-check item's key").max(200, "item is at most 200 characters").meta({ description: "The item's key, as GET …/bench-check answers it (e.g. preset:ashfall:clash)." }),
  ticked: z.boolean({ message: "ticked is true or false" }),
});

export type ReleaseInput = { revision: number; note: string; template: string | null; mode: NameMode; cardGb: number };

type Read<T> = { ok: true; value: T } | { ok: false; error: string };

function issue(e: z.ZodError): string {
  const i = e.issues[0];
  return `${i.path.length ? `"${i.path.join(".")}"` : "The body"}: ${i.message}; nothing was changed.`;
}

export function readReleaseInput(raw: unknown): Read<ReleaseInput> {
  const p = releaseBody.safeParse(raw);
  if (!p.success) return { ok: false, error: issue(p.error) };
  return { ok: true, value: { revision: p.data.revision, note: (p.data.note ?? "").trim(), template: p.data.template ?? null, mode: p.data.names, cardGb: p.data.card } };
}

export function readTickInput(raw: unknown): Read<{ item: string; ticked: boolean }> {
  const p = tickBody.safeParse(raw);
  return p.success ? { ok: true, value: p.data } : { ok: false, error: issue(p.error) };
}

/** A page form's fields as the API's body (numbers and booleans from text). */
export function formAsBody(form: { get(name: string): unknown }, fields: readonly string[]): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const f of fields) {
    const v = form.get(f);
    if (v === null || v === "") continue;
    if (typeof v !== "string") {
      out[f] = v;
      continue;
    }
    if (f === "revision" || f === "card") out[f] = /^\s*\d+(\.\d+)?\s*$/.test(v) ? Number(v) : v;
    else if (f === "ticked") out[f] = v === "1" || v === "true" ? true : v === "0" || v === "false" ? false : v;
    else out[f] = v;
  }
  return out;
}
