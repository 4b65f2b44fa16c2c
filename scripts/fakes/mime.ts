// Just enough MIME reading for the local mail sink to show what the app sends: header
// unfolding, RFC 2047 encoded words, multipart bodies, and the 7bit / 8bit / quoted-printable /
// base64 transfer encodings in UTF-8. Not a general mail parser: the sink keeps the raw message
// as the truth, and this only fills the columns a person or a test reads.

export type ReadMessage = { headers: Map<string, string>; subject: string; from: string; to: string; messageId: string | null; text: string | null; html: string | null };

function splitHead(raw: string): { head: string; body: string } {
  const m = /\r?\n\r?\n/.exec(raw);
  if (!m) return { head: raw, body: "" };
  return { head: raw.slice(0, m.index), body: raw.slice(m.index + m[0].length) };
}

function parseHeaders(head: string): Map<string, string> {
  const headers = new Map<string, string>();
  const unfolded = head.replace(/\r?\n[ \t]+/g, " ");
  for (const line of unfolded.split(/\r?\n/)) {
    const i = line.indexOf(":");
    if (i <= 0) continue;
    const key = line.slice(0, i).trim().toLowerCase();
    if (!headers.has(key)) headers.set(key, line.slice(i + 1).trim());
  }
  return headers;
}

function decodeQuotedPrintableBytes(s: string): Buffer {
  const soft = s.replace(/=\r?\n/g, "");
  const bytes: number[] = [];
  for (let i = 0; i < soft.length; i++) {
    const c = soft[i];
    if (c === "=" && /^[0-9A-Fa-f]{2}$/.test(soft.slice(i + 1, i + 3))) {
      bytes.push(Number.parseInt(soft.slice(i + 1, i + 3), 16));
      i += 2;
    } else bytes.push(...Buffer.from(c, "utf8"));
  }
  return Buffer.from(bytes);
}

/** `=?UTF-8?Q?...?=` and `=?UTF-8?B?...?=` words, with the space between two words dropped. */
export function decodeWords(value: string): string {
  return value
    .replace(/(\?=)\s+(=\?)/g, "$1$2")
    .replace(/=\?([^?]+)\?([QqBb])\?([^?]*)\?=/g, (_, _charset: string, enc: string, text: string) =>
      enc.toUpperCase() === "B" ? Buffer.from(text, "base64").toString("utf8") : decodeQuotedPrintableBytes(text.replace(/_/g, " ")).toString("utf8"),
    );
}

function param(value: string, name: string): string | null {
  const m = new RegExp(`;\\s*${name}\\s*=\\s*(?:"([^"]*)"|([^;\\s]+))`, "i").exec(value);
  return m ? (m[1] ?? m[2]) : null;
}

function decodeBody(body: string, encoding: string): string {
  switch (encoding.toLowerCase()) {
    case "base64":
      return Buffer.from(body.replace(/\s+/g, ""), "base64").toString("utf8");
    case "quoted-printable":
      return decodeQuotedPrintableBytes(body).toString("utf8");
    default:
      return body;
  }
}

function collect(raw: string, out: { text: string | null; html: string | null }, depth = 0) {
  const { head, body } = splitHead(raw);
  const headers = parseHeaders(head);
  const type = headers.get("content-type") ?? "text/plain";
  const mediaType = type.split(";")[0].trim().toLowerCase();
  if (mediaType.startsWith("multipart/") && depth < 5) {
    const boundary = param(type, "boundary");
    if (!boundary) return;
    const parts = body.split(new RegExp(`\\r?\\n?--${boundary.replace(/[.*+?^${}()|[\]\\]/g, "\\$&")}(?:--)?[ \\t]*\\r?\\n?`));
    for (const part of parts.slice(1, -1)) collect(part, out, depth + 1);
    return;
  }
  const decoded = decodeBody(body, headers.get("content-transfer-encoding") ?? "7bit").replace(/\r\n/g, "\n");
  if (mediaType === "text/plain" && out.text === null) out.text = decoded;
  else if (mediaType === "text/html" && out.html === null) out.html = decoded;
}

export function readMessage(raw: string): ReadMessage {
  const { head } = splitHead(raw);
  const headers = parseHeaders(head);
  const out = { text: null as string | null, html: null as string | null };
  collect(raw, out);
  const messageId = headers.get("message-id") ?? null;
  return {
    headers,
    subject: decodeWords(headers.get("subject") ?? ""),
    from: decodeWords(headers.get("from") ?? ""),
    to: decodeWords(headers.get("to") ?? ""),
    messageId: messageId ? messageId.replace(/^<|>$/g, "") : null,
    text: out.text,
    html: out.html,
  };
}
