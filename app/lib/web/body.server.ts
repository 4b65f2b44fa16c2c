// Reading request bodies with a byte cap, so a huge upload is refused (413) after reading at most
// the cap, never buffered whole; and JSON with a depth cap, so a pathological document becomes a
// 400 with a message rather than a slow walk further down.
import { data } from "react-router";
import { findBadText } from "../input/edges";
import { fail } from "./http.server";
import { parseUrlEncoded } from "./read-form.server";

/** Configs are a few tens of kilobytes; 2 MB leaves room for big preset lists. */
export const MAX_CONFIG_BYTES = 2 * 1024 * 1024;
/** A config nests about eight levels; anything far deeper is not a config. */
export const MAX_JSON_DEPTH = 64;

function megabytes(n: number): string {
  return `${(n / (1024 * 1024)).toFixed(n % (1024 * 1024) === 0 ? 0 : 1)} MB`;
}

/** Past the cap, bodies up to this size are read and thrown away so the client sees the 413 cleanly. */
const DRAIN_LIMIT_BYTES = 16 * 1024 * 1024;

async function drain(reader: ReadableStreamDefaultReader<Uint8Array>, alreadyRead: number): Promise<void> {
  let total = alreadyRead;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) return;
    total += value.byteLength;
    if (total > DRAIN_LIMIT_BYTES) return void (await reader.cancel().catch(() => {}));
  }
}

/** The body as bytes, or a 413 once it passes `maxBytes` (by Content-Length or while reading). */
export async function readBodyLimited(request: Request, maxBytes: number, tooBigMessage?: string): Promise<Uint8Array<ArrayBuffer>> {
  // A client still sending when the answer comes sees a broken pipe instead of the 413, so a
  // moderately oversized body is read to its end (and discarded, never kept); a huge one is cut
  // off, and the connection is closed since the rest of that body was never read.
  const tooBig = (): never => {
    throw data({ message: tooBigMessage ?? `The request body is larger than ${megabytes(maxBytes)}; send a smaller config.` }, { status: 413, headers: { Connection: "close" } });
  };
  const declared = Number(request.headers.get("Content-Length"));
  if (Number.isFinite(declared) && declared > DRAIN_LIMIT_BYTES) tooBig();
  if (!request.body) return new Uint8Array(new ArrayBuffer(0));
  const reader = request.body.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > maxBytes) {
      await drain(reader, total);
      tooBig();
    }
    chunks.push(value);
  }
  const out = new Uint8Array(total);
  let at = 0;
  for (const c of chunks) {
    out.set(c, at);
    at += c.byteLength;
  }
  return out;
}

/** Deepest nesting of arrays and objects, walked without recursion; stops early past `limit`. */
export function jsonDepth(value: unknown, limit = Infinity): number {
  let max = 0;
  const stack: [unknown, number][] = [[value, 0]];
  while (stack.length > 0) {
    const [v, d] = stack.pop()!;
    if (typeof v !== "object" || v === null) continue;
    const depth = d + 1;
    if (depth > max) max = depth;
    if (max > limit) return max;
    for (const child of Array.isArray(v) ? v : Object.values(v)) if (typeof child === "object" && child !== null) stack.push([child, depth]);
  }
  return max;
}

/** Parse JSON text, answering 400 with a specific message for anything that is not a usable document. */
export function parseJsonText(text: string, what = "The request body"): unknown {
  if (text.trim() === "") fail(400, `${what} is empty; send a JSON document.`);
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch (e) {
    fail(400, `${what} is not valid JSON (${e instanceof Error ? e.message : String(e)}).`);
  }
  if (jsonDepth(value, MAX_JSON_DEPTH) > MAX_JSON_DEPTH) fail(400, `${what} nests deeper than ${MAX_JSON_DEPTH} levels; a config never does.`);
  // Text PostgreSQL cannot store is refused here, with its path, for every JSON endpoint alike
  // (so /api/validate and the PUT agree); the config schema refuses it too (decision 011).
  const bad = findBadText(value);
  if (bad) fail(400, `${what} has text at ${bad.path} that ${bad.reason}; nothing was changed.`);
  return value;
}

/** A JSON request body, capped at `maxBytes` (413 with `tooBigMessage` past it). */
export async function readJsonBody(request: Request, maxBytes = MAX_CONFIG_BYTES, tooBigMessage?: string): Promise<unknown> {
  const bytes = await readBodyLimited(request, maxBytes, tooBigMessage);
  let text: string;
  try {
    text = new TextDecoder("utf-8", { fatal: true }).decode(bytes);
  } catch {
    fail(400, "The request body is not UTF-8 text; send a JSON document.");
  }
  return parseJsonText(text);
}

/** A page's form (urlencoded or multipart), capped at `maxBytes` like any body: 413 with `tooBigMessage` past it. */
export async function readFormLimited(request: Request, maxBytes: number, tooBigMessage: string): Promise<FormData> {
  const type = request.headers.get("Content-Type") ?? "application/x-www-form-urlencoded";
  const bytes = await readBodyLimited(request, maxBytes, tooBigMessage);
  // URL-encoded forms on the fast path (decision 011): the platform's parse holds the event loop
  // 100-250 ms for a 250 KB template form; parseUrlEncoded gives the same fields in a few.
  if (type.toLowerCase().startsWith("application/x-www-form-urlencoded")) return parseUrlEncoded(new TextDecoder().decode(bytes));
  try {
    return await new Response(bytes, { headers: { "Content-Type": type } }).formData();
  } catch {
    fail(400, "The form could not be read; reload the page and try again.");
  }
}

/** The JSON object's own field, or a 400 naming the field when the body is not an object with it. */
export function requireField(body: unknown, field: string): unknown {
  if (typeof body !== "object" || body === null || Array.isArray(body)) fail(400, `The body must be a JSON object with a "${field}" field.`);
  if (!Object.hasOwn(body, field)) fail(400, `The body has no "${field}" field.`);
  return (body as Record<string, unknown>)[field];
}
