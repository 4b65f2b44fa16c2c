// The optional "what changed" note a person gives a save. Pure: forms, the API and the look
// editor read it the same way.
export const MESSAGE_MAX = 200;

export type MessageRead = { ok: true; message: string | null } | { ok: false; error: string };

/** Absent, null or blank → no message; a string is trimmed; anything else is refused. */
export function readMessage(value: unknown): MessageRead {
  if (value === undefined || value === null) return { ok: true, message: null };
  if (typeof value !== "string") return { ok: false, error: '"message" must be text (what changed, at most 200 characters).' };
  const t = value.replace(/\s+/g, " ").trim();
  if (t.length > MESSAGE_MAX) return { ok: false, error: `The message is ${t.length} characters; keep it to ${MESSAGE_MAX} (what changed, in a line).` };
  return { ok: true, message: t || null };
}
