// A library preset's body: what one version holds. Looks are kept by channel role (not by a
// build's channel ids) with the pixel count they were made on, so a look can be scaled to any
// rig. Mirror layers name the role they repeat. Role keys are the three standard roles or
// "custom-<slug>" for a custom channel (its name as a slug), all valid model ids.
import { z } from "zod";
import { idSchema, lookSchema, textSchema, type Channel, type Look } from "../config/schema";

export const ROLE_KEYS = ["main-blade", "chamber-strip", "accent-pixel"] as const;
export const MAX_ROLES = 16;
export const MAX_TAGS = 12;

export const roleKeySchema = idSchema.refine((k) => (ROLE_KEYS as readonly string[]).includes(k) || /^custom-[a-z0-9-]{1,40}$/.test(k), {
  message: 'a role is "main-blade", "chamber-strip", "accent-pixel" or "custom-<name>"',
});

export const tagSchema = textSchema()
  .min(1)
  .max(32)
  .regex(/^[\p{L}\p{N}][\p{L}\p{N} _-]*$/u, "a tag is letters, digits, spaces, dashes or underscores");

export const roleLookSchema = z.strictObject({
  /** Pixels of the channel the look was made on; pixel-valued fields scale from this. */
  pixels: z.number().int().min(1).max(2048),
  layers: lookSchema.shape.layers,
});

export const presetBodySchema = z.strictObject({
  name: textSchema().trim().min(1, "a library preset needs a name").max(60),
  tags: z.array(tagSchema).max(MAX_TAGS),
  notes: textSchema().max(2000),
  looks: z.record(roleKeySchema, roleLookSchema).refine((r) => Object.keys(r).length >= 1 && Object.keys(r).length <= MAX_ROLES, {
    message: `a library preset holds one to ${MAX_ROLES} looks`,
  }),
});

export type PresetBody = z.infer<typeof presetBodySchema>;
export type RoleLook = z.infer<typeof roleLookSchema>;

/** The role key of a build's channel. */
export function roleKeyOf(channel: Pick<Channel, "role" | "name">): string {
  if (channel.role !== "custom") return channel.role;
  const slug = channel.name
    .toLowerCase()
    .normalize("NFKD")
    .replace(/[^a-z0-9]+/g, "-")
    .replace(/^-+|-+$/g, "")
    .slice(0, 40);
  return `custom-${slug || "channel"}`;
}

const LABELS: Record<string, string> = { "main-blade": "main blade", "chamber-strip": "chamber strip", "accent-pixel": "accent pixel" };

/** A role key in words: "main blade", "custom: Pommel ring". */
export function roleLabel(key: string): string {
  return LABELS[key] ?? `custom: ${key.replace(/^custom-/, "").replace(/-/g, " ")}`;
}

/** Roles in a stable order: the standard ones first, then custom ones by name. */
export function sortedRoles(keys: Iterable<string>): string[] {
  const order = (k: string) => {
    const i = (ROLE_KEYS as readonly string[]).indexOf(k);
    return i < 0 ? ROLE_KEYS.length : i;
  };
  return [...keys].sort((a, b) => order(a) - order(b) || a.localeCompare(b));
}

export type { Look };
