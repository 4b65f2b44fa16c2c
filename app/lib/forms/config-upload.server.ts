// Reading a config file posted from a form: the whole request is capped before the multipart
// body is parsed, the file is read as UTF-8 JSON with the same depth cap as the API, and a file
// holding the API's `{ config, version }` answer is accepted as the config inside it.
import { readMessage } from "./revision-message";
import { MAX_CONFIG_BYTES, parseJsonText, readBodyLimited } from "../web/body.server";
import { fail } from "../web/http.server";

/** Room for the multipart boundaries and the small fields beside the file. */
const FORM_OVERHEAD_BYTES = 64 * 1024;

export type ConfigUpload = { input: unknown; version: number; fileName: string; message: string | null };

export async function readConfigUpload(request: Request): Promise<ConfigUpload> {
  const type = request.headers.get("Content-Type") ?? "";
  if (!type.toLowerCase().startsWith("multipart/form-data")) fail(400, "Choose a JSON file to import (the form must be sent as multipart/form-data).");
  const bytes = await readBodyLimited(request, MAX_CONFIG_BYTES + FORM_OVERHEAD_BYTES);
  let form: FormData;
  try {
    form = await new Response(bytes, { headers: { "Content-Type": type } }).formData();
  } catch {
    fail(400, "The upload could not be read as a form; choose the file again.");
  }
  const rawVersion = form.get("version");
  const version = typeof rawVersion === "string" && /^\d{1,9}$/.test(rawVersion.trim()) ? Number(rawVersion) : NaN;
  if (!Number.isInteger(version)) fail(400, "The form carries no config version; reload the page and try again.");
  const note = readMessage(form.get("message"));
  if (!note.ok) fail(400, note.error);
  const file = form.get("file");
  if (!(file instanceof File) || file.name === "") fail(400, "Choose a JSON file to import.");
  if (file.size === 0) fail(400, `The file "${file.name}" is empty.`);
  if (file.size > MAX_CONFIG_BYTES) fail(413, `The file "${file.name}" is larger than 2 MB; a config is far smaller.`);
  let text: string;
  try {
    text = new TextDecoder("utf-8", { fatal: true }).decode(await file.arrayBuffer());
  } catch {
    fail(400, `The file "${file.name}" is not UTF-8 text; export a config as JSON and import that.`);
  }
  let input = parseJsonText(text, `The file "${file.name}"`);
  const wrapped = input as { config?: unknown; format?: unknown } | null;
  if (typeof wrapped === "object" && wrapped !== null && !Array.isArray(wrapped) && "config" in wrapped && !("format" in wrapped)) input = wrapped.config;
  return { input, version, fileName: file.name, message: note.message };
}
