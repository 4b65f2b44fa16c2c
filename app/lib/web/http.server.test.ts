import { data } from "react-router";
import { describe, expect, it } from "vitest";
import { apiAnswer, fail, failureOf, text, textAnswer } from "./http.server";

const thrown = (f: () => unknown): unknown => {
  try {
    f();
  } catch (e) {
    return e;
  }
  throw new Error("expected a throw");
};

describe("one HTTP module", () => {
  it("reads a thrown failure back: status, message and headers; nothing else is one", () => {
    expect(failureOf(thrown(() => fail(404, "No build with this id in your workshop.")))).toEqual({ status: 404, message: "No build with this id in your workshop.", headers: undefined });
    expect(failureOf(data({ message: "big" }, { status: 413, headers: { Connection: "close" } }))).toEqual({ status: 413, message: "big", headers: { Connection: "close" } });
    expect(failureOf(data({}, { status: 400 }))).toMatchObject({ status: 400, message: "Request failed" });
    expect(failureOf(new Error("bug"))).toBeNull();
    expect(failureOf(new Response("x"))).toBeNull();
    expect(failureOf(null)).toBeNull();
  });

  it("answers failures as JSON for the API and as text for downloads, and lets bugs through", async () => {
    const api = await apiAnswer(async () => fail(409, "stale"));
    expect([api.status, api.headers.get("Content-Type"), await api.json()]).toEqual([409, "application/json; charset=utf-8", { status: 409, error: "stale" }]);
    const detailed = await apiAnswer(async () => fail(422, "not valid", { diagnostics: [{ code: "x" }] }));
    expect([detailed.status, await detailed.json()]).toEqual([422, { status: 422, error: "not valid", diagnostics: [{ code: "x" }] }]);
    const plain = await textAnswer(async () => fail(422, "too different"));
    expect([plain.status, plain.headers.get("Content-Type"), plain.headers.get("Cache-Control"), await plain.text()]).toEqual([422, "text/plain; charset=utf-8", "no-store", "too different\n"]);
    await expect(textAnswer(async () => Promise.reject(new Error("bug")))).rejects.toThrow("bug");
    const patch = text("--- a\n", { headers: { "Content-Type": "text/x-diff; charset=utf-8" } });
    expect([patch.headers.get("Content-Type"), patch.headers.get("Cache-Control")]).toEqual(["text/x-diff; charset=utf-8", "no-store"]);
  });
});
