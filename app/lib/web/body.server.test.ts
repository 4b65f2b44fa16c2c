import { describe, expect, it } from "vitest";
import { jsonDepth, parseJsonText, readBodyLimited, readFormLimited, readJsonBody, requireField, MAX_JSON_DEPTH } from "./body.server";

/** What `fail` threw: status and message, or the error itself when it was something else. */
async function failure(p: Promise<unknown> | (() => unknown)): Promise<{ status?: number; message?: string }> {
  try {
    await (typeof p === "function" ? p() : p);
  } catch (e) {
    const d = e as { init?: { status?: number }; data?: { message?: string } };
    return { status: d.init?.status, message: d.data?.message };
  }
  throw new Error("expected a failure");
}

const post = (body: BodyInit | null, headers: Record<string, string> = {}) => new Request("http://x/api", { method: "POST", body, headers, duplex: "half" } as RequestInit);

function streamOf(chunks: number, size: number) {
  let sent = 0;
  let pulled = 0;
  const stream = new ReadableStream<Uint8Array>({
    pull(ctrl) {
      pulled++;
      if (sent >= chunks) return ctrl.close();
      sent++;
      ctrl.enqueue(new Uint8Array(size).fill(0x20));
    },
  });
  return { stream, pulled: () => pulled };
}

describe("readBodyLimited", () => {
  it("returns the bytes under the cap", async () => {
    expect(new TextDecoder().decode(await readBodyLimited(post("hello"), 5))).toBe("hello");
  });
  it("refuses a declared length far over the cap with 413 before reading", async () => {
    const f = await failure(readBodyLimited(post("x", { "Content-Length": "999999999" }), 10));
    expect(f.status).toBe(413);
    expect(f.message).toMatch(/larger than/);
  });
  it("reads a modestly oversized body to its end (discarding it) so the client sees the 413", async () => {
    const s = streamOf(1000, 1024);
    const f = await failure(readBodyLimited(post(s.stream), 10 * 1024));
    expect(f.status).toBe(413);
    expect(s.pulled()).toBeGreaterThanOrEqual(1000);
  });
  it("stops reading a huge stream without a length at the drain limit", async () => {
    const s = streamOf(40_000, 1024);
    const f = await failure(readBodyLimited(post(s.stream), 10 * 1024));
    expect(f.status).toBe(413);
    expect(s.pulled()).toBeLessThan(17_000);
  });
});

describe("parseJsonText", () => {
  it("names the problem for empty and broken JSON", async () => {
    expect(await failure(() => parseJsonText(" "))).toMatchObject({ status: 400, message: expect.stringMatching(/empty/) });
    expect(await failure(() => parseJsonText("{config:"))).toMatchObject({ status: 400, message: expect.stringMatching(/not valid JSON/) });
  });
  it("refuses a 100,000-deep array quickly with 400", async () => {
    const started = performance.now();
    const f = await failure(() => parseJsonText("[".repeat(100_000) + "]".repeat(100_000)));
    expect(f).toMatchObject({ status: 400, message: expect.stringMatching(/deeper than/) });
    expect(performance.now() - started).toBeLessThan(3000);
  });
  it("accepts nesting up to the cap", () => {
    const text = "[".repeat(MAX_JSON_DEPTH) + "]".repeat(MAX_JSON_DEPTH);
    expect(jsonDepth(parseJsonText(text))).toBe(MAX_JSON_DEPTH);
  });
});

describe("jsonDepth", () => {
  it("counts arrays and objects, not scalars", () => {
    expect(jsonDepth(1)).toBe(0);
    expect(jsonDepth({ a: [1, { b: [] }] })).toBe(4);
  });
});

describe("readJsonBody and requireField", () => {
  it("reads a JSON object and picks a field", async () => {
    const body = await readJsonBody(post(JSON.stringify({ config: { a: 1 } })));
    expect(requireField(body, "config")).toEqual({ a: 1 });
  });
  it("refuses bodies without the field or not an object", async () => {
    expect(await failure(() => requireField({}, "config"))).toMatchObject({ status: 400, message: 'The body has no "config" field.' });
    expect(await failure(() => requireField([1], "config"))).toMatchObject({ status: 400 });
    expect(await failure(() => requireField(null, "version"))).toMatchObject({ status: 400, message: expect.stringMatching(/"version"/) });
  });
  it("refuses bytes that are not UTF-8", async () => {
    expect(await failure(readJsonBody(post(new Uint8Array([0x7b, 0xff, 0x7d]))))).toMatchObject({ status: 400, message: expect.stringMatching(/UTF-8/) });
  });
});

describe("readFormLimited", () => {
  it("reads a page's urlencoded form under the cap", async () => {
    const form = await readFormLimited(post("intent=save&source=a%3Db", { "Content-Type": "application/x-www-form-urlencoded" }), 1024, "too big");
    expect(Object.fromEntries(form)).toEqual({ intent: "save", source: "a=b" });
  });
  it("refuses a form past the cap with 413 and the page's own message, by declared length or while reading", async () => {
    const body = "source=" + "x".repeat(2000);
    expect(await failure(readFormLimited(post(body, { "Content-Type": "application/x-www-form-urlencoded" }), 1024, "The template is larger than 1 KB."))).toEqual({ status: 413, message: "The template is larger than 1 KB." });
    const { stream } = streamOf(4, 512);
    expect(await failure(readFormLimited(post(stream, { "Content-Type": "application/x-www-form-urlencoded" }), 1024, "too big"))).toEqual({ status: 413, message: "too big" });
  });
});
