// Client requests, the pure part: what may be asked and answered, in words a client reads.
// A request is asked by the build's client (or logged by the workshop for them, after a call),
// and answered by an owner or builder: taken in hand, done or declined, with a reply the client
// sees. Pure: no database, no clock.
import { z } from "zod";
import type { ClientRequestKind, ClientRequestStatus } from "../db/types";

export const REQUEST_KINDS = ["font", "colour", "fault", "other"] as const satisfies readonly ClientRequestKind[];
export const REQUEST_STATUSES = ["open", "in-hand", "done", "declined"] as const satisfies readonly ClientRequestStatus[];

export const KIND_LABEL: Record<ClientRequestKind, string> = {
  font: "One more sound font",
  colour: "A colour or look change",
  fault: "Something is not working",
  other: "Something else",
};

/** The status as the client reads it. */
export const STATUS_LABEL: Record<ClientRequestStatus, string> = {
  open: "Sent, not yet read",
  "in-hand": "The workshop is on it",
  done: "Done",
  declined: "Declined",
};

export const MAX_MESSAGE = 2000;
/** Open (or in-hand) requests one build may hold: a client with more is asked to wait for answers. */
export const MAX_OPEN_PER_BUILD = 20;
/** The largest request body we read: a message of MAX_MESSAGE characters in UTF-8 and JSON, with room. */
export const MAX_REQUEST_BODY_BYTES = 16 * 1024;

const message = (what: string) =>
  z
    .string({ message: `${what} is text` })
    .transform((s) => s.replace(/\r\n?/g, "\n").trim())
    .pipe(z.string().max(MAX_MESSAGE, `${what} is at most ${MAX_MESSAGE} characters`));

export const askBody = z.strictObject({
  kind: z.enum(REQUEST_KINDS, { message: `kind is one of ${REQUEST_KINDS.join(", ")}` }).meta({ description: "font: one more sound font; colour: a colour or look change; fault: something is not working; other." }),
  message: message("message").pipe(z.string().min(1, "Say what you would like: message is empty")).meta({ description: `What the client asks, in their words (at most ${MAX_MESSAGE} characters).` }),
});
export type AskBody = z.infer<typeof askBody>;

export const answerBody = z.strictObject({
  status: z.enum(REQUEST_STATUSES, { message: `status is one of ${REQUEST_STATUSES.join(", ")}` }),
  reply: message("reply").optional().meta({ description: "What the client reads beside the status; unchanged when absent." }),
  version: z.number({ message: "version is the request's version as read" }).int().min(1).meta({ description: "The request's version as read: a change from an older one is refused (409)." }),
});
export type AnswerBody = z.infer<typeof answerBody>;

/** The first problem of a body, as one sentence. */
export function firstProblem(e: z.ZodError): string {
  const i = e.issues[0];
  const where = i.path.length ? `${i.path.join(".")}: ` : "";
  return `Bad request: ${where}${i.message}.`;
}

/** Why an answer cannot be given, or null. Declining says why: the client reads it. */
export function answerProblem(to: AnswerBody["status"], reply: string): string | null {
  if (to === "declined" && reply.trim() === "") return "Say why in the reply when you decline a request: the client reads it.";
  return null;
}

/** Whether a change should tell the client by e-mail: a reply written, or the request closed. */
export function tellsClient(before: { status: ClientRequestStatus; reply: string }, after: { status: ClientRequestStatus; reply: string }): boolean {
  const closed = (s: ClientRequestStatus) => s === "done" || s === "declined";
  return (closed(after.status) && after.status !== before.status) || (after.reply.trim() !== "" && after.reply !== before.reply);
}

export const isOpen = (s: ClientRequestStatus) => s === "open" || s === "in-hand";
