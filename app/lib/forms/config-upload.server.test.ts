import { describe, expect, it } from "vitest";
import { readConfigUpload } from "./config-upload.server";

async function failure(p: Promise<unknown>): Promise<{ status?: number; message?: string; headers?: HeadersInit }> {
  try {
    await p;
  } catch (e) {
    const d = e as { init?: { status?: number; headers?: HeadersInit }; data?: { message?: string } };
    return { status: d.init?.status, message: d.data?.message, headers: d.init?.headers };
  }
  throw new Error("expected a failure");
}

function upload(parts: { version?: string; file?: [string, string | Uint8Array<ArrayBuffer>] }) {
  const form = new FormData();
  if (parts.version !== undefined) form.set("version", parts.version);
  if (parts.file) form.set("file", new File([parts.file[1]], parts.file[0], { type: "application/json" }));
  return new Request("http://x/builds/b/checks", { method: "POST", body: form });
}

describe("readConfigUpload", () => {
  it("reads the file's JSON and the version", async () => {
    expect(await readConfigUpload(upload({ version: "3", file: ["k.json", '{"format":"hiltbench.config/1"}'] }))).toEqual({ input: { format: "hiltbench.config/1" }, version: 3, fileName: "k.json", message: null });
  });
  it("takes the config out of an API answer", async () => {
    expect((await readConfigUpload(upload({ version: "1", file: ["a.json", '{"config":{"rig":1},"version":7}'] }))).input).toEqual({ rig: 1 });
  });
  it("names what is wrong", async () => {
    expect(await failure(readConfigUpload(upload({ version: "1" })))).toMatchObject({ status: 400, message: "Choose a JSON file to import." });
    expect(await failure(readConfigUpload(upload({ file: ["k.json", "{}"] })))).toMatchObject({ status: 400, message: expect.stringMatching(/version/) });
    expect(await failure(readConfigUpload(upload({ version: "1", file: ["e.json", ""] })))).toMatchObject({ status: 400, message: 'The file "e.json" is empty.' });
    expect(await failure(readConfigUpload(upload({ version: "1", file: ["b.json", "{oops"] })))).toMatchObject({ status: 400, message: expect.stringMatching(/^The file "b.json" is not valid JSON/) });
    expect(await failure(readConfigUpload(upload({ version: "1", file: ["l.json", new Uint8Array([0xff, 0xfe])] })))).toMatchObject({ status: 400, message: expect.stringMatching(/UTF-8/) });
    expect(await failure(readConfigUpload(new Request("http://x", { method: "POST", body: "{}", headers: { "Content-Type": "application/json" } })))).toMatchObject({ status: 400 });
  });
  it("refuses a file over 2 MB with 413 and closes the connection", async () => {
    const f = await failure(readConfigUpload(upload({ version: "1", file: ["big.json", "x".repeat(2 * 1024 * 1024 + 100_000)] })));
    expect(f.status).toBe(413);
    expect(new Headers(f.headers).get("Connection")).toBe("close");
  });
});
