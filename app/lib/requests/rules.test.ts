import { describe, expect, it } from "vitest";
import { answerBody, answerProblem, askBody, firstProblem, MAX_MESSAGE, tellsClient } from "./rules";

describe("client request bodies", () => {
  it("reads a request, trimming and normalising line ends", () => {
    expect(askBody.parse({ kind: "font", message: "  One more font, please:\r\nsomething stormy. " })).toEqual({ kind: "font", message: "One more font, please:\nsomething stormy." });
  });
  it("refuses an empty message, an unknown kind, extra fields and an overlong message, each in words", () => {
    const problem = (b: unknown) => {
      const r = askBody.safeParse(b);
      return r.success ? null : firstProblem(r.error);
    };
    expect(problem({ kind: "font", message: "   " })).toMatch(/message is empty/);
    expect(problem({ kind: "sword", message: "x" })).toMatch(/kind is one of font, colour, fault, other/);
    expect(problem({ kind: "font", message: "x", status: "done" })).toMatch(/status/);
    expect(problem({ kind: "font", message: "x".repeat(MAX_MESSAGE + 1) })).toMatch(/at most 2000/);
    expect(problem({ kind: "font", message: 42 })).toMatch(/message is text/);
  });
  it("an answer needs the version read; declining needs a reason", () => {
    expect(answerBody.safeParse({ status: "done" }).success).toBe(false);
    expect(answerBody.parse({ status: "done", version: 3 })).toEqual({ status: "done", version: 3 });
    expect(answerProblem("declined", " ")).toMatch(/Say why/);
    expect(answerProblem("declined", "We cannot fit a second speaker.")).toBeNull();
    expect(answerProblem("done", "")).toBeNull();
  });
  it("tells the client when a request closes or gets a new reply, not when it is only taken in hand", () => {
    const open = { status: "open" as const, reply: "" };
    expect(tellsClient(open, { status: "in-hand", reply: "" })).toBe(false);
    expect(tellsClient(open, { status: "in-hand", reply: "On the bench Tuesday." })).toBe(true);
    expect(tellsClient({ status: "in-hand", reply: "On the bench Tuesday." }, { status: "done", reply: "On the bench Tuesday." })).toBe(true);
    expect(tellsClient({ status: "done", reply: "x" }, { status: "done", reply: "x" })).toBe(false);
  });
});
